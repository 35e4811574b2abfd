/**
 * Analysis worker speed on a fresh database: analyses per second with one and with two worker
 * processes draining a backlog, and the time from a revision's commit to its analysis being
 * visible as done. Run with `npx tsx tests/bench/worker-bench.ts`. It uses the server on
 * 127.0.0.1:5432 when one answers, else an embedded server in a temporary folder. This is a
 * measurement, not a test: it prints figures and fails only when something breaks.
 */
import { chmodSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { randomBytes } from "node:crypto";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { drizzle } from "drizzle-orm/node-postgres";
import {
  applyMigrations,
  createPool,
  createQueue,
  projectRoot,
  schema,
  startQueue,
  type Database,
} from "@teardown/db";
import { startEmbeddedServer, type EmbeddedServer } from "@teardown/db/embedded-server";
import { ENGINE_VERSION, parseRecord, serializeRecord } from "@teardown/engine";
import type { PgBoss } from "pg-boss";
import { makeEntry, makeTeam } from "../support/entry-fixtures.js";
import { nightLightDoc } from "../support/record-docs.js";
import { startWorkerProcess, type WorkerProcess } from "../support/worker-process.js";

const LOCAL_SERVER_URL = "postgres://postgres@127.0.0.1:5432/postgres";
/** Revisions in each backlog the workers drain. */
const BACKLOG_REVISIONS = 48;
/** Revisions committed one at a time for the commit-to-done figures. */
const LATENCY_REVISIONS = 24;
/** How often the latency probe reads the analysis row; figures are late by up to this much. */
const LATENCY_POLL_MS = 10;
/** Jobs each worker process runs at once (the worker's default). */
const WORKER_CONCURRENCY = "2";
/** The longest one phase may take before the bench gives up. */
const PHASE_TIMEOUT_MS = 300_000;

/** The value below which `q` of the sorted samples fall (nearest rank). */
function quantile(sorted: readonly number[], q: number): number {
  const rank = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return sorted[rank]!;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function answers(url: string): Promise<boolean> {
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 1500 });
  try {
    await client.connect();
    await client.query("select 1");
    return true;
  } catch {
    return false;
  } finally {
    await client.end().catch(() => {});
  }
}

/** The demo records from seed-demo/records when that folder has YAML files, else test night lights. */
function benchRecords(): { docs: Array<Record<string, unknown>>; source: string } {
  const dir = path.join(projectRoot(), "seed-demo", "records");
  const files = existsSync(dir)
    ? readdirSync(dir)
        .filter((f) => /\.ya?ml$/.test(f))
        .sort()
    : [];
  if (files.length === 0) {
    return {
      docs: Array.from({ length: 6 }, (_, i) => nightLightDoc(i)),
      source: "6 test night-light variants (seed-demo/records has no YAML files)",
    };
  }
  const docs = files.map((file) => {
    const parsed = parseRecord(readFileSync(path.join(dir, file), "utf8"), { filename: file });
    if (!parsed.ok)
      throw new Error(
        `demo record ${file} is invalid: ${parsed.errors.map((e) => e.message).join("; ")}`,
      );
    return JSON.parse(serializeRecord(parsed.record, "json")) as Record<string, unknown>;
  });
  return { docs, source: `the ${files.length} demo records in seed-demo/records` };
}

interface BenchDatabase {
  url: string;
  pool: pg.Pool;
  db: Database;
  boss: PgBoss;
  drop(): Promise<void>;
}

/** A new database on the server, migrated, with a pool and a queue client on it. */
async function freshDatabase(adminUrl: string): Promise<BenchDatabase> {
  const name = `tl_bench_${randomBytes(5).toString("hex")}`;
  const admin = async (text: string) => {
    const c = new pg.Client({ connectionString: adminUrl });
    await c.connect();
    try {
      await c.query(text);
    } finally {
      await c.end();
    }
  };
  await admin(`create database ${name}`);
  const u = new URL(adminUrl);
  u.pathname = `/${name}`;
  const url = u.toString();
  await applyMigrations(url);
  const pool = createPool(url, 4);
  const boss = createQueue(url, { supervise: false });
  await startQueue(boss);
  return {
    url,
    pool,
    db: drizzle(pool, { schema }),
    boss,
    async drop() {
      await boss.stop({ close: true }).catch(() => {});
      await pool.end().catch(() => {});
      await admin(`drop database if exists ${name} with (force)`);
    },
  };
}

async function startWorkers(url: string, count: number): Promise<WorkerProcess[]> {
  const workers = Array.from({ length: count }, () =>
    startWorkerProcess(url, { WORKER_CONCURRENCY, LOG_LEVEL: "info" }),
  );
  await Promise.all(workers.map((w) => w.waitForLog((l) => l.msg === "worker ready", 120_000)));
  return workers;
}

async function stopWorkers(workers: WorkerProcess[]): Promise<void> {
  for (const w of workers) if (w.child.exitCode === null) w.child.kill("SIGTERM");
  await Promise.all(workers.map((w) => w.exited));
}

async function settledCount(b: BenchDatabase): Promise<{ done: number; failed: number }> {
  const r = await b.pool.query<{ done: number; failed: number }>(
    "select count(*) filter (where state = 'done')::int as done, count(*) filter (where state = 'failed')::int as failed from analyses",
  );
  return r.rows[0]!;
}

/** Enqueues a backlog, then lets `processes` workers drain it; the rate is from the server's own timestamps. */
async function drainBacklog(
  adminUrl: string,
  docs: Array<Record<string, unknown>>,
  processes: number,
): Promise<{ perSecond: number; spanS: number; failed: number }> {
  const b = await freshDatabase(adminUrl);
  let workers: WorkerProcess[] = [];
  try {
    const team = await makeTeam(b.db);
    for (let i = 0; i < BACKLOG_REVISIONS; i++)
      await makeEntry(b.db, b.boss, team, docs[i % docs.length]!, ENGINE_VERSION);
    workers = await startWorkers(b.url, processes);
    const end = Date.now() + PHASE_TIMEOUT_MS;
    for (;;) {
      const c = await settledCount(b);
      if (c.done + c.failed === BACKLOG_REVISIONS) break;
      if (Date.now() > end)
        throw new Error(
          `the backlog was not drained within ${PHASE_TIMEOUT_MS} ms: ${JSON.stringify(c)}`,
        );
      for (const w of workers)
        if (w.child.exitCode !== null)
          throw new Error(`a worker exited (${w.child.exitCode}): ${w.stderr().slice(-500)}`);
      await sleep(100);
    }
    // From the first job's start to the last one's finish, so worker start-up and enqueueing are left out.
    const span = await b.pool.query<{ s: number; failed: number }>(
      "select extract(epoch from max(finished_at) - min(started_at))::float8 as s, count(*) filter (where state = 'failed')::int as failed from analyses",
    );
    const spanS = span.rows[0]!.s;
    return { perSecond: BACKLOG_REVISIONS / spanS, spanS, failed: span.rows[0]!.failed };
  } finally {
    await stopWorkers(workers);
    await b.drop();
  }
}

/** Commits revisions one at a time to an idle worker and times each until its analysis reads done. */
async function commitToDone(
  adminUrl: string,
  docs: Array<Record<string, unknown>>,
): Promise<{ times: number[]; failures: string[] }> {
  const b = await freshDatabase(adminUrl);
  let workers: WorkerProcess[] = [];
  try {
    workers = await startWorkers(b.url, 1);
    const team = await makeTeam(b.db);
    const times: number[] = [];
    const failures: string[] = [];
    for (let i = 0; i < LATENCY_REVISIONS; i++) {
      const { revisionId } = await makeEntry(
        b.db,
        b.boss,
        team,
        docs[i % docs.length]!,
        ENGINE_VERSION,
      );
      const committed = performance.now(); // createEntry resolves once its transaction has committed
      const end = Date.now() + PHASE_TIMEOUT_MS;
      let failed = false;
      for (;;) {
        const r = await b.pool.query<{ state: string; error_stage: string; error: string }>(
          "select state, error_stage, error from analyses where revision_id = $1",
          [revisionId],
        );
        const row = r.rows[0];
        if (row?.state === "done") break;
        // A stored failure is settled too, but it is no "done": count it and leave it out.
        if (row?.state === "failed") {
          failures.push(`record ${i % docs.length} at ${row.error_stage}: ${row.error}`);
          failed = true;
          break;
        }
        if (Date.now() > end)
          throw new Error(`revision ${revisionId} was not analysed within ${PHASE_TIMEOUT_MS} ms`);
        await sleep(LATENCY_POLL_MS);
      }
      if (!failed) times.push(performance.now() - committed);
      await sleep(50); // let the worker go idle, so each revision meets an empty queue
    }
    return { times, failures };
  } finally {
    await stopWorkers(workers);
    await b.drop();
  }
}

async function main(): Promise<void> {
  let server: EmbeddedServer | null = null;
  let tmp: string | null = null;
  let adminUrl = LOCAL_SERVER_URL;
  let serverName = "the local server on 127.0.0.1:5432";
  if (!(await answers(LOCAL_SERVER_URL))) {
    tmp = mkdtempSync(path.join(os.tmpdir(), "tl-bench-"));
    chmodSync(tmp, 0o755); // under root the server runs as the postgres user, which must enter it
    server = await startEmbeddedServer({ dataDir: path.join(tmp, "pg") });
    adminUrl = server.adminUrl;
    serverName = `an embedded server on port ${server.port}`;
  }
  try {
    const { docs, source } = benchRecords();
    console.log(
      `analysis worker, engine ${ENGINE_VERSION}, on ${serverName}, ${os.cpus().length} CPUs, ${source}:`,
    );
    console.log(
      `  backlog of ${BACKLOG_REVISIONS} revisions, ${WORKER_CONCURRENCY} jobs at a time per worker process, rate from first job start to last finish:`,
    );
    for (const processes of [1, 2]) {
      const r = await drainBacklog(adminUrl, docs, processes);
      const label = processes === 1 ? "1 worker process: " : "2 worker processes:";
      console.log(
        `    ${label} ${r.perSecond.toFixed(1)} analyses/s (${BACKLOG_REVISIONS} in ${r.spanS.toFixed(2)} s${r.failed ? `, ${r.failed} failed` : ""})`,
      );
    }
    const { times, failures } = await commitToDone(adminUrl, docs);
    times.sort((a, b) => a - b);
    console.log(
      `  commit to analysis visible as done, ${LATENCY_REVISIONS} revisions committed one at a time to 1 idle worker process,`,
    );
    console.log(`  measured by polling the analyses row every ${LATENCY_POLL_MS} ms:`);
    if (times.length > 0)
      console.log(
        `    median ${quantile(times, 0.5).toFixed(0)} ms, p95 ${quantile(times, 0.95).toFixed(0)} ms, min ${times[0]!.toFixed(0)} ms, max ${times[times.length - 1]!.toFixed(0)} ms, over ${times.length} done`,
      );
    if (failures.length > 0)
      console.log(
        `    ${failures.length} ended failed (left out): ${[...new Set(failures)].join("; ")}`,
      );
  } finally {
    await server?.stop();
    if (tmp) rmSync(tmp, { recursive: true, force: true });
  }
}

await main();
