// Faults the analysis worker must ride out: a connection cut inside a transaction (the call is
// retried, the process lives), a worker killed in the middle of a job (another worker finishes
// it after the job's expiry, once), and the Postgres server restarted under a running worker
// (it reconnects and every job completes, each once).
import { chmodSync, mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { drizzle } from "drizzle-orm/node-postgres";
import {
  ANALYSIS_QUEUE,
  applyMigrations,
  createPool,
  createQueue,
  schema,
  startQueue,
  type Database,
} from "@teardown/db";
import {
  findFreePort,
  startEmbeddedServer,
  type EmbeddedServer,
} from "@teardown/db/embedded-server";
import { ENGINE_VERSION } from "@teardown/engine";
import type { PgBoss } from "pg-boss";
import {
  guardPoolClients,
  isTransientDatabaseError,
  withDatabaseRetry,
} from "../../../analysis-worker/src/database-faults.js";
import { createTestDatabase, type TestDatabase } from "../../support/test-database.js";
import { startWorkerProcess, type WorkerProcess } from "../../support/worker-process.js";
import { ladderDoc } from "../../support/record-docs.js";
import { makeEntry, makeTeam } from "../../support/entry-fixtures.js";

/** Short enough that a killed worker's job comes back within the test, long against one analysis (~1 s). */
const JOB_EXPIRE_SECONDS = "10";
/** How often a worker's supervisor looks for expired jobs. */
const QUEUE_SUPERVISE_SECONDS = "1";
const FAULT_ENV = {
  WORKER_CONCURRENCY: "2",
  JOB_EXPIRE_SECONDS,
  QUEUE_SUPERVISE_SECONDS,
  QUEUE_POLL_SECONDS: "0.5",
};
// A job takes its expiry from the queue when it is sent, and this process updates the queue too.
process.env.JOB_EXPIRE_SECONDS = JOB_EXPIRE_SECONDS;
process.env.QUEUE_SUPERVISE_SECONDS = QUEUE_SUPERVISE_SECONDS;

type LogLine = Record<string, unknown>;
const workers: WorkerProcess[] = [];

afterAll(async () => {
  for (const w of workers)
    if (w.child.exitCode === null && w.child.signalCode === null) w.child.kill("SIGKILL");
  await Promise.all(workers.map((w) => w.exited));
});

/** Polls `cond` until it holds; a query error (the server is away) counts as "not yet". */
async function waitUntil(what: string, cond: () => Promise<boolean>, ms: number): Promise<void> {
  const end = Date.now() + ms;
  for (;;) {
    if (await cond().catch(() => false)) return;
    if (Date.now() > end) throw new Error(`${what}: not met within ${ms} ms`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

async function countAnalyses(
  db: Database,
): Promise<{ rows: number; done: number; revisions: number }> {
  const r = await db.execute<{ rows: number; done: number; revisions: number }>(
    sql`select count(*)::int as rows, count(*) filter (where state = 'done')::int as done, count(distinct revision_id)::int as revisions from analyses`,
  );
  return r.rows[0]!;
}

function finishedDone(logs: LogLine[]): string[] {
  return logs
    .filter((l) => l.msg === "analysis job finished" && l.outcome === "done")
    .map((l) => String(l.revisionId));
}

/** Revisions whose job this log started and never finished. */
function startedNotFinished(logs: LogLine[]): string[] {
  const finished = new Set(
    logs.filter((l) => l.msg === "analysis job finished").map((l) => String(l.revisionId)),
  );
  return logs
    .filter((l) => l.msg === "analysis job started" && !finished.has(String(l.revisionId)))
    .map((l) => String(l.revisionId));
}

/** Stops a worker with SIGTERM, and with SIGKILL if it has not gone within `ms`. */
async function stopWorker(w: WorkerProcess, ms = 25_000): Promise<void> {
  if (w.child.exitCode !== null || w.child.signalCode !== null) return;
  w.child.kill("SIGTERM");
  const timer = setTimeout(() => w.child.kill("SIGKILL"), ms);
  await w.exited;
  clearTimeout(timer);
}

describe("a database connection cut while the worker holds it", () => {
  let t: TestDatabase;
  beforeAll(async () => {
    t = await createTestDatabase();
  });
  afterAll(async () => {
    await t?.drop();
  });

  it("fails the transaction it was in, which is then retried to success, and the process lives", async () => {
    const pool = createPool(t.url, 2);
    const lost: Error[] = [];
    guardPoolClients(pool, (err) => lost.push(err));
    const db = drizzle(pool, { schema });
    const admin = new pg.Client({ connectionString: t.url });
    await admin.connect();
    try {
      let attempts = 0;
      const retried: unknown[] = [];
      const answer = await withDatabaseRetry(
        () =>
          db.transaction(async (tx) => {
            attempts++;
            if (attempts === 1) {
              const me = await tx.execute<{ pid: number }>(sql`select pg_backend_pid() as pid`);
              await admin.query("select pg_terminate_backend($1)", [me.rows[0]!.pid]);
              // Between statements the client is checked out and idle: the cut arrives as an
              // 'error' event, which ends the process unless something listens. (It may come
              // twice: the server's goodbye, then the socket closing.)
              await waitUntil("the client told of the cut", async () => lost.length > 0, 10_000);
            }
            const r = await tx.execute<{ answer: number }>(sql`select 6 * 7 as answer`);
            return r.rows[0]!.answer;
          }),
        { maxElapsedMs: 10_000, onRetry: (err) => retried.push(err) },
      );
      expect(answer).toBe(42);
      expect(attempts).toBe(2);
      expect(retried).toHaveLength(1);
      expect(isTransientDatabaseError(retried[0])).toBe(true);
      expect((lost[0] as { code?: string }).code).toBe("57P01"); // admin_shutdown, as on a server stop
    } finally {
      await admin.end();
      await pool.end();
    }
  });

  it("does not retry a call that fails for a reason of its own", async () => {
    const db = drizzle(t.pool, { schema });
    let attempts = 0;
    const failing = withDatabaseRetry(
      () => {
        attempts++;
        return db.execute(sql`select * from no_such_table`);
      },
      { maxElapsedMs: 10_000 },
    );
    await expect(failing).rejects.toThrow();
    expect(attempts).toBe(1);
  });
});

describe("a worker killed in the middle of a job", () => {
  let t: TestDatabase;
  let boss: PgBoss;
  beforeAll(async () => {
    t = await createTestDatabase();
    boss = createQueue(t.url, { supervise: false });
    await startQueue(boss);
  });
  afterAll(async () => {
    for (const w of workers.splice(0)) await stopWorker(w);
    await boss?.stop({ close: true });
    await t?.drop();
  });

  it("leaves its job to another worker after the expiry, which finishes it once, and loses nothing", async () => {
    const team = await makeTeam(t.db);
    const revisions: string[] = [];
    // Ladders of 24..31 rungs: about a second of analysis each, so a job is in hand long enough
    // to be killed in, and far shorter than the expiry, so no healthy job is handed out twice.
    for (let i = 0; i < 8; i++)
      revisions.push(
        (await makeEntry(t.db, boss, team, ladderDoc(24 + i), ENGINE_VERSION)).revisionId,
      );

    const first = startWorkerProcess(t.url, FAULT_ENV);
    workers.push(first);
    // Kill from the output handler itself, the moment the log shows a job in hand after two done:
    // a poll could let the job finish between seeing the line and the kill.
    const killedWith = await new Promise<string[]>((resolve, reject) => {
      const timer = setTimeout(
        () =>
          reject(
            new Error(
              `the first worker never had a job in hand; stderr: ${first.stderr().slice(-500)}`,
            ),
          ),
        90_000,
      );
      first.child.stdout!.on("data", () => {
        if (first.child.killed) return;
        const inHand = startedNotFinished(first.logs);
        if (finishedDone(first.logs).length >= 2 && inHand.length > 0) {
          first.child.kill("SIGKILL");
          clearTimeout(timer);
          resolve(inHand);
        }
      });
      void first.exited.then(() =>
        reject(
          new Error(`the first worker exited by itself; stderr: ${first.stderr().slice(-500)}`),
        ),
      );
    });
    const exit = await first.exited;
    expect(exit.signal).toBe("SIGKILL");

    // Judged on everything the killed worker wrote: it started these and finished none of them.
    const interrupted = startedNotFinished(first.logs);
    expect(killedWith.length).toBeGreaterThan(0);
    expect(interrupted.length).toBeGreaterThan(0);
    const doneByFirst = finishedDone(first.logs);
    // Its analysis rows say running: no result was stored before the kill.
    const states = await t.db.execute<{ state: string }>(
      sql`select state from analyses where revision_id in (${sql.join(
        interrupted.map((id) => sql`${id}`),
        sql`, `,
      )})`,
    );
    expect(states.rows.map((r) => r.state)).toEqual(interrupted.map(() => "running"));

    const second = startWorkerProcess(t.url, FAULT_ENV);
    workers.push(second);
    const completedJobs = async () => {
      const r = await t.db.execute<{ n: number }>(
        sql`select count(*)::int as n from pgboss.job where name = ${ANALYSIS_QUEUE} and state = 'completed'`,
      );
      return r.rows[0]!.n;
    };
    const finishLines = () =>
      [...first.logs, ...second.logs].filter((l) => l.msg === "analysis job finished").length;
    // The log lines too: a worker's output can reach this process after its database writes do.
    await waitUntil(
      "every revision analysed, its job completed and its finish read from the log",
      async () =>
        (await countAnalyses(t.db)).done === revisions.length &&
        (await completedJobs()) === revisions.length &&
        finishLines() >= revisions.length,
      90_000,
    );

    expect(await countAnalyses(t.db)).toEqual({
      rows: revisions.length,
      done: revisions.length,
      revisions: revisions.length,
    });
    const doneBySecond = finishedDone(second.logs);
    // The second worker finished each interrupted revision exactly once...
    for (const id of interrupted) expect(doneBySecond.filter((r) => r === id)).toHaveLength(1);
    // ...no sooner than the expiry after the killed worker started it (pino's times are epoch ms)...
    for (const id of interrupted) {
      const started = first.logs.find(
        (l) => l.msg === "analysis job started" && l.revisionId === id,
      );
      const finished = second.logs.find(
        (l) => l.msg === "analysis job finished" && l.outcome === "done" && l.revisionId === id,
      );
      expect(Number(finished!.time) - Number(started!.time)).toBeGreaterThanOrEqual(
        Number(JOB_EXPIRE_SECONDS) * 1000,
      );
    }
    // ...and between them every revision was analysed exactly once.
    expect([...doneByFirst, ...doneBySecond].sort()).toEqual([...revisions].sort());
    // The interrupted jobs came back through expiry: completed on a second claim.
    const jobs = await t.db.execute<{ state: string; retry_count: number }>(
      sql`select state, retry_count from pgboss.job where name = ${ANALYSIS_QUEUE} and data->>'revisionId' in (${sql.join(
        interrupted.map((id) => sql`${id}`),
        sql`, `,
      )})`,
    );
    expect(jobs.rows).toHaveLength(interrupted.length);
    for (const j of jobs.rows) {
      expect(j.state).toBe("completed");
      expect(j.retry_count).toBeGreaterThanOrEqual(1);
    }
  }, 150_000);
});

describe("the Postgres server restarted while jobs run", () => {
  const REVISIONS = 40;
  const tmp = mkdtempSync(path.join(os.tmpdir(), "tl-restart-"));
  // Under root the server runs as the postgres user, which must be able to enter the folder.
  chmodSync(tmp, 0o755);
  const dataDir = path.join(tmp, "pg");
  let server: EmbeddedServer | null = null;
  let pool: pg.Pool | null = null;

  afterAll(async () => {
    for (const w of workers.splice(0)) await stopWorker(w);
    await pool?.end().catch(() => {});
    await server?.stop();
    rmSync(tmp, { recursive: true, force: true });
  });

  it("is reconnected to by the worker, and every job completes, each once", async () => {
    // A fixed port, so the restarted server is where the worker left it.
    const port = await findFreePort();
    server = await startEmbeddedServer({ dataDir, port });
    const admin = new pg.Client({ connectionString: server.adminUrl });
    await admin.connect();
    await admin.query("create database teardown_restart");
    await admin.end();
    const url = server.adminUrl.replace(/\/postgres$/, "/teardown_restart");
    await applyMigrations(url);
    pool = createPool(url, 3);
    const db = drizzle(pool, { schema });

    const worker = startWorkerProcess(url, FAULT_ENV);
    workers.push(worker);
    await worker.waitForLog((l) => l.msg === "worker ready", 60_000);

    const boss = createQueue(url, { supervise: false });
    boss.on("error", () => {});
    await startQueue(boss);
    const team = await makeTeam(db);
    // Ladders of 10..19 rungs, a few tenths of a second each: the run lasts long enough to be cut.
    for (let i = 0; i < REVISIONS; i++)
      await makeEntry(db, boss, team, ladderDoc(10 + (i % 10)), ENGINE_VERSION);
    // This process sends nothing more; only the worker has to live through the restart.
    await boss.stop({ close: true });

    await waitUntil("a few analyses done", async () => (await countAnalyses(db)).done >= 5, 90_000);
    const logsBeforeStop = worker.logs.length;
    await server.stop();
    const doneAtStop = finishedDone(worker.logs).length;
    expect(doneAtStop).toBeLessThan(REVISIONS);
    // The outage itself: the server is away for this long whatever the worker does.
    await new Promise((r) => setTimeout(r, 2_000));
    expect(worker.child.exitCode).toBeNull();

    server = await startEmbeddedServer({ dataDir, port });
    expect(server.port).toBe(port);
    const jobStates = async () => {
      const jobs = await db.execute<{ state: string; n: number }>(
        sql`select state::text, count(*)::int as n from pgboss.job where name = ${ANALYSIS_QUEUE} group by state`,
      );
      return Object.fromEntries(jobs.rows.map((r) => [r.state, r.n]));
    };
    // A job whose completion was lost in the outage comes back after its expiry and finds its
    // analysis done, so the queue settles a little after the analyses do.
    await waitUntil(
      "every revision analysed and every job completed after the restart",
      async () =>
        (await countAnalyses(db)).done === REVISIONS && (await jobStates()).completed === REVISIONS,
      90_000,
    );

    expect(await countAnalyses(db)).toEqual({
      rows: REVISIONS,
      done: REVISIONS,
      revisions: REVISIONS,
    });
    expect(await jobStates()).toEqual({ completed: REVISIONS });
    // The worker lived through it, and saw the outage (it logged warnings while the server was away).
    expect(worker.child.exitCode).toBeNull();
    expect(worker.logs.slice(logsBeforeStop).some((l) => Number(l.level) >= 40)).toBe(true);
  }, 150_000);
});
