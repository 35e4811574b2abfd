/**
 * Runs inside a worker thread of the web process: reads one submitted circuit file per message
 * with the engine and posts back the record and its stored document, or every problem. Reading
 * a large record takes seconds of CPU; on the request thread it stalled every other request.
 */
import { parentPort } from "node:worker_threads";
import { readCircuitFile, serializeRecord } from "@teardown/engine";

export interface ParseRequest {
  id: number;
  text: string;
  filename?: string;
}

parentPort!.on("message", (msg: ParseRequest) => {
  try {
    const read = readCircuitFile(
      msg.text,
      msg.filename === undefined ? {} : { filename: msg.filename },
    );
    if (!read.ok) {
      parentPort!.postMessage({ id: msg.id, ok: false, errors: read.errors });
      return;
    }
    const document = JSON.parse(serializeRecord(read.record, "json")) as Record<string, unknown>;
    parentPort!.postMessage({
      id: msg.id,
      ok: true,
      record: read.record,
      document,
      warnings: read.warnings,
    });
  } catch (err) {
    // A throw is a reader bug, not bad input: the caller answers 500 and logs it.
    parentPort!.postMessage({
      id: msg.id,
      crash: err instanceof Error ? `${err.message}\n${err.stack ?? ""}` : String(err),
    });
  }
});

parentPort!.postMessage({ ready: true });
