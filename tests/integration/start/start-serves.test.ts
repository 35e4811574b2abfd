// `npm start` against a team's Postgres (DATABASE_URL): serves /api/health and the home page,
// stops cleanly on SIGTERM leaving no process behind, and a second start adds no demo data.
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { findFreePort } from "@teardown/db/embedded-server";
import { projectRoot } from "@teardown/db";
import { createEmptyDatabase } from "../../support/test-database.js";

const ROOT = projectRoot();

interface Started {
  child: ChildProcess;
  output: () => string;
  exit: Promise<number | null>;
}

const started: ChildProcess[] = [];

// A failed assertion must not leave an app running: stop whatever a test started.
afterAll(async () => {
  for (const c of started) if (c.exitCode === null && c.signalCode === null) c.kill("SIGTERM");
  await new Promise((r) => setTimeout(r, 3000));
  for (const c of started) if (c.exitCode === null && c.signalCode === null) c.kill("SIGKILL");
});

function start(env: Record<string, string>): Started {
  const child = spawn(
    process.execPath,
    ["--import", "tsx", path.join(ROOT, "scripts", "start.ts")],
    {
      cwd: ROOT,
      env: "PATH" in env ? env : { ...process.env, ...env },
      stdio: ["ignore", "pipe", "pipe"],
    },
  );
  started.push(child);
  let out = "";
  child.stdout!.on("data", (c: Buffer) => (out += c.toString()));
  child.stderr!.on("data", (c: Buffer) => (out += c.toString()));
  const exit = new Promise<number | null>((r) => child.on("close", (code) => r(code)));
  return { child, output: () => out, exit };
}

async function waitFor(cond: () => boolean, ms: number): Promise<void> {
  const end = Date.now() + ms;
  while (!cond()) {
    if (Date.now() > end) throw new Error("timed out");
    await new Promise((r) => setTimeout(r, 200));
  }
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/** The direct children of a process, with their command lines. */
async function childPids(pid: number): Promise<Array<{ pid: number; cmd: string }>> {
  const { execFileSync } = await import("node:child_process");
  const { readFileSync } = await import("node:fs");
  try {
    return execFileSync("pgrep", ["-P", String(pid)], { encoding: "utf8" })
      .trim()
      .split("\n")
      .filter(Boolean)
      .map((p) => ({
        pid: Number(p),
        cmd: readFileSync(`/proc/${p}/cmdline`, "utf8").replace(/\0/g, " "),
      }));
  } catch {
    return [];
  }
}

describe("npm start with DATABASE_URL", () => {
  let target: Awaited<ReturnType<typeof createEmptyDatabase>>;
  beforeAll(async () => {
    target = await createEmptyDatabase();
  });
  afterAll(async () => {
    await target?.drop();
  });

  it("serves health and the home page, stops cleanly, and a second start adds no demo data", async () => {
    const port = await findFreePort();
    const env = { DATABASE_URL: target.url, PORT: String(port) };
    const demoTeams = async () => {
      const c = new pg.Client({ connectionString: target.url });
      await c.connect();
      try {
        return (await c.query("select count(*)::int as n from teams")).rows[0].n as number;
      } finally {
        await c.end();
      }
    };

    const first = start(env);
    await waitFor(
      () => /is running at/.test(first.output()) || first.child.exitCode !== null,
      240_000,
    );
    expect(first.output()).toContain(`http://localhost:${port}`);
    const health = await fetch(`http://localhost:${port}/api/health`);
    expect(health.status).toBe(200);
    const body = (await health.json()) as { status: string; database: { roundTripMs: number } };
    expect(body.status).toBe("ok");
    expect(body.database.roundTripMs).toBeGreaterThan(0);
    const home = await fetch(`http://localhost:${port}/`);
    expect(home.status).toBe(200);
    expect(await home.text()).toContain("Teardown Ledger");
    const teamsAfterFirst = await demoTeams();
    expect(teamsAfterFirst).toBeGreaterThan(0);

    // The web server and worker run in their own process groups; all must be gone after SIGTERM.
    const children = await childPids(first.child.pid!);
    expect(children.length).toBeGreaterThanOrEqual(2);
    first.child.kill("SIGTERM");
    expect(await first.exit).toBe(0);
    expect(first.output()).toContain("[start] stopped");
    await new Promise((r) => setTimeout(r, 500));
    const leftovers = (await import("node:child_process"))
      .execFileSync("ps", ["-eo", "pid,args"], { encoding: "utf8" })
      .split("\n")
      .filter((l) => l.includes(`-p ${port}`) || l.includes(target.name));
    expect(leftovers).toEqual([]);
    expect(alive(first.child.pid!)).toBe(false);

    const second = start(env);
    await waitFor(
      () => /is running at/.test(second.output()) || second.child.exitCode !== null,
      240_000,
    );
    expect(second.output()).toContain("demo data already present");
    expect(second.output()).not.toContain("building the web app");
    expect(await demoTeams()).toBe(teamsAfterFirst);
    second.child.kill("SIGTERM");
    expect(await second.exit).toBe(0);
  }, 300_000);

  // A worker or web server that dies is now restarted, not the end of the start: see
  // tests/integration/ops-start-supervision.test.ts.

  it("stops everything with exit 1 when the embedded database dies while it runs", async () => {
    const { mkdtempSync, chmodSync, rmSync } = await import("node:fs");
    const os = await import("node:os");
    const dataDir = mkdtempSync(path.join(os.tmpdir(), "tl-start-"));
    chmodSync(dataDir, 0o755);
    try {
      const port = await findFreePort();
      const env = { ...process.env, PORT: String(port), TEARDOWN_DATA_DIR: dataDir } as Record<
        string,
        string
      >;
      delete env.DATABASE_URL;
      const run = start(env);
      await waitFor(
        () => /is running at/.test(run.output()) || run.child.exitCode !== null,
        240_000,
      );
      expect(run.output()).toContain("embedded Postgres on port");
      const pidLine = (await import("node:fs"))
        .readFileSync(path.join(dataDir, "postgres", "postmaster.pid"), "utf8")
        .split("\n")[0];
      process.kill(Number(pidLine), "SIGKILL");
      expect(await run.exit).toBe(1);
      expect(run.output()).toMatch(/the embedded Postgres server exited/);
    } finally {
      rmSync(dataDir, { recursive: true, force: true });
    }
  }, 300_000);
});
