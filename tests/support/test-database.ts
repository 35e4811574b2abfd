/**
 * A fresh database per test file, created from the committed migrations on the run's server
 * and dropped afterwards: `const t = await createTestDatabase()` in beforeAll, `t.drop()` in afterAll.
 */
import { randomBytes } from "node:crypto";
import pg from "pg";
import { inject } from "vitest";
import { applyMigrations, createPool, type Database } from "@teardown/db";
import { drizzle } from "drizzle-orm/node-postgres";
import * as schema from "@teardown/db/schema";

export interface TestDatabase {
  name: string;
  url: string;
  pool: pg.Pool;
  db: Database;
  drop(): Promise<void>;
}

/** The admin URL of the server chosen for this run, with another database name. */
export function urlForDatabase(name: string): string {
  const u = new URL(inject("testServerAdminUrl"));
  u.pathname = `/${name}`;
  return u.toString();
}

async function admin<T>(fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: inject("testServerAdminUrl") });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

/** Creates an empty database (no migrations) and returns its name and URL. */
export async function createEmptyDatabase(): Promise<{
  name: string;
  url: string;
  drop(): Promise<void>;
}> {
  const name = `tl_test_${randomBytes(6).toString("hex")}`;
  await admin((c) => c.query(`create database ${name}`));
  return {
    name,
    url: urlForDatabase(name),
    drop: () =>
      admin((c) => c.query(`drop database if exists ${name} with (force)`)).then(() => undefined),
  };
}

/** Creates a database, applies every migration, and opens a pool on it. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const empty = await createEmptyDatabase();
  await applyMigrations(empty.url);
  const pool = createPool(empty.url, 5);
  return {
    ...empty,
    pool,
    db: drizzle(pool, { schema }),
    async drop() {
      await pool.end().catch(() => {});
      await empty.drop();
    },
  };
}
