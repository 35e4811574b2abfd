/**
 * The analysis job queue: pg-boss on the same Postgres, no other broker. A revision and its job
 * are written in one transaction (`enqueueAnalysis` takes the caller's transaction), so no
 * committed revision is left without a job and no job points at a rolled-back revision.
 */
import { eq, sql } from "drizzle-orm";
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

/**
 * Seconds without a heartbeat after which a job counts as abandoned (its worker was killed) and
 * goes back to the queue. A live worker renews it every third of this, whatever the analysis
 * takes, so the expiry above stays a loose outer bound and a dead worker's job returns within
 * seconds. pg-boss accepts no less than 10.
 */
export function jobHeartbeatSeconds(): number {
  return Math.max(10, Math.round(Number(process.env.JOB_HEARTBEAT_SECONDS ?? 10)));
}

/** How often a worker renews the heartbeat of each job in hand. */
export function jobHeartbeatRefreshSeconds(): number {
  return Math.max(1, Math.floor(jobHeartbeatSeconds() / 3));
}

/**
 * How many analyses of one team one worker process runs at once. A team that uploads a pile of
 * heavy records then holds at most this many of its slots, and any other team's job takes the
 * next free one instead of waiting behind the whole pile (jobs carry their team as the group).
 */
export function teamAnalysisConcurrency(workerConcurrency: number): number {
  const set = Number(process.env.TEAM_ANALYSIS_CONCURRENCY);
  if (Number.isInteger(set) && set > 0) return set;
  // All but one of a worker's slots: one team alone still uses the rest, a second team gets one.
  return Math.max(1, workerConcurrency - 1);
}

/** The options every worker's `boss.work` on the analysis queue takes. */
export function analysisWorkOptions(workerConcurrency: number) {
  return {
    localConcurrency: workerConcurrency,
    // Counted within each worker process. pg-boss's database-wide count (groupConcurrency) is
    // read without a lock, so two slots fetching in the same instant both took the same team;
    // per process, every worker keeps a slot free for other teams however many workers run.
    localGroupConcurrency: teamAnalysisConcurrency(workerConcurrency),
    heartbeatRefreshSeconds: jobHeartbeatRefreshSeconds(),
    pollingIntervalSeconds: Number(process.env.QUEUE_POLL_SECONDS ?? 0.5),
  };
}

/** A pg-boss instance on the database at `url` (call `start()` before use, `stop()` after). */
export function createQueue(url: string, opts: { supervise?: boolean } = {}): PgBoss {
  const boss = new PgBoss({
    connectionString: url,
    schema: "pgboss",
    max: 4,
    supervise: opts.supervise ?? true,
    // Expired jobs and jobs whose heartbeat stopped are noticed on each supervise pass.
    superviseIntervalSeconds: Number(process.env.QUEUE_SUPERVISE_SECONDS ?? 5),
    monitorIntervalSeconds: Number(process.env.QUEUE_SUPERVISE_SECONDS ?? 5),
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
    heartbeatSeconds: jobHeartbeatSeconds(),
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
  // The revision's team is the job's group, which the workers' per-team limit counts.
  const team = await tx
    .select({ teamId: schema.entries.teamId })
    .from(schema.revisions)
    .innerJoin(schema.entries, eq(schema.entries.id, schema.revisions.entryId))
    .where(eq(schema.revisions.id, job.revisionId));
  await boss.send(ANALYSIS_QUEUE, job, {
    db: fromDrizzle(tx, sql),
    singletonKey: `${job.revisionId}:${job.engineVersion}`,
    ...(team[0] ? { group: { id: team[0].teamId } } : {}),
  });
  return true;
}
