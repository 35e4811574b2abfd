/**
 * Reads the demo's record files through the engine's own file reader, so a demo record that
 * the app would refuse stops the seed with the file, line and field path.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { readCircuitFile, serializeRecord } from "@teardown/engine";
import { DEMO_ENTRIES, type DemoEntry, type DemoRevision } from "./scenario.js";

/** Where the demo record files live (they double as test fixtures). */
export const RECORDS_DIR = path.join(path.dirname(fileURLToPath(import.meta.url)), "records");

/** One revision's record document, as stored (record format version 1, JSON). */
export interface DemoRevisionDoc extends DemoRevision {
  doc: Record<string, unknown>;
}

/** One entry with its revision documents, oldest first. */
export interface DemoEntryDocs extends Omit<DemoEntry, "revisions"> {
  revisions: DemoRevisionDoc[];
}

/** The record document of one demo file; throws naming file, line and field when invalid. */
export function readDemoRecord(file: string): Record<string, unknown> {
  const text = readFileSync(path.join(RECORDS_DIR, file), "utf8");
  const parsed = readCircuitFile(text, { filename: path.basename(file) });
  if (!parsed.ok)
    throw new Error(
      `demo record ${file} is invalid: ${parsed.errors.map((x) => `line ${x.line}: ${x.path}: ${x.message}`).join("; ")}`,
    );
  return JSON.parse(serializeRecord(parsed.record, "json")) as Record<string, unknown>;
}

/** Every demo entry with its revision documents, in scenario order. */
export function demoRecordDocs(): DemoEntryDocs[] {
  return DEMO_ENTRIES.map((e) => ({
    ...e,
    revisions: e.revisions.map((r) => ({ ...r, doc: readDemoRecord(r.file) })),
  }));
}
