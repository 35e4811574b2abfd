/**
 * `npm run worker`: one analysis worker process, with WORKER_CONCURRENCY jobs at a time. Many
 * processes on many machines may run against one database: the queue hands each job to one of
 * them, and results are idempotent upserts. SIGTERM finishes the jobs in hand within a grace
 * period, else releases them to the queue.
 */
import {
  analysisWorkOptions,
  ANALYSIS_QUEUE,
  applyMigrations,
  createQueue,
  DatabaseUnavailableError,
  jobExpireSeconds,
  openDatabase,
  startQueue,
  type AnalysisJob,
} from "@teardown/db";
import { runAnalysisJob } from "./analysis-job.js";
import { EngineRunner } from "./engine-runner.js";
import { backfillFingerprints } from "./fingerprint-backfill.js";
import { logger } from "./logger.js";

/** How long SIGTERM waits for jobs in hand before releasing them. */
const SHUTDOWN_GRACE_MS = Number(process.env.WORKER_SHUTDOWN_GRACE_MS ?? 20_000);
/** The time budget of one analysis. */
const ANALYSIS_BUDGET_MS = Number(process.env.ANALYSIS_BUDGET_MS ?? 60_000);
/** How often the worker looks for entries whose search features are behind. */
const BACKFILL_INTERVAL_MS = 5 * 60_000;
/** The longest one database call of a job is retried through an outage. */
const MAX_DB_RETRY_MS = 60_000;

async function main(): Promise<void> {
  const concurrency = Math.max(1, Number(process.env.WORKER_CONCURRENCY ?? 2));
  let handle;
  try {
    handle = await openDatabase({
      poolSize: concurrency + 2,
      onConnectionLost: (err) =>
        logger.warn({ err: err.message }, "database connection lost (retrying)"),
    });
    await applyMigrations(handle.url);
  } catch (err) {
    process.stderr.write(
      `teardown-ledger worker: ${err instanceof DatabaseUnavailableError ? err.message : String(err)}\n`,
    );
    process.exit(1);
  }
  // A connection lost while checked out must fail its query, not end the process.
  const boss = createQueue(handle.url);
  boss.on("error", (err: Error) => logger.warn({ err: err.message }, "queue error (retrying)"));
  await startQueue(boss);
  const engine = new EngineRunner();
  // A third of the expiry, so a job that gives up is failed and retried well before it expires.
  const ctx = {
    db: handle.db,
    engine,
    budgetMs: ANALYSIS_BUDGET_MS,
    dbRetryMs: Math.min(MAX_DB_RETRY_MS, (jobExpireSeconds() * 1000) / 3),
  };
  await boss.work<AnalysisJob>(
    ANALYSIS_QUEUE,
    // Per-team limit and heartbeat renewal: see analysisWorkOptions.
    analysisWorkOptions(concurrency),
    async ([job]) => {
      if (!job) return;
      await runAnalysisJob(ctx, job.id, job.data);
    },
  );
  logger.info({ concurrency, budgetMs: ANALYSIS_BUDGET_MS }, "worker ready");
  // Rows written under an older fingerprint definition (or imported from an archive, which
  // carries no current features) are brought up to date in the background, at start and then
  // every few minutes; until then similar and fragment search leave them out.
  let backfilling = false;
  const backfill = (): void => {
    if (backfilling) return;
    backfilling = true;
    backfillFingerprints(handle.db)
      .then(
        (done) =>
          done.updated + done.unreadable > 0 && logger.info(done, "fingerprints recomputed"),
        (err: unknown) =>
          logger.warn(
            { err: err instanceof Error ? err.message : String(err) },
            "fingerprint backfill stopped",
          ),
      )
      .finally(() => (backfilling = false));
  };
  backfill();
  const backfillTimer = setInterval(backfill, BACKFILL_INTERVAL_MS);
  backfillTimer.unref();

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal, graceMs: SHUTDOWN_GRACE_MS }, "worker stopping");
    // graceful: wait for handlers in hand up to the timeout; jobs still active then are left
    // for the queue to hand to another worker when they expire.
    await boss.stop({ graceful: true, timeout: SHUTDOWN_GRACE_MS, close: true }).catch(() => {});
    await engine.close();
    await handle.close();
    logger.info("worker stopped");
    process.exit(0);
  };
  process.on("SIGTERM", () => void stop("SIGTERM"));
  process.on("SIGINT", () => void stop("SIGINT"));
}

void main();
