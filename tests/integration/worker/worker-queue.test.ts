// The analysis worker on the Postgres queue: every revision analysed exactly once in effect,
// engine rejections and overruns stored as failures with their reason, duplicates absorbed.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { ANALYSIS_QUEUE, createQueue, enqueueAnalysis, schema, startQueue } from "@teardown/db";
import { ENGINE_VERSION } from "@teardown/engine";
import type { PgBoss } from "pg-boss";
import { createTestDatabase, type TestDatabase } from "../../support/test-database.js";
import { startWorkerProcess, type WorkerProcess } from "../../support/worker-process.js";
import { brokenDoc, ladderDoc, nightLightDoc } from "../../support/record-docs.js";
import { makeEntry, makeTeam } from "../../support/entry-fixtures.js";

let t: TestDatabase;
let boss: PgBoss;
const workers: WorkerProcess[] = [];

beforeAll(async () => {
  t = await createTestDatabase();
  boss = createQueue(t.url, { supervise: false });
  await startQueue(boss);
});
afterAll(async () => {
  for (const w of workers) if (w.child.exitCode === null) w.child.kill("SIGKILL");
  await boss?.stop({ close: true });
  await t?.drop();
});

async function analysesByState(): Promise<Record<string, number>> {
  const rows = await t.db.execute<{ state: string; n: number }>(
    sql`select state, count(*)::int as n from analyses group by state`,
  );
  return Object.fromEntries(rows.rows.map((r) => [r.state, r.n]));
}

async function waitUntil(cond: () => Promise<boolean>, ms: number): Promise<void> {
  const end = Date.now() + ms;
  while (!(await cond())) {
    if (Date.now() > end)
      throw new Error(
        `condition not met within ${ms} ms: ${JSON.stringify(await analysesByState())}`,
      );
    await new Promise((r) => setTimeout(r, 250));
  }
}

describe("the analysis worker", () => {
  it("turns 200 enqueued revisions into exactly 200 analyses, each once, across two processes", async () => {
    const team = await makeTeam(t.db);
    for (let i = 0; i < 200; i++)
      await makeEntry(t.db, boss, team, nightLightDoc(i), ENGINE_VERSION);
    workers.push(
      startWorkerProcess(t.url, { WORKER_CONCURRENCY: "2" }),
      startWorkerProcess(t.url, { WORKER_CONCURRENCY: "2" }),
    );
    await waitUntil(async () => ((await analysesByState()).done ?? 0) === 200, 240_000);
    expect(await analysesByState()).toEqual({ done: 200 });
    const finishedDone = workers
      .flatMap((w) => w.logs)
      .filter((l) => l.msg === "analysis job finished" && l.outcome === "done");
    expect(finishedDone).toHaveLength(200);
    expect(new Set(finishedDone.map((l) => l.revisionId)).size).toBe(200);
    // The entries' search columns came from their analyses.
    const withBlocks = await t.db.execute<{ n: number }>(
      sql`select count(*)::int as n from entries where 'bridge-rectifier' = any(search_blocks) and cardinality(fingerprint) > 10`,
    );
    expect(withBlocks.rows[0]!.n).toBe(200);
  }, 300_000);

  it("gives one analysis row when the same revision is enqueued twice", async () => {
    const team = await makeTeam(t.db);
    const { revisionId } = await makeEntry(t.db, boss, team, nightLightDoc(7), ENGINE_VERSION);
    const again = await t.db.transaction((tx) =>
      enqueueAnalysis(tx, boss, { revisionId, engineVersion: ENGINE_VERSION }),
    );
    expect(again).toBe(false);
    // A duplicate job sent behind the guard's back is absorbed by the idempotent upsert too.
    await boss.send(ANALYSIS_QUEUE, { revisionId, engineVersion: ENGINE_VERSION });
    await waitUntil(async () => {
      const jobs = await t.db.execute<{ n: number }>(
        sql`select count(*)::int as n from pgboss.job where name = ${ANALYSIS_QUEUE} and data->>'revisionId' = ${revisionId} and state = 'completed'`,
      );
      return jobs.rows[0]!.n === 2;
    }, 60_000);
    const rows = await t.db
      .select()
      .from(schema.analyses)
      .where(sql`${schema.analyses.revisionId} = ${revisionId}`);
    expect(rows).toHaveLength(1);
    expect(rows[0]!.state).toBe("done");
  }, 90_000);

  it("fails a record the engine rejects with the engine's reason, and finishes the others", async () => {
    const team = await makeTeam(t.db);
    const bad = await makeEntry(t.db, boss, team, brokenDoc(), ENGINE_VERSION);
    const good = await makeEntry(t.db, boss, team, nightLightDoc(3), ENGINE_VERSION);
    await waitUntil(async () => {
      const rows = await t.db.execute<{ state: string }>(
        sql`select state from analyses where revision_id in (${bad.revisionId}, ${good.revisionId}) and state in ('done', 'failed')`,
      );
      return rows.rows.length === 2;
    }, 60_000);
    const [failed] = await t.db
      .select()
      .from(schema.analyses)
      .where(sql`${schema.analyses.revisionId} = ${bad.revisionId}`);
    expect(failed!.state).toBe("failed");
    expect(failed!.errorStage).toBe("validate");
    expect(failed!.error).toMatch(/parts\[1\]/);
    const [ok] = await t.db
      .select()
      .from(schema.analyses)
      .where(sql`${schema.analyses.revisionId} = ${good.revisionId}`);
    expect(ok!.state).toBe("done");
  }, 90_000);
});

describe("a worker with a short time budget", () => {
  it("stops and fails an overrunning analysis with that reason without blocking the others", async () => {
    for (const w of workers.splice(0)) {
      w.child.kill("SIGTERM");
      await w.exited;
    }
    const team = await makeTeam(t.db);
    const slow = await makeEntry(t.db, boss, team, ladderDoc(150), ENGINE_VERSION);
    const quick: Array<{ revisionId: string }> = [];
    for (let i = 0; i < 4; i++)
      quick.push(await makeEntry(t.db, boss, team, nightLightDoc(100 + i), ENGINE_VERSION));
    const w = startWorkerProcess(t.url, { WORKER_CONCURRENCY: "2", ANALYSIS_BUDGET_MS: "2500" });
    workers.push(w);
    await waitUntil(async () => {
      const ids = [slow.revisionId, ...quick.map((q) => q.revisionId)];
      const rows = await t.db.execute<{ n: number }>(
        sql`select count(*)::int as n from analyses where revision_id in (${sql.join(
          ids.map((id) => sql`${id}`),
          sql`, `,
        )}) and state in ('done', 'failed')`,
      );
      return rows.rows[0]!.n === 5;
    }, 90_000);
    const [s] = await t.db
      .select()
      .from(schema.analyses)
      .where(sql`${schema.analyses.revisionId} = ${slow.revisionId}`);
    expect(s!.state).toBe("failed");
    expect(s!.errorStage).toBe("timeout");
    expect(s!.error).toContain("time budget of 2500 ms");
    for (const q of quick) {
      const [r] = await t.db
        .select()
        .from(schema.analyses)
        .where(sql`${schema.analyses.revisionId} = ${q.revisionId}`);
      expect(r!.state).toBe("done");
    }
  }, 120_000);
});
