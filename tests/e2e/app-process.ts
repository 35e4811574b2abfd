/**
 * Runs the whole app for a browser test the way a user does (`scripts/start.ts`): its own
 * database, data folder and port; waits for "is running at"; stops it with SIGTERM.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { chmodSync, mkdtempSync, readFileSync, rmSync, statSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { findFreePort } from "@teardown/db/embedded-server";
import { projectRoot } from "@teardown/db";
import { createEmptyDatabase } from "../support/test-database.js";

/** Start may run `next build` first (and wait for another build's lock), so allow for it. */
const START_TIMEOUT_MS = 300_000;

/** A running app and how to stop it. */
export interface RunningApp {
  url: string;
  output(): string;
  /** Whether web/.next was rebuilt by another process after this app started serving it. */
  buildReplaced(): boolean;
  stop(): Promise<void>;
}

/** What identifies the build being served: its id and when its manifest was written. */
function buildId(root: string): string {
  const dist = path.join(root, "web", ".next");
  try {
    // A `next build` empties the folder first, so a failed one leaves the id but not the manifest.
    return `${readFileSync(path.join(dist, "BUILD_ID"), "utf8")}@${statSync(path.join(dist, "build-manifest.json")).mtimeMs}`;
  } catch {
    return "(none)";
  }
}

/** Starts the app on a fresh database and a free port; resolves once it serves. */
export async function startApp(): Promise<RunningApp> {
  const database = await createEmptyDatabase();
  const dataDir = mkdtempSync(path.join(os.tmpdir(), "tl-e2e-"));
  chmodSync(dataDir, 0o755);
  const port = await findFreePort();
  const root = projectRoot();
  const child: ChildProcess = spawn(
    process.execPath,
    ["--import", "tsx", path.join(root, "scripts", "start.ts")],
    {
      cwd: root,
      env: {
        ...process.env,
        DATABASE_URL: database.url,
        PORT: String(port),
        TEARDOWN_DATA_DIR: dataDir,
      },
      stdio: ["ignore", "pipe", "pipe"],
    },
  );
  let out = "";
  child.stdout!.on("data", (c: Buffer) => (out += c.toString()));
  child.stderr!.on("data", (c: Buffer) => (out += c.toString()));
  const exited = new Promise<number | null>((r) => child.on("close", (code) => r(code)));
  let stopped = false;
  const stop = async () => {
    if (stopped) return;
    stopped = true;
    if (child.exitCode === null && child.signalCode === null) child.kill("SIGTERM");
    await exited;
    await database.drop().catch(() => {});
    rmSync(dataDir, { recursive: true, force: true });
  };
  const deadline = Date.now() + START_TIMEOUT_MS;
  while (!/is running at/.test(out)) {
    if (child.exitCode !== null || Date.now() > deadline) {
      await stop();
      throw new Error(`the app did not start:\n${out.split("\n").slice(-40).join("\n")}`);
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  const servedBuild = buildId(root);
  return {
    url: `http://localhost:${port}`,
    output: () => out,
    buildReplaced: () => buildId(root) !== servedBuild,
    stop,
  };
}
