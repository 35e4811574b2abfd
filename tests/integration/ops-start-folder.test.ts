// Finding 14 (folder half): run as root, the embedded database runs as the `postgres` system
// user; cloned into a folder that user cannot enter (root's home), the first start died with a
// bare "spawn .../initdb EACCES". It now stops at once with one line naming the folder and what
// to change. Only meaningful as root (a normal user runs the server as itself).
import { spawn } from "node:child_process";
import { chmodSync, mkdirSync, mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";
import { findFreePort } from "@teardown/db/embedded-server";

const ROOT = projectRoot();
const isRoot = typeof process.getuid === "function" && process.getuid() === 0;
const tmp = mkdtempSync(path.join(os.tmpdir(), "tl-closed-"));
chmodSync(tmp, 0o755); // mkdtemp makes it 0700; only the folder below is to be closed
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

function runStart(env: NodeJS.ProcessEnv): Promise<{ code: number | null; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(
      process.execPath,
      ["--import", "tsx", path.join(ROOT, "scripts", "start.ts")],
      {
        cwd: ROOT,
        env,
        stdio: ["ignore", "pipe", "pipe"],
      },
    );
    let stderr = "";
    child.stderr.on("data", (c: Buffer) => (stderr += c.toString()));
    child.on("close", (code) => resolve({ code, stderr }));
  });
}

describe("finding 14: a start whose data folder the postgres user cannot enter", () => {
  it.runIf(isRoot)(
    "stops with one line naming the closed folder and what to change",
    async () => {
      const closed = path.join(tmp, "home-of-root");
      mkdirSync(closed);
      chmodSync(closed, 0o700);
      const env: NodeJS.ProcessEnv = {
        ...process.env,
        TEARDOWN_DATA_DIR: path.join(closed, "data"),
        PORT: String(await findFreePort()),
      };
      delete env.DATABASE_URL;
      const res = await runStart(env);
      expect(res.code).toBe(1);
      const lines = res.stderr.trim().split("\n");
      expect(lines).toHaveLength(1);
      expect(lines[0]).toContain(`cannot enter ${closed}`);
      expect(lines[0]).toMatch(/set DATABASE_URL/);
      expect(res.stderr).not.toMatch(/EACCES|\n\s+at /);
    },
    60_000,
  );
});
