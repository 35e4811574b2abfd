// Issue 17, load bench finding: during a Postgres restart, entry pages answered 500 in the window
// after the proxy's database ping passed and before the page's own queries finished. Here the
// built server runs against the test database; a table lock holds a page's (or the API's) query,
// the ping passes meanwhile (it touches no table), and the test then terminates the held
// connection, which is exactly what a restart does to it (SQLSTATE 57P01). The answer must be 503
// with Retry-After and the outage message, never 500.
import { spawn, type ChildProcess } from "node:child_process";
import { chmodSync, mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";
import { findFreePort } from "@teardown/db/embedded-server";
import { OUTAGE_MESSAGE } from "@/lib/outage-page";
import { buildWebIfStale } from "../../scripts/start/build-web.js";
import { createTestDatabase, type TestDatabase } from "../support/test-database.js";

let database: TestDatabase;
let web: ChildProcess | null = null;
let base = "";
let dataDir = "";
let output = "";
let cookie = "";

beforeAll(async () => {
  database = await createTestDatabase();
  const root = projectRoot();
  await buildWebIfStale(root, () => {});
  dataDir = mkdtempSync(path.join(os.tmpdir(), "tl-db-lost-"));
  chmodSync(dataDir, 0o755);
  const port = await findFreePort();
  const nextBin = path.join(root, "node_modules", "next", "dist", "bin", "next");
  web = spawn(process.execPath, [nextBin, "start", "web", "-p", String(port)], {
    cwd: root,
    env: {
      ...process.env,
      DATABASE_URL: database.url,
      PORT: String(port),
      NODE_ENV: "production",
      NEXT_TELEMETRY_DISABLED: "1",
      TEARDOWN_DATA_DIR: dataDir,
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  web.stdout!.on("data", (c: Buffer) => (output += c.toString()));
  web.stderr!.on("data", (c: Buffer) => (output += c.toString()));
  base = `http://localhost:${port}`;
  const deadline = Date.now() + 60_000;
  for (;;) {
    const res = await fetch(`${base}/api/health`).catch(() => null);
    if (res?.status === 200) break;
    if (web.exitCode !== null || Date.now() > deadline)
      throw new Error(`the web server did not start:\n${output.slice(-2000)}`);
    await new Promise((r) => setTimeout(r, 250));
  }
  const json = { origin: base, "content-type": "application/json" };
  const who = { email: "held@lab.test", password: "correct horse battery" };
  const up = await fetch(`${base}/api/auth/sign-up/email`, {
    method: "POST",
    headers: json,
    body: JSON.stringify({ name: "Held Reader", ...who }),
  });
  expect(up.status).toBe(200);
  const signIn = await fetch(`${base}/api/auth/sign-in/email`, {
    method: "POST",
    headers: json,
    body: JSON.stringify(who),
  });
  expect(signIn.status).toBe(200);
  cookie = signIn.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}, 600_000);

afterAll(async () => {
  if (web && web.exitCode === null) {
    const exited = new Promise((r) => web!.once("close", r));
    web.kill("SIGTERM");
    await exited;
  }
  await database?.drop();
  if (dataDir) rmSync(dataDir, { recursive: true, force: true });
});

/**
 * Sends the request while `table` is locked, waits until the server's query for it is held by
 * the lock, terminates that connection, and returns the answer.
 */
async function answerWithConnectionKilled(table: string, p: string, headers: HeadersInit = {}) {
  const holder = new pg.Client({ connectionString: database.url });
  // A second client looks for the held query: inside the holder's transaction pg_stat_activity
  // would show one snapshot taken before the request arrived.
  const killer = new pg.Client({ connectionString: database.url });
  await holder.connect();
  await killer.connect();
  try {
    await holder.query("begin");
    await holder.query(`lock table ${table} in access exclusive mode`);
    const pending = fetch(`${base}${p}`, {
      headers,
      redirect: "manual",
      signal: AbortSignal.timeout(30_000),
    }).then(async (res) => ({ status: res.status, headers: res.headers, text: await res.text() }));
    let killed = 0;
    const deadline = Date.now() + 15_000;
    while (killed === 0 && Date.now() < deadline) {
      const r = await killer.query(
        `select pg_terminate_backend(pid) from pg_stat_activity
          where datname = current_database() and wait_event_type = 'Lock'`,
      );
      killed = r.rowCount ?? 0;
      if (killed === 0) await new Promise((r) => setTimeout(r, 20));
    }
    expect(killed, "a server query was held by the lock and terminated").toBeGreaterThan(0);
    return await pending;
  } finally {
    await holder.query("rollback").catch(() => {});
    await holder.end();
    await killer.end();
  }
}

function expectOutagePage(page: { status: number; headers: Headers; text: string }, what: string) {
  expect(page.status, what).toBe(503);
  expect(Number(page.headers.get("retry-after")), what).toBeGreaterThan(0);
  expect(page.headers.get("content-type"), what).toMatch(/^text\/html/);
  expect(page.text, what).toContain(OUTAGE_MESSAGE);
  // The outage page keeps the page's policy: its one inline style carries that answer's nonce.
  const nonce = /'nonce-([^']+)'/.exec(page.headers.get("content-security-policy") ?? "")?.[1];
  expect(nonce, what).toBeTruthy();
  expect(page.text, what).toContain(`<style nonce="${nonce}">`);
}

const SOME_ENTRY = "/entries/00000000-0000-4000-8000-000000000000";

describe("a page whose database connection is killed mid-request", () => {
  it("answers the entry page with 503 and the message, for a visitor", async () => {
    expectOutagePage(await answerWithConnectionKilled("entries", SOME_ENTRY), "entry page");
  });

  it("answers the home page with 503 and the message", async () => {
    expectOutagePage(await answerWithConnectionKilled("entries", "/"), "home page");
  });

  it("answers a signed-in page with 503 when the session lookup loses its connection", async () => {
    const page = await answerWithConnectionKilled("sessions", SOME_ENTRY, { cookie });
    expectOutagePage(page, "signed-in entry page");
  });

  it("answers the API with a 503 JSON error and Retry-After", async () => {
    const api = await answerWithConnectionKilled("entries", `/api${SOME_ENTRY}`);
    expect(api.status).toBe(503);
    expect(Number(api.headers.get("retry-after"))).toBeGreaterThan(0);
    expect(JSON.parse(api.text).error.code).toBe("database-unavailable");
  });

  it("serves the same pages normally once the connection is back, and a real 404 stays 404", async () => {
    const home = await fetch(`${base}/`, { headers: { cookie } });
    expect(home.status).toBe(200);
    expect(await home.text()).toContain("Held Reader");
    const missing = await fetch(`${base}/api${SOME_ENTRY}`);
    expect(missing.status).toBe(404);
    expect(output).not.toMatch(/unhandled|uncaught/i);
  });
});
