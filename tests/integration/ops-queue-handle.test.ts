// Finding 13: the web process's queue handle had no "error" listener, so a database restart
// (every backend ended with 57P01) threw an uncaught error out of pg-boss's pool and could end
// the web process. The handle must hear the error, live on, and serve the next call.
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestDatabase, type TestDatabase } from "./../support/test-database.js";

let t: TestDatabase;
const uncaught: string[] = [];
const onUncaught = (err: unknown) =>
  uncaught.push(err instanceof Error ? err.message : String(err));

beforeAll(async () => {
  t = await createTestDatabase();
  process.env.DATABASE_URL = t.url;
  process.on("uncaughtException", onUncaught);
});
afterAll(async () => {
  process.off("uncaughtException", onUncaught);
  const { closeQueue } = await import("@/lib/queue");
  const { closeDatabase } = await import("@/lib/database");
  await closeQueue();
  await closeDatabase();
  await t?.drop();
});

/** Ends every other connection to the test database, as a server restart does (57P01). */
async function terminateBackends(url: string): Promise<number> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    const r = await c.query<{ n: number }>(
      `select count(pg_terminate_backend(pid))::int as n from pg_stat_activity
        where datname = current_database() and pid <> pg_backend_pid()`,
    );
    return r.rows[0]!.n;
  } finally {
    await c.end();
  }
}

describe("finding 13: the web's queue handle during a database restart", () => {
  it("raises no uncaught error when its connections are ended, and works again afterwards", async () => {
    const { analysisQueue } = await import("@/lib/queue");
    const boss = await analysisQueue();
    // Open a few idle connections in pg-boss's pool, so the termination hits idle clients.
    await Promise.all([1, 2, 3].map(() => boss.getQueues()));
    expect(await terminateBackends(t.url)).toBeGreaterThan(0);
    // pg reports an ended idle client on the next tick or two.
    await new Promise((r) => setTimeout(r, 500));
    expect(uncaught).toEqual([]);
    // The same handle reconnects for the next request.
    const queues = await (await analysisQueue()).getQueues();
    expect(queues.map((q) => q.name)).toContain("analyze-revision");
    expect(uncaught).toEqual([]);
  });
});
