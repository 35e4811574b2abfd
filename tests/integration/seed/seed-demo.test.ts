// The demo seed loads the invented scenario once (a second load adds nothing), queues an
// analysis for every demo revision, and is deterministic: two databases get identical records.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import type { PgBoss } from "pg-boss";
import { createQueue, startQueue } from "@teardown/db";
import { loadDemoData, demoRecordDocs } from "@teardown/seed-demo";
import { createTestDatabase, type TestDatabase } from "../../support/test-database.js";

let a: TestDatabase;
let b: TestDatabase;
const bosses: PgBoss[] = [];

async function bossFor(url: string): Promise<PgBoss> {
  const boss = createQueue(url, { supervise: false });
  await startQueue(boss);
  bosses.push(boss);
  return boss;
}

beforeAll(async () => {
  [a, b] = await Promise.all([createTestDatabase(), createTestDatabase()]);
});
afterAll(async () => {
  for (const boss of bosses) await boss.stop({ close: true });
  await Promise.all([a?.drop(), b?.drop()]);
});

describe("the demo seed", () => {
  it("loads every demo record once and adds nothing on a second load", async () => {
    const boss = await bossFor(a.url);
    const first = await loadDemoData(a.db, boss);
    expect(first).toEqual({ loaded: true, entries: demoRecordDocs().length });
    const second = await loadDemoData(a.db, boss);
    expect(second).toEqual({ loaded: false, entries: 0 });
    const counts = await a.db.execute<{
      teams: number;
      entries: number;
      revisions: number;
      queued: number;
      jobs: number;
    }>(sql`
      select (select count(*)::int from teams) as teams, (select count(*)::int from entries) as entries,
             (select count(*)::int from revisions) as revisions,
             (select count(*)::int from analyses where state = 'queued') as queued,
             (select count(*)::int from pgboss.job where name = 'analyze-revision') as jobs`);
    expect(counts.rows[0]).toEqual({ teams: 1, entries: 6, revisions: 6, queued: 6, jobs: 6 });
  });

  it("gives two databases the same records, hash for hash", async () => {
    await loadDemoData(b.db, await bossFor(b.url));
    const hashes = async (t: TestDatabase) =>
      (
        await t.db.execute<{ record_hash: string }>(
          sql`select record_hash from revisions order by record_hash`,
        )
      ).rows.map((r) => r.record_hash);
    expect(await hashes(b)).toEqual(await hashes(a));
  });
});
