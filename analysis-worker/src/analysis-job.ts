/**
 * One analysis job: load the revision, run the engine with a time budget, store the outcome in
 * two steps. The cheap part (validate, blocks, nominal solve, layout) goes on the running row as
 * soon as the engine has it, a partial result with its variants pending, so the app shows
 * figures while the variants (lowest firing supply, bands, hints, unplug, plug-in) take their
 * budget; the full result then replaces it and the row is done. An overrun after the cheap part keeps it, as
 * partial with the variants stopped and why; an engine rejection, or an overrun before the
 * cheap part, is stored as a failed analysis and the job completes (it would fail the same way
 * again). A lost connection is retried in place for a while; a database
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
  storeNominal,
} from "./analysis-store.js";
import { parseStoredResult, type AnalysisOutput } from "@teardown/engine";
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

/** The result's schema problem, or null when its readers will accept it as this engine's. */
function schemaProblem(output: AnalysisOutput): string | null {
  // Checked against the schema its readers parse it with, so nothing is stored that the web
  // app would refuse to show.
  const checked = parseStoredResult(JSON.parse(JSON.stringify(output.result)));
  if (!checked.ok) return checked.message;
  return checked.upgradedFrom !== null ? "it lacks a status" : null;
}

/** The cheap part kept as the final result when the hard stop ended the variants. */
function variantsStopped(nominal: AnalysisOutput, reason: string): AnalysisOutput {
  if (nominal.result.status === "not-solved") return nominal;
  return { ...nominal, result: { ...nominal.result, variants: { state: "stopped", reason } } };
}

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

  // The cheap part is stored while the variants run; every later write waits for it, so the
  // full result always lands last.
  let nominal: AnalysisOutput | null = null;
  let nominalStored: Promise<void> = Promise.resolve();
  const onNominal = (output: AnalysisOutput) => {
    const problem = schemaProblem(output);
    if (problem !== null) return log.error({ reason: problem }, "nominal result refused");
    nominal = output;
    nominalStored = db("store nominal", () =>
      storeNominal(ctx.db, rev.id, job.engineVersion, output),
    )
      .then(() => log.info({ timings: output.timings }, "nominal result stored"))
      .catch((err: unknown) =>
        log.warn({ err: err instanceof Error ? err.message : String(err) }, "nominal not stored"),
      );
  };
  const run = await ctx.engine.run(rev.record, ctx.budgetMs, onNominal);
  await nominalStored;
  const kept: AnalysisOutput | null = nominal;
  if (kept !== null && (run.kind === "timeout" || run.kind === "crash")) {
    const reason =
      run.kind === "timeout"
        ? `the variants ran past the analysis's time budget of ${run.budgetMs} ms and were stopped; the nominal figures are kept`
        : `the engine failed while solving the variants (${run.message.split("\n")[0]}); the nominal figures are kept`;
    if (run.kind === "crash") log.error({ stack: run.message }, "engine crash in the variants");
    await db("store stopped", () =>
      storeDone(ctx.db, rev, job.engineVersion, variantsStopped(kept, reason)),
    );
    return finish("done", { stage: "variants", reason });
  }
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
      const problem = schemaProblem(outcome.output);
      if (problem !== null && kept !== null) {
        // The cheap part is already shown: keep it, and say why the rest is missing.
        const reason = `the full result does not match its schema (${problem}); the nominal figures are kept`;
        log.error({ reason }, "engine result refused");
        await db("store stopped", () =>
          storeDone(ctx.db, rev, job.engineVersion, variantsStopped(kept, reason)),
        );
        return finish("done", { stage: "variants", reason });
      }
      if (problem !== null) {
        const reason = `the engine's result does not match its schema: ${problem}`;
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
