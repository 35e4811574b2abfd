/**
 * The analysis job queue: pg-boss on the same Postgres, no other broker. A revision and its job
 * are written in one transaction (`enqueueAnalysis` takes the caller's transaction), so no
 * committed revision is left without a job and no job points at a rolled-back revision.
 */
import { sql } from "drizzle-orm";
import { PgBoss, fromDrizzle } from "pg-boss";
import * as schema from "./schema/index.js";
import type { Database } from "./client.js";

/** The one queue: analyse a revision with an engine version. */
export const ANALYSIS_QUEUE = "analyze-revision";

export interface AnalysisJob {
  revisionId: string;
  engineVersion: string;
}

/** Seconds a job may stay active before pg-boss hands it to another worker (a crashed worker). */
export function jobExpireSeconds(): number {
  return Number(process.env.JOB_EXPIRE_SECONDS ?? 300);
}

/** A pg-boss instance on the database at `url` (call `start()` before use, `stop()` after). */
export function createQueue(url: string, opts: { supervise?: boolean } = {}): PgBoss {
  const boss = new PgBoss({
    connectionString: url,
    schema: "pgboss",
    max: 4,
    supervise: opts.supervise ?? true,
    // Expired jobs (a worker that died mid-job) are noticed on each supervise pass.
    superviseIntervalSeconds: Number(process.env.QUEUE_SUPERVISE_SECONDS ?? 10),
    monitorIntervalSeconds: Number(process.env.QUEUE_SUPERVISE_SECONDS ?? 10),
    openTelemetry: { enabled: false },
  });
  return boss;
}

/** Starts pg-boss (installing its schema on first use) and makes sure the queue exists. */
export async function startQueue(boss: PgBoss): Promise<void> {
  await boss.start();
  const existing = await boss.getQueue(ANALYSIS_QUEUE);
  const options = {
    expireInSeconds: jobExpireSeconds(),
    // Transient failures (the database went away) are retried with backoff; an engine rejection
    // is not a failure of the job: it is stored as a failed analysis and the job completes.
    retryLimit: 8,
    retryDelay: 2,
    retryBackoff: true,
    retryDelayMax: 60,
  };
  if (!existing) await boss.createQueue(ANALYSIS_QUEUE, options);
  else await boss.updateQueue(ANALYSIS_QUEUE, options);
}

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

/**
 * Records a queued analysis for the revision and sends its job, inside the caller's transaction.
 * Idempotent per (revision, engine version): a second call adds neither a row nor a job.
 */
export async function enqueueAnalysis(tx: Tx, boss: PgBoss, job: AnalysisJob): Promise<boolean> {
  const inserted = await tx
    .insert(schema.analyses)
    .values({ revisionId: job.revisionId, engineVersion: job.engineVersion, state: "queued" })
    .onConflictDoNothing({ target: [schema.analyses.revisionId, schema.analyses.engineVersion] })
    .returning({ id: schema.analyses.id });
  if (inserted.length === 0) return false;
  await boss.send(ANALYSIS_QUEUE, job, {
    db: fromDrizzle(tx, sql),
    singletonKey: `${job.revisionId}:${job.engineVersion}`,
  });
  return true;
}
