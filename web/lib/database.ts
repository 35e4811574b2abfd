/**
 * The web process's database handle, opened once per process. The start script (or the
 * deployment) always sets DATABASE_URL; the web app never starts a server of its own.
 */
import { createPool, ping, schema, type Database } from "@teardown/db";
import { drizzle } from "drizzle-orm/node-postgres";
import type pg from "pg";

interface WebDatabase {
  db: Database;
  pool: pg.Pool;
  url: string;
}

const globalForDb = globalThis as unknown as { teardownDb?: WebDatabase };

/** The shared handle; throws a clear error when DATABASE_URL is missing. */
export function database(): WebDatabase {
  if (globalForDb.teardownDb) return globalForDb.teardownDb;
  const url = process.env.DATABASE_URL;
  if (!url)
    throw new Error(
      "DATABASE_URL is not set: start the app with `npm start`, or set it to a Postgres URL",
    );
  const pool = createPool(url, Number(process.env.WEB_POOL_SIZE ?? 10));
  globalForDb.teardownDb = { db: drizzle(pool, { schema }), pool, url };
  return globalForDb.teardownDb;
}

/** Round trip to the database in ms (throws DatabaseUnavailableError). */
export async function databaseRoundTripMs(): Promise<number> {
  const { pool, url } = database();
  return ping(pool, url);
}

/** Closes the shared pool (tests and shutdown); the next `database()` opens a new one. */
export async function closeDatabase(): Promise<void> {
  const handle = globalForDb.teardownDb;
  globalForDb.teardownDb = undefined;
  await handle?.pool.end().catch(() => {});
}
