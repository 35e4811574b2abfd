/**
 * Buffers a search touches: each statement the search sends, run again under EXPLAIN (ANALYZE,
 * BUFFERS), its shared blocks (hit and read) summed. Unlike a timing, this does not move with the
 * load other processes put on the machine, so runs on a busy and a quiet machine compare.
 * Statements run inside one transaction with the search's own planner settings, then rolled back.
 */
import pg from "pg";
import { drizzle } from "drizzle-orm/node-postgres";
import { schema, type Database } from "@teardown/db";

/** Runs `search` on a database whose statements are recorded, then sums their buffers. */
export async function buffersOf(
  pool: pg.Pool,
  search: (db: Database) => Promise<unknown>,
): Promise<number> {
  const sent: Array<{ sql: string; params: unknown[] }> = [];
  const recording = drizzle(pool, {
    schema,
    logger: { logQuery: (sql, params) => sent.push({ sql, params }) },
  }) as unknown as Database;
  await search(recording);
  const client = await pool.connect();
  let total = 0;
  try {
    await client.query("begin");
    for (const s of sent) {
      const text = s.sql.trim();
      if (/^(begin|commit|rollback)\b/i.test(text)) continue;
      // The search's own settings (set_config) are run as they are, so the plans are the same.
      if (/^select set_config\(/i.test(text)) {
        await client.query(text, s.params);
        continue;
      }
      const r = await client.query<{ "QUERY PLAN": Array<{ Plan: Record<string, number> }> }>(
        `explain (analyze, buffers, format json) ${text}`,
        s.params,
      );
      const plan = r.rows[0]!["QUERY PLAN"][0]!.Plan;
      total += (plan["Shared Hit Blocks"] ?? 0) + (plan["Shared Read Blocks"] ?? 0);
    }
  } finally {
    await client.query("rollback").catch(() => {});
    client.release();
  }
  return total;
}
