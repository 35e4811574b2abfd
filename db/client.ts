/**
 * The one connection factory. `DATABASE_URL` means that server; without it, an embedded real
 * Postgres under `.data/postgres`, started once per process tree: the process that starts it
 * puts its URL into `DATABASE_URL`, so every child process uses the same server.
 */
import path from "node:path";
import { existsSync, readFileSync } from "node:fs";
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import pg from "pg";
import * as schema from "./schema/index.js";
import { startEmbeddedServer, type EmbeddedServer } from "./embedded-server.js";
import {
  DatabaseUnavailableError,
  describeDatabaseUrl,
  explainConnectionFailure,
} from "./errors.js";
import { guardPoolClients } from "./pool-guard.js";

export type Database = NodePgDatabase<typeof schema>;

/** How long a first connection may take before the server counts as unreachable. */
const CONNECT_TIMEOUT_MS = 5_000;
/** The application database created inside an embedded server. */
const EMBEDDED_DATABASE = "teardown";

export interface DatabaseHandle {
  db: Database;
  pool: pg.Pool;
  url: string;
  /** Set when this process started an embedded server (and so must stop it). */
  embedded: EmbeddedServer | null;
  close(): Promise<void>;
}

/** The project's root folder (the one whose package.json is named teardown-ledger). */
export function projectRoot(from: string = process.cwd()): string {
  let dir = path.resolve(from);
  for (;;) {
    const pj = path.join(dir, "package.json");
    if (existsSync(pj) && JSON.parse(readFileSync(pj, "utf8")).name === "teardown-ledger")
      return dir;
    const up = path.dirname(dir);
    if (up === dir) return path.resolve(from);
    dir = up;
  }
}

/** Where local state lives: `TEARDOWN_DATA_DIR`, else `.data` under the project root. */
export function dataDir(): string {
  return process.env.TEARDOWN_DATA_DIR
    ? path.resolve(process.env.TEARDOWN_DATA_DIR)
    : path.join(projectRoot(), ".data");
}

/**
 * A pool for a URL. The only place a pool is made. `onConnectionLost` hears of connections that
 * died while checked out (the query then fails and can be retried; the process lives on).
 */
export function createPool(
  url: string,
  max = 10,
  onConnectionLost: (err: Error) => void = () => {},
): pg.Pool {
  try {
    new URL(url);
  } catch {
    throw new DatabaseUnavailableError(
      describeDatabaseUrl(url),
      "DATABASE_URL is not a valid postgres:// URL",
    );
  }
  const pool = new pg.Pool({
    connectionString: url,
    max,
    connectionTimeoutMillis: CONNECT_TIMEOUT_MS,
  });
  // An idle client's error (server restarted) must not crash the process; the next query retries.
  pool.on("error", () => {});
  guardPoolClients(pool, onConnectionLost);
  return pool;
}

/** Runs `select 1` and returns the round trip in ms, or throws DatabaseUnavailableError. */
export async function ping(pool: pg.Pool, url: string): Promise<number> {
  const t0 = performance.now();
  try {
    await pool.query("select 1");
  } catch (err) {
    throw new DatabaseUnavailableError(describeDatabaseUrl(url), explainConnectionFailure(err), {
      cause: err,
    });
  }
  return performance.now() - t0;
}

/** Starts the embedded server (or finds it running) and makes sure the app database exists. */
export async function startEmbeddedDatabase(
  opts: { onLog?: (line: string) => void } = {},
): Promise<{ url: string; server: EmbeddedServer }> {
  const server = await startEmbeddedServer({
    dataDir: path.join(dataDir(), "postgres"),
    onLog: opts.onLog,
  });
  const admin = new pg.Client({ connectionString: server.adminUrl });
  await admin.connect();
  try {
    const found = await admin.query("select 1 from pg_database where datname = $1", [
      EMBEDDED_DATABASE,
    ]);
    if (found.rowCount === 0) await admin.query(`create database ${EMBEDDED_DATABASE}`);
  } finally {
    await admin.end();
  }
  return { url: server.adminUrl.replace(/\/postgres$/, `/${EMBEDDED_DATABASE}`), server };
}

/**
 * Opens the database: `DATABASE_URL` when set, else the embedded server (whose URL is then
 * exported to `DATABASE_URL` for child processes). Fails with one clear DatabaseUnavailableError.
 */
export async function openDatabase(
  opts: {
    url?: string;
    poolSize?: number;
    onLog?: (line: string) => void;
    onConnectionLost?: (err: Error) => void;
  } = {},
): Promise<DatabaseHandle> {
  let url = opts.url ?? process.env.DATABASE_URL ?? "";
  let embedded: EmbeddedServer | null = null;
  if (!url) {
    const started = await startEmbeddedDatabase({ onLog: opts.onLog });
    url = started.url;
    embedded = started.server.owned ? started.server : null;
    process.env.DATABASE_URL = url;
  }
  const pool = createPool(url, opts.poolSize, opts.onConnectionLost);
  try {
    await ping(pool, url);
  } catch (err) {
    await pool.end().catch(() => {});
    await embedded?.stop();
    throw err;
  }
  const db = drizzle(pool, { schema });
  return {
    db,
    pool,
    url,
    embedded,
    async close() {
      await pool.end().catch(() => {});
      await embedded?.stop();
    },
  };
}
