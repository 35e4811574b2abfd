/**
 * Runs inside a worker thread: one engine analysis per message. A thread can be terminated
 * when an analysis overruns its time budget, which a call on the main thread could not.
 */
import { parentPort } from "node:worker_threads";
import { analyzeStoredRecord } from "@teardown/engine";

parentPort!.on("message", async (msg: { id: number; record: unknown; variantBudgetMs: number }) => {
  try {
    // The variants' own budget: variants it cuts short leave a partial result that says why.
    const outcome = await analyzeStoredRecord(msg.record, {
      now: () => performance.now(),
      variantBudgetMs: msg.variantBudgetMs,
      // The cheap part goes out first, so the worker can store it while the variants run.
      onNominal: (output) => parentPort!.postMessage({ id: msg.id, nominal: output }),
    });
    parentPort!.postMessage({ id: msg.id, outcome });
  } catch (err) {
    // A thrown error is an engine bug, not bad input: report it as such, with the stack.
    parentPort!.postMessage({
      id: msg.id,
      crash: err instanceof Error ? `${err.message}\n${err.stack ?? ""}` : String(err),
    });
  }
});

// Loading the engine is the slow part of a new thread; say when it is done, so the runner's
// time budget counts the analysis alone.
parentPort!.postMessage({ ready: true });
