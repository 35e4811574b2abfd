/**
 * Runs what-if analyses in worker threads, so a run cannot stall the web process's other
 * requests. Bounded three ways: a few threads, a short waiting line (past it the caller answers
 * 503 with Retry-After), and the analysis budget per run; a thread that overruns the budget is
 * ended and replaced.
 */
import os from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import { projectRoot } from "@teardown/db";
import type { WhatIfRequest } from "@teardown/engine";
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

interface Waiting {
  document: unknown;
  request: WhatIfRequest;
  resolve: (r: WhatIfRun) => void;
}

// Found from the project root at run time: the web bundle has no stable path of its own.
const entryFile = () => path.join(projectRoot(), "web", "lib", "what-if", "thread-entry.mjs");

class WhatIfPool {
  private idle: Worker[] = [];
  private busy = 0;
  private waiting: Waiting[] = [];
  private nextId = 1;

  run(document: unknown, request: WhatIfRequest): Promise<WhatIfRun> {
    if (this.busy >= whatIfThreadCount() && this.waiting.length >= whatIfQueueLength())
      return Promise.resolve({ ok: false, kind: "busy" });
    return new Promise((resolve) => {
      this.waiting.push({ document, request, resolve });
      this.pump();
    });
  }

  private pump(): void {
    while (this.busy < whatIfThreadCount() && this.waiting.length > 0) {
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
    worker.unref(); // an idle thread must not keep the process alive
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

  private async runOne(job: Waiting): Promise<WhatIfRun> {
    let worker: Worker;
    try {
      worker = await this.take();
    } catch (err) {
      return {
        ok: false,
        kind: "crash",
        message: `the what-if thread did not start: ${String(err)}`,
      };
    }
    const id = this.nextId++;
    const budgetMs = whatIfBudgetMs();
    return new Promise<WhatIfRun>((resolve) => {
      const done = (r: WhatIfRun, reuse: boolean) => {
        clearTimeout(timer);
        worker.off("message", onMessage);
        worker.off("error", onError);
        if (reuse) this.idle.push(worker);
        else void worker.terminate();
        resolve(r);
      };
      const onMessage = (msg: { id: number; crash?: string } & Record<string, unknown>) => {
        if (msg.id !== id) return;
        if (msg.crash !== undefined)
          return done({ ok: false, kind: "crash", message: msg.crash }, true);
        const { id: _id, ...answer } = msg;
        void _id;
        done(answer as unknown as WhatIfThreadAnswer, true);
      };
      const onError = (err: Error) =>
        done({ ok: false, kind: "crash", message: err.message }, false);
      const timer = setTimeout(
        () => done({ ok: false, kind: "timeout", budgetMs }, false),
        budgetMs + HARD_STOP_GRACE_MS,
      );
      worker.on("message", onMessage);
      worker.once("error", onError);
      worker.postMessage({ id, document: job.document, request: job.request, budgetMs });
    });
  }

  async close(): Promise<void> {
    await Promise.all(this.idle.splice(0).map((w) => w.terminate()));
  }
}

const globalForPool = globalThis as unknown as { teardownWhatIfPool?: WhatIfPool };

/** Runs one what-if off the request thread (shared pool of this process). */
export function runWhatIfOffThread(document: unknown, request: WhatIfRequest): Promise<WhatIfRun> {
  globalForPool.teardownWhatIfPool ??= new WhatIfPool();
  return globalForPool.teardownWhatIfPool.run(document, request);
}

/** Ends the idle what-if threads (tests and shutdown). */
export async function closeWhatIfPool(): Promise<void> {
  const pool = globalForPool.teardownWhatIfPool;
  globalForPool.teardownWhatIfPool = undefined;
  await pool?.close();
}
