/**
 * Reads submitted circuit files in worker threads (the web process's bounded pool,
 * `../thread-pool.ts`), so a large upload cannot stall its other requests (health checks, page
 * loads). Past the waiting line the caller answers 503 with Retry-After; a read that overruns
 * its budget has its thread ended and replaced.
 */
import os from "node:os";
import path from "node:path";
import { projectRoot } from "@teardown/db";
import type { InputError, TeardownRecord } from "@teardown/engine";
import { ThreadPool } from "../thread-pool";

/** Threads reading records at once: all cores but one (the request thread's), at least one. */
export function parseThreadCount(): number {
  const set = Number(process.env.RECORD_PARSE_THREADS);
  if (Number.isInteger(set) && set > 0) return set;
  return Math.max(1, Math.min(4, os.availableParallelism() - 1));
}
/** Reads that may wait for a thread; one more is refused as busy. */
export const MAX_WAITING_PARSES = Number(process.env.RECORD_PARSE_QUEUE ?? 8);
/** The longest one read may take before it is stopped. */
export const PARSE_BUDGET_MS = Number(process.env.RECORD_PARSE_BUDGET_MS ?? 60_000);

export type ParseResult =
  | {
      kind: "read";
      ok: true;
      record: TeardownRecord;
      document: Record<string, unknown>;
      warnings: InputError[];
    }
  | { kind: "read"; ok: false; errors: InputError[] }
  | { kind: "busy" }
  | { kind: "timeout"; budgetMs: number }
  | { kind: "crash"; message: string };

/** What the reader thread answers for one file. */
type ReaderAnswer = Omit<Extract<ParseResult, { kind: "read" }>, "kind">;

/** The pool of reader threads of this process. */
function newReaderPool(): ThreadPool<{ text: string; filename?: string }, ReaderAnswer> {
  return new ThreadPool({
    // Found from the project root at run time: the web bundle has no stable path of its own.
    entryFile: () => path.join(projectRoot(), "web", "lib", "record-parse", "thread-entry.mjs"),
    threads: parseThreadCount,
    queueLength: () => MAX_WAITING_PARSES,
    name: "the record reader",
  });
}

const globalForPool = globalThis as unknown as {
  teardownParsePool?: ReturnType<typeof newReaderPool>;
};

/** Reads one circuit file off the request thread (shared pool of this process). */
export async function readRecordOffThread(text: string, filename?: string): Promise<ParseResult> {
  globalForPool.teardownParsePool ??= newReaderPool();
  const r = await globalForPool.teardownParsePool.run(
    { text, ...(filename !== undefined ? { filename } : {}) },
    PARSE_BUDGET_MS,
  );
  if (r.kind === "answer") return { kind: "read", ...r.answer } as ParseResult;
  if (r.kind === "timeout") return { kind: "timeout", budgetMs: PARSE_BUDGET_MS };
  return r;
}

/** Loads a reader thread now, so the first upload does not wait for the engine to load. */
export function warmRecordParsePool(): void {
  globalForPool.teardownParsePool ??= newReaderPool();
  globalForPool.teardownParsePool.warm();
}

/** Ends the idle reader threads (tests and shutdown). */
export async function closeRecordParsePool(): Promise<void> {
  const pool = globalForPool.teardownParsePool;
  globalForPool.teardownParsePool = undefined;
  await pool?.close();
}
