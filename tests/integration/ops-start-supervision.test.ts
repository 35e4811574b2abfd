// Findings 14 and 15 (start half): SIGTERM sent to the `npm start` process (as a process manager
// or container runtime does) left the database, worker and web server running, because npm's
// shell did not pass it on; and a killed worker or web server stopped the whole start. Now the
// start is the process npm signals, restarts a crashed child with the reason logged, and stops
// everything on SIGTERM.
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";
import { findFreePort } from "@teardown/db/embedded-server";
import { createEmptyDatabase } from "../support/test-database.js";

const ROOT = projectRoot();
let target: Awaited<ReturnType<typeof createEmptyDatabase>>;
let npm: ChildProcess | null = null;
let out = "";

beforeAll(async () => {
  target = await createEmptyDatabase();
});
afterAll(async () => {
  if (npm && npm.exitCode === null) npm.kill("SIGKILL");
  await target?.drop();
});

async function waitFor(
  what: string,
  cond: () => boolean | Promise<boolean>,
  ms: number,
): Promise<void> {
  const end = Date.now() + ms;
  while (!(await cond())) {
    if (Date.now() > end)
      throw new Error(`${what}: not within ${ms} ms; output:\n${out.slice(-3000)}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

function children(pid: number): Array<{ pid: number; cmd: string }> {
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

const healthy = (port: number) =>
  fetch(`http://127.0.0.1:${port}/api/health`, { signal: AbortSignal.timeout(3000) }).then(
    (r) => r.status === 200,
    () => false,
  );

describe("npm start as a service", () => {
  it("restarts a killed worker and web server with the reason, and stops everything on SIGTERM to npm", async () => {
    const port = await findFreePort();
    npm = spawn("npm", ["start"], {
      cwd: ROOT,
      env: { ...process.env, DATABASE_URL: target.url, PORT: String(port) },
      stdio: ["ignore", "pipe", "pipe"],
    });
    npm.stdout!.on("data", (c: Buffer) => (out += c.toString()));
    npm.stderr!.on("data", (c: Buffer) => (out += c.toString()));
    await waitFor("the app running", () => /is running at/.test(out), 300_000);
    // npm runs the start itself (exec), so the signal npm passes on reaches it.
    const start = children(npm.pid!).find((c) => c.cmd.includes("scripts/start.ts"));
    expect(start).toBeDefined();
    const childOf = (name: string) => children(start!.pid).find((c) => c.cmd.includes(name));

    const worker = childOf("analysis-worker/src/main.ts")!;
    process.kill(worker.pid, "SIGKILL");
    await waitFor(
      "the worker restarted",
      () => {
        const now = childOf("analysis-worker/src/main.ts");
        return now !== undefined && now.pid !== worker.pid;
      },
      30_000,
    );
    expect(out).toMatch(
      /the worker process exited \(code null, signal SIGKILL\); restarting it in 1 s \(restart 1 of at most 5/,
    );
    expect(await healthy(port)).toBe(true);

    // Next renames its process title to "next-server (vX)".
    const web = childOf("next-server")!;
    process.kill(web.pid, "SIGKILL");
    await waitFor(
      "the web server restarted and healthy",
      async () => {
        const now = childOf("next-server");
        return now !== undefined && now.pid !== web.pid && (await healthy(port));
      },
      120_000,
    );
    expect(out).toMatch(/the web process exited \(code null, signal SIGKILL\); restarting it/);

    const all = [start!.pid, ...children(start!.pid).map((c) => c.pid)];
    npm.kill("SIGTERM");
    await new Promise((r) => npm!.once("exit", r));
    await waitFor(
      "every process gone",
      () =>
        all.every((pid) => {
          try {
            process.kill(pid, 0);
            return false;
          } catch {
            return true;
          }
        }),
      30_000,
    );
    expect(out).toContain("[start] stopped");
    expect(await healthy(port)).toBe(false);
  }, 480_000);
});
