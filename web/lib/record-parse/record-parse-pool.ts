/**
 * Reads submitted circuit files in worker threads, so a large upload cannot stall the web
 * process's other requests (health checks, page loads). The pool is bounded twice: a few
 * threads, and a short waiting line; past it the caller answers 503 with Retry-After instead
 * of piling work up. A read that overruns its budget has its thread ended and replaced.
 */
import os from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import { projectRoot } from "@teardown/db";
import type { InputError, TeardownRecord } from "@teardown/engine";

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

interface Waiting {
  text: string;
  filename: string | undefined;
  resolve: (r: ParseResult) => void;
}

// Found from the project root at run time: the web bundle has no stable path of its own.
const entryFile = () => path.join(projectRoot(), "web", "lib", "record-parse", "thread-entry.mjs");

class RecordParsePool {
  private idle: Worker[] = [];
  private busy = 0;
  private waiting: Waiting[] = [];
  private nextId = 1;

  read(text: string, filename: string | undefined): Promise<ParseResult> {
    if (this.busy >= parseThreadCount() && this.waiting.length >= MAX_WAITING_PARSES)
      return Promise.resolve({ kind: "busy" });
    return new Promise((resolve) => {
      this.waiting.push({ text, filename, resolve });
      this.pump();
    });
  }

  private pump(): void {
    while (this.busy < parseThreadCount() && this.waiting.length > 0) {
      const job = this.waiting.shift()!;
      this.busy++;
      void this.runOne(job).then((r) => {
        this.busy--;
        job.resolve(r);
        this.pump();
      });
    }
  }

  private async take(): Promise<Worker> {
    const reused = this.idle.pop();
    if (reused) return reused;
    const worker = new Worker(entryFile());
    worker.unref(); // an idle reader must not keep the process alive
    await new Promise<void>((resolve, reject) => {
      const onMessage = (msg: { ready?: boolean }) => {
        if (!msg.ready) return;
        worker.off("message", onMessage);
        worker.off("error", reject);
        resolve();
      };
      worker.on("message", onMessage);
      worker.once("error", reject);
    });
    return worker;
  }

  private async runOne(job: Waiting): Promise<ParseResult> {
    let worker: Worker;
    try {
      worker = await this.take();
    } catch (err) {
      return { kind: "crash", message: `the record reader did not start: ${String(err)}` };
    }
    const id = this.nextId++;
    return new Promise<ParseResult>((resolve) => {
      const done = (r: ParseResult, reuse: boolean) => {
        clearTimeout(timer);
        worker.off("message", onMessage);
        worker.off("error", onError);
        if (reuse) this.idle.push(worker);
        else void worker.terminate();
        resolve(r);
      };
      const onMessage = (msg: { id: number; crash?: string } & Record<string, unknown>) => {
        if (msg.id !== id) return;
        if (msg.crash !== undefined) return done({ kind: "crash", message: msg.crash }, true);
        const { id: _id, ...rest } = msg;
        void _id;
        done({ kind: "read", ...(rest as object) } as ParseResult, true);
      };
      const onError = (err: Error) => done({ kind: "crash", message: err.message }, false);
      const timer = setTimeout(
        () => done({ kind: "timeout", budgetMs: PARSE_BUDGET_MS }, false),
        PARSE_BUDGET_MS,
      );
      worker.on("message", onMessage);
      worker.once("error", onError);
      worker.postMessage({
        id,
        text: job.text,
        ...(job.filename !== undefined ? { filename: job.filename } : {}),
      });
    });
  }

  /** Starts one reader thread ahead of the first upload (loading the engine takes seconds). */
  warm(): void {
    if (this.idle.length > 0 || this.busy > 0) return;
    this.busy++;
    void this.take()
      .then((w) => this.idle.push(w))
      .catch(() => {}) // the first upload tries again and reports the failure
      .finally(() => {
        this.busy--;
        this.pump();
      });
  }

  async close(): Promise<void> {
    const all = this.idle.splice(0);
    await Promise.all(all.map((w) => w.terminate()));
  }
}

const globalForPool = globalThis as unknown as { teardownParsePool?: RecordParsePool };

/** Reads one circuit file off the request thread (shared pool of this process). */
export function readRecordOffThread(text: string, filename?: string): Promise<ParseResult> {
  globalForPool.teardownParsePool ??= new RecordParsePool();
  return globalForPool.teardownParsePool.read(text, filename);
}

/** Loads a reader thread now, so the first upload does not wait for the engine to load. */
export function warmRecordParsePool(): void {
  globalForPool.teardownParsePool ??= new RecordParsePool();
  globalForPool.teardownParsePool.warm();
}

/** Ends the idle reader threads (tests and shutdown). */
export async function closeRecordParsePool(): Promise<void> {
  const pool = globalForPool.teardownParsePool;
  globalForPool.teardownParsePool = undefined;
  await pool?.close();
}
