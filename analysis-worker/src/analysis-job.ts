/**
 * One analysis job: load the revision, run the engine with a time budget, store the outcome.
 * An engine rejection or an overrun is stored as a failed analysis and the job completes (it
 * would fail the same way again); a database error throws, so the queue retries with backoff.
 */
import type { Database } from "@teardown/db";
import type { AnalysisJob } from "@teardown/db";
import { analysisState, loadRevision, markRunning, storeDone, storeFailed } from "./analysis-store.js";
import type { EngineRunner } from "./engine-runner.js";
import { logger } from "./logger.js";

export interface JobContext {
  db: Database;
  engine: EngineRunner;
  /** The most one analysis may take before it is stopped and failed. */
  budgetMs: number;
}

export type JobOutcome = "done" | "failed" | "skipped";

/** Runs one job to an outcome; throws only for transient (database) failures. */
export async function runAnalysisJob(ctx: JobContext, jobId: string, job: AnalysisJob): Promise<JobOutcome> {
  const t0 = performance.now();
  const log = logger.child({ jobId, revisionId: job.revisionId, engineVersion: job.engineVersion });
  const finish = (outcome: JobOutcome, extra: Record<string, unknown> = {}) => {
    log.info({ outcome, durationMs: Math.round(performance.now() - t0), ...extra }, "analysis job finished");
    return outcome;
  };
  if ((await analysisState(ctx.db, job.revisionId, job.engineVersion)) === "done") return finish("skipped", { why: "already done" });
  const rev = await loadRevision(ctx.db, job.revisionId);
  if (!rev) return finish("skipped", { why: "revision no longer exists" });
  await markRunning(ctx.db, rev.id, job.engineVersion);
  // Logged once the row says running, so a log reader knows a job is in hand (crash tests use it).
  log.info("analysis job started");

  const run = await ctx.engine.run(rev.record, ctx.budgetMs);
  switch (run.kind) {
    case "timeout": {
      const reason = `the analysis ran past its time budget of ${run.budgetMs} ms and was stopped`;
      await storeFailed(ctx.db, rev.id, job.engineVersion, "timeout", reason);
      return finish("failed", { stage: "timeout", reason });
    }
    case "crash": {
      const reason = `the engine failed unexpectedly: ${run.message.split("\n")[0]}`;
      await storeFailed(ctx.db, rev.id, job.engineVersion, "engine", reason);
      log.error({ stack: run.message }, "engine crash");
      return finish("failed", { stage: "engine", reason });
    }
    case "outcome": {
      if (!run.outcome.ok) {
        await storeFailed(ctx.db, rev.id, job.engineVersion, run.outcome.stage, run.outcome.message);
        return finish("failed", { stage: run.outcome.stage, reason: run.outcome.message });
      }
      await storeDone(ctx.db, rev, job.engineVersion, run.outcome.output);
      return finish("done", { timings: run.outcome.output.timings });
    }
  }
}
