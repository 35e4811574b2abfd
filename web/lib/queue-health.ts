/** Queue depth and recent job durations for /api/health; empty until the queue exists. */
import { database } from "./database";

export interface QueueHealth {
  /** Analyses waiting or running. */
  depth: number;
  /** Median and slowest duration of the last 50 finished analyses, in ms. */
  recentMedianMs: number | null;
  recentMaxMs: number | null;
}

export async function queueHealth(): Promise<QueueHealth> {
  const { pool } = database();
  const depth = await pool.query<{ n: string }>(
    `select count(*) as n from analyses where state in ('queued', 'running')`,
  );
  const recent = await pool.query<{ ms: number }>(
    `select extract(epoch from (finished_at - started_at)) * 1000 as ms from analyses
      where state in ('done', 'failed') and started_at is not null and finished_at is not null
      order by finished_at desc limit 50`,
  );
  const ms = recent.rows.map((r) => Number(r.ms)).sort((a, b) => a - b);
  return {
    depth: Number(depth.rows[0]?.n ?? 0),
    recentMedianMs: ms.length ? Number(ms[Math.floor(ms.length / 2)]!.toFixed(1)) : null,
    recentMaxMs: ms.length ? Number(ms[ms.length - 1]!.toFixed(1)) : null,
  };
}
