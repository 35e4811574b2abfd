/**
 * One analysis job: load the revision, run the engine with a time budget, store the outcome.
 * An engine rejection or an overrun is stored as a failed analysis and the job completes (it
 * would fail the same way again). A lost connection is retried in place for a while; a database
 * error that outlasts that throws, so the queue retries the job with backoff.
 */
import type { Database } from "@teardown/db";
import type { AnalysisJob } from "@teardown/db";
import {
  analysisState,
  loadRevision,
  markRunning,
  storeDone,
  storeFailed,
} from "./analysis-store.js";
import { parseStoredResult } from "@teardown/engine";
import { withDatabaseRetry } from "./database-faults.js";
import type { EngineRunner } from "./engine-runner.js";
import { logger } from "./logger.js";

export interface JobContext {
  db: Database;
  engine: EngineRunner;
  /** The most one analysis may take before it is stopped and failed. */
  budgetMs: number;
  /** How long one database call is retried through an outage before the job fails (default 20 s). */
  dbRetryMs?: number;
}

const DEFAULT_DB_RETRY_MS = 20_000;

export type JobOutcome = "done" | "failed" | "skipped";

/** Runs one job to an outcome; throws only for transient (database) failures. */
export async function runAnalysisJob(
  ctx: JobContext,
  jobId: string,
  job: AnalysisJob,
): Promise<JobOutcome> {
  const t0 = performance.now();
  const log = logger.child({ jobId, revisionId: job.revisionId, engineVersion: job.engineVersion });
  const finish = (outcome: JobOutcome, extra: Record<string, unknown> = {}) => {
    log.info(
      { outcome, durationMs: Math.round(performance.now() - t0), ...extra },
      "analysis job finished",
    );
    return outcome;
  };
  // Every call is an idempotent read or upsert, so repeating one after a lost connection is safe.
  const db = <T>(what: string, call: () => Promise<T>) =>
    withDatabaseRetry(call, {
      maxElapsedMs: ctx.dbRetryMs ?? DEFAULT_DB_RETRY_MS,
      onRetry: (err, attempt, delayMs) =>
        log.warn(
          { what, attempt, delayMs, err: err instanceof Error ? err.message : String(err) },
          "database call failed, retrying",
        ),
    });
  if (
    (await db("read state", () => analysisState(ctx.db, job.revisionId, job.engineVersion))) ===
    "done"
  )
    return finish("skipped", { why: "already done" });
  const rev = await db("load revision", () => loadRevision(ctx.db, job.revisionId));
  if (!rev) return finish("skipped", { why: "revision no longer exists" });
  await db("mark running", () => markRunning(ctx.db, rev.id, job.engineVersion));
  // Logged once the row says running, so a log reader knows a job is in hand (crash tests use it).
  log.info("analysis job started");

  const run = await ctx.engine.run(rev.record, ctx.budgetMs);
  switch (run.kind) {
    case "timeout": {
      const reason = `the analysis ran past its time budget of ${run.budgetMs} ms and was stopped`;
      await db("store failed", () =>
        storeFailed(ctx.db, rev.id, job.engineVersion, "timeout", reason),
      );
      return finish("failed", { stage: "timeout", reason });
    }
    case "crash": {
      const reason = `the engine failed unexpectedly: ${run.message.split("\n")[0]}`;
      await db("store failed", () =>
        storeFailed(ctx.db, rev.id, job.engineVersion, "engine", reason),
      );
      log.error({ stack: run.message }, "engine crash");
      return finish("failed", { stage: "engine", reason });
    }
    case "outcome": {
      const outcome = run.outcome;
      if (!outcome.ok) {
        await db("store failed", () =>
          storeFailed(ctx.db, rev.id, job.engineVersion, outcome.stage, outcome.message),
        );
        return finish("failed", { stage: outcome.stage, reason: outcome.message });
      }
      // The stored result is checked against the schema its readers parse it with, so nothing
      // is stored that the web app would refuse to show.
      const checked = parseStoredResult(JSON.parse(JSON.stringify(outcome.output.result)));
      if (!checked.ok || checked.upgradedFrom !== null) {
        const reason = `the engine's result does not match its schema: ${checked.ok ? "it lacks a status" : checked.message}`;
        await db("store failed", () =>
          storeFailed(ctx.db, rev.id, job.engineVersion, "engine", reason),
        );
        log.error({ reason }, "engine result refused");
        return finish("failed", { stage: "engine", reason });
      }
      await db("store done", () => storeDone(ctx.db, rev, job.engineVersion, outcome.output));
      return finish("done", { timings: outcome.output.timings });
    }
  }
}
