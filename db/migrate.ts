/**
 * Applies the committed migrations. Several processes may start at once (web replicas, workers),
 * so the run holds an advisory lock; the migrator skips what is already applied.
 */
import path from "node:path";
import { fileURLToPath } from "node:url";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";
import {
  DatabaseUnavailableError,
  describeDatabaseUrl,
  explainConnectionFailure,
} from "./errors.js";

/** An arbitrary constant naming our migration lock among the server's advisory locks. */
const MIGRATION_LOCK_KEY = 72_450_019;

/** The migrations folder: next to this file, or MIGRATIONS_DIR when bundled elsewhere. */
export function migrationsFolder(): string {
  return (
    process.env.MIGRATIONS_DIR ??
    path.join(path.dirname(fileURLToPath(import.meta.url)), "migrations")
  );
}

/** Applies every pending migration to the database at `url`. */
export async function applyMigrations(url: string): Promise<void> {
  const client = new pg.Client({ connectionString: url });
  try {
    await client.connect();
  } catch (err) {
    throw new DatabaseUnavailableError(describeDatabaseUrl(url), explainConnectionFailure(err), {
      cause: err,
    });
  }
  try {
    await client.query("select pg_advisory_lock($1)", [MIGRATION_LOCK_KEY]);
    // drizzle prints a NOTICE-level chatter for "schema already exists"; keep it quiet
    client.on("notice", () => {});
    await migrate(drizzle(client), { migrationsFolder: migrationsFolder() });
  } finally {
    await client.query("select pg_advisory_unlock($1)", [MIGRATION_LOCK_KEY]).catch(() => {});
    await client.end();
  }
}
