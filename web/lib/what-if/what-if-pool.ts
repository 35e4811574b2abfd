/**
 * Runs what-if analyses in worker threads (the web process's bounded pool, `../thread-pool.ts`),
 * so a run cannot stall its other requests. Bounded three ways: a few threads, a short waiting
 * line (past it the caller answers 503 with Retry-After), and the analysis budget per run; a
 * thread that overruns the budget is ended and replaced.
 */
import os from "node:os";
import path from "node:path";
import { projectRoot } from "@teardown/db";
import type { WhatIfRequest } from "@teardown/engine";
import { ThreadPool } from "../thread-pool";
import type { WhatIfThreadAnswer } from "./what-if-thread";

/** Threads running what-ifs at once: half the cores less the request thread, at least one. */
export function whatIfThreadCount(): number {
  const set = Number(process.env.WHAT_IF_THREADS);
  if (Number.isInteger(set) && set > 0) return set;
  return Math.max(1, Math.min(2, Math.floor((os.availableParallelism() - 1) / 2)));
}
/** Runs that may wait for a thread; one more is refused as busy. */
export const whatIfQueueLength = () => Number(process.env.WHAT_IF_QUEUE ?? 4);
/** The analysis budget (the worker's, ANALYSIS_BUDGET_MS), which a what-if shares. */
export const whatIfBudgetMs = () => Number(process.env.ANALYSIS_BUDGET_MS ?? 60_000);
/** Past the engine's own budget, the thread is given this long to answer before it is ended. */
const HARD_STOP_GRACE_MS = 5_000;

export type WhatIfRun =
  | WhatIfThreadAnswer
  | { ok: false; kind: "busy" }
  | { ok: false; kind: "timeout"; budgetMs: number }
  | { ok: false; kind: "crash"; message: string };

/** The pool of what-if threads of this process. */
function newWhatIfPool() {
  return new ThreadPool<
    { document: unknown; request: WhatIfRequest; budgetMs: number },
    WhatIfThreadAnswer
  >({
    // Found from the project root at run time: the web bundle has no stable path of its own.
    entryFile: () => path.join(projectRoot(), "web", "lib", "what-if", "thread-entry.mjs"),
    threads: whatIfThreadCount,
    queueLength: whatIfQueueLength,
    name: "the what-if thread",
  });
}

const globalForPool = globalThis as unknown as {
  teardownWhatIfPool?: ReturnType<typeof newWhatIfPool>;
};

/** Runs one what-if off the request thread (shared pool of this process). */
export async function runWhatIfOffThread(
  document: unknown,
  request: WhatIfRequest,
): Promise<WhatIfRun> {
  globalForPool.teardownWhatIfPool ??= newWhatIfPool();
  // The engine stops itself at the budget; the thread is ended only past a grace beyond it.
  const budgetMs = whatIfBudgetMs();
  const r = await globalForPool.teardownWhatIfPool.run(
    { document, request, budgetMs },
    budgetMs + HARD_STOP_GRACE_MS,
  );
  if (r.kind === "answer") return r.answer;
  if (r.kind === "timeout") return { ok: false, kind: "timeout", budgetMs };
  return { ok: false, ...r };
}

/** Ends the idle what-if threads (tests and shutdown). */
export async function closeWhatIfPool(): Promise<void> {
  const pool = globalForPool.teardownWhatIfPool;
  globalForPool.teardownWhatIfPool = undefined;
  await pool?.close();
}
