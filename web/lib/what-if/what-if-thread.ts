/**
 * Runs inside a worker thread of the web process: one what-if analysis per message (the stored
 * record, the checked changes and supply), posting back the result in its stored shape or why
 * there is none. An analysis takes seconds of CPU; on the request thread it would stall every
 * other request, and a thread can be ended when it overruns, which a call could not.
 */
import { parentPort } from "node:worker_threads";
import {
  analyzeWhatIf,
  parseRecord,
  parseStoredResult,
  type WhatIfRequest,
} from "@teardown/engine";

export interface WhatIfJob {
  id: number;
  document: unknown;
  request: WhatIfRequest;
  budgetMs: number;
}

/** What the thread posts back (besides `id`). */
export type WhatIfThreadAnswer =
  | { ok: true; result: unknown }
  | {
      ok: false;
      kind: "input";
      message: string;
      errors: Array<{ path: string; message: string; code: string }>;
    }
  | { ok: false; kind: "analysis"; message: string; code: string };

async function run(job: WhatIfJob): Promise<WhatIfThreadAnswer> {
  const read = parseRecord(JSON.stringify(job.document), { filename: "revision.json" });
  if (!read.ok)
    return {
      ok: false,
      kind: "analysis",
      code: "invalid-record",
      message: "the stored revision no longer reads",
    };
  const out = await analyzeWhatIf(read.record, job.request, {
    now: () => performance.now(),
    budgetMs: job.budgetMs,
  });
  if (!out.ok && out.kind === "input")
    return {
      ok: false,
      kind: "input",
      message: out.errors[0]?.message ?? "invalid what-if",
      errors: out.errors.map((e) => ({ path: e.path, message: e.message, code: e.code })),
    };
  if (!out.ok) return { ok: false, kind: "analysis", code: out.code, message: out.message };
  // Through JSON and the stored-result schema: what the caller gets is what the cache will hold.
  const stored = parseStoredResult(JSON.parse(JSON.stringify(out.result)));
  if (!stored.ok)
    return { ok: false, kind: "analysis", code: "bad-result", message: stored.message };
  return { ok: true, result: stored.result };
}

parentPort!.on("message", (job: WhatIfJob) => {
  run(job).then(
    (answer) => parentPort!.postMessage({ id: job.id, ...answer }),
    (err: unknown) =>
      // A throw is an engine bug, not bad input: the caller answers 500 and logs it.
      parentPort!.postMessage({
        id: job.id,
        crash: err instanceof Error ? `${err.message}\n${err.stack ?? ""}` : String(err),
      }),
  );
});

parentPort!.postMessage({ ready: true });
