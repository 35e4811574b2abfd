/**
 * Builds the web app when its inputs changed since the last build, so a second start is fast.
 * The inputs' hash is kept beside the build output.
 */
import { createHash } from "node:crypto";
import { spawn } from "node:child_process";
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";

/** Folders whose source goes into the web build. */
const BUILD_INPUTS = ["web", "db", "analysis-worker/engine/src", "package-lock.json"];
const SKIPPED = new Set(["node_modules", ".next", ".data"]);

function hashTree(root: string, rel: string, hash: ReturnType<typeof createHash>): void {
  const p = path.join(root, rel);
  if (!existsSync(p)) return;
  const st = statSync(p);
  if (st.isDirectory()) {
    for (const name of readdirSync(p).sort()) if (!SKIPPED.has(name)) hashTree(root, path.join(rel, name), hash);
  } else {
    hash.update(rel).update("\0").update(readFileSync(p)).update("\0");
  }
}

/** A hash of every file the web build reads. */
export function webInputsHash(root: string): string {
  const hash = createHash("sha256");
  for (const rel of BUILD_INPUTS) hashTree(root, rel, hash);
  return hash.digest("hex");
}

/** Runs `next build` unless the last build was made from the same inputs. Returns whether it built. */
export async function buildWebIfStale(root: string, log: (line: string) => void): Promise<boolean> {
  const stamp = path.join(root, "web", ".next", "teardown-inputs.sha256");
  const wanted = webInputsHash(root);
  if (existsSync(stamp) && existsSync(path.join(root, "web", ".next", "BUILD_ID")) && readFileSync(stamp, "utf8") === wanted) return false;
  log("building the web app (first start, or its sources changed) ...");
  const nextBin = path.join(root, "node_modules", "next", "dist", "bin", "next");
  await new Promise<void>((resolve, reject) => {
    const child = spawn(process.execPath, [nextBin, "build", "--webpack", "web"], {
      cwd: root,
      stdio: ["ignore", "pipe", "pipe"],
      env: { ...process.env, NEXT_TELEMETRY_DISABLED: "1" },
    });
    let out = "";
    child.stdout.on("data", (c: Buffer) => (out += c.toString()));
    child.stderr.on("data", (c: Buffer) => (out += c.toString()));
    child.on("error", reject);
    child.on("close", (code) => (code === 0 ? resolve() : reject(new Error(`the web build failed (exit ${code}):\n${out.trim().split("\n").slice(-30).join("\n")}`))));
  });
  writeFileSync(stamp, wanted);
  return true;
}
