/**
 * Runs engine analyses in worker threads with a time budget each. A thread that overruns is
 * terminated (so a runaway analysis cannot block other jobs) and replaced for the next job.
 */
import { Worker } from "node:worker_threads";
import type { AnalysisOutcome, AnalysisOutput } from "@teardown/engine";

export type EngineRun =
  | { kind: "outcome"; outcome: AnalysisOutcome }
  | { kind: "timeout"; budgetMs: number }
  | { kind: "crash"; message: string };

const THREAD_FILE = new URL("./engine-thread-entry.mjs", import.meta.url);

/**
 * The variants' own budget, as a share of the hard stop: the engine solves the nominal part
 * first, then spends this on the variants (lowest firing supply, bands, hints, unplug, plug-in)
 * and returns a partial result naming what it cut short, so a heavy record yields the worker
 * in time and the hard stop (a failed analysis) is only a backstop for a runaway.
 */
export const VARIANT_BUDGET_SHARE = 0.5;

/** One engine call in a fresh-or-reused thread, stopped when it passes `budgetMs`. */
export class EngineRunner {
  private idle: Worker[] = [];
  private nextId = 1;
  private readonly variantShare: number;

  /** `variantBudgetShare` overrides VARIANT_BUDGET_SHARE (above 1 the hard stop ends the variants first). */
  constructor(opts: { variantBudgetShare?: number } = {}) {
    this.variantShare = opts.variantBudgetShare ?? VARIANT_BUDGET_SHARE;
  }

  private async take(): Promise<Worker> {
    const reused = this.idle.pop();
    if (reused) return reused;
    const worker = new Worker(THREAD_FILE, { execArgv: process.execArgv });
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

  /**
   * Runs one analysis: its variants get a share of `budgetMs`, the thread is stopped at
   * `budgetMs`. `onNominal` receives the cheap part (nominal solve, figures, layout) as soon as
   * the thread has it, before the variants run. `stop` ends the run early exactly as the hard
   * stop does (thread terminated, reported as a timeout), for a caller that must stop at a
   * known point rather than at a clock time (a shutdown, or a test of what the stop leaves).
   */
  async run(
    record: unknown,
    budgetMs: number,
    onNominal?: (output: AnalysisOutput) => void,
    stop?: AbortSignal,
  ): Promise<EngineRun> {
    let worker: Worker;
    try {
      worker = await this.take();
    } catch (err) {
      return {
        kind: "crash",
        message: `the engine thread did not start: ${err instanceof Error ? err.message : String(err)}`,
      };
    }
    const id = this.nextId++;
    return new Promise<EngineRun>((resolve) => {
      let settled = false;
      const done = (r: EngineRun, reuse: boolean) => {
        // Once only: a stop signalled after the run ended must not touch the reused thread.
        if (settled) return;
        settled = true;
        clearTimeout(timer);
        worker.off("message", onMessage);
        worker.off("error", onError);
        if (reuse) this.idle.push(worker);
        else void worker.terminate();
        resolve(r);
      };
      const onMessage = (msg: {
        id: number;
        nominal?: AnalysisOutput;
        outcome?: AnalysisOutcome;
        crash?: string;
      }) => {
        if (msg.id !== id) return;
        if (msg.nominal !== undefined) onNominal?.(msg.nominal);
        else if (msg.crash !== undefined) done({ kind: "crash", message: msg.crash }, true);
        else done({ kind: "outcome", outcome: msg.outcome! }, true);
      };
      const onError = (err: Error) =>
        done({ kind: "crash", message: `${err.message}\n${err.stack ?? ""}` }, false);
      const timer = setTimeout(() => done({ kind: "timeout", budgetMs }, false), budgetMs);
      stop?.addEventListener("abort", () => done({ kind: "timeout", budgetMs }, false), {
        once: true,
      });
      worker.on("message", onMessage);
      worker.on("error", onError);
      worker.postMessage({ id, record, variantBudgetMs: budgetMs * this.variantShare });
    });
  }

  async close(): Promise<void> {
    await Promise.all(this.idle.splice(0).map((w) => w.terminate()));
  }
}
