/**
 * Builds the web app when its inputs changed since the last build, so a second start is fast.
 * The inputs' hash is kept beside the build output. Two starts on one checkout (parallel test
 * files, two terminals) must never run `next build` into the same folder at once, so the build
 * runs under a lock directory holding the builder's pid; a lock whose pid is gone is stale.
 */
import { createHash } from "node:crypto";
import { spawn } from "node:child_process";
import {
  existsSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  rmSync,
  statSync,
  writeFileSync,
} from "node:fs";
import path from "node:path";

/** Folders whose source goes into the web build. */
const BUILD_INPUTS = ["web", "db", "analysis-worker/engine/src", "package-lock.json"];
const SKIPPED = new Set(["node_modules", ".next", ".data"]);
/** Files the build itself writes into the inputs' folders; hashing them would make every start rebuild. */
const WRITTEN_BY_BUILD = [/^next-env\.d\.ts$/, /\.tsbuildinfo$/];

function hashTree(root: string, rel: string, hash: ReturnType<typeof createHash>): void {
  const p = path.join(root, rel);
  if (!existsSync(p)) return;
  const st = statSync(p);
  if (st.isDirectory()) {
    for (const name of readdirSync(p).sort())
      if (!SKIPPED.has(name) && !WRITTEN_BY_BUILD.some((re) => re.test(name)))
        hashTree(root, path.join(rel, name), hash);
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

/** How long a start waits for another process's build before giving up. */
const BUILD_LOCK_WAIT_MS = 10 * 60_000;
/** How often a waiting start looks at the lock again. */
const BUILD_LOCK_POLL_MS = 500;
/** What Next prints when a build is already running in the same folder. */
const ANOTHER_BUILD = /Another next build process is already running/;

function pidAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    // EPERM: the process exists but belongs to someone else.
    return (err as NodeJS.ErrnoException).code === "EPERM";
  }
}

/** The lock's holder pid, or null when the lock is missing, half-made or its holder is gone. */
function lockHolder(lockDir: string): number | null {
  try {
    const pid = Number(readFileSync(path.join(lockDir, "pid"), "utf8").trim());
    return Number.isInteger(pid) && pid > 0 && pidAlive(pid) ? pid : null;
  } catch {
    return null;
  }
}

/** Takes the build lock (mkdir is atomic), waiting while a live process holds it; returns its release. */
async function takeBuildLock(root: string, log: (line: string) => void): Promise<() => void> {
  const lockDir = path.join(root, ".data", "web-build.lock");
  mkdirSync(path.dirname(lockDir), { recursive: true });
  const deadline = Date.now() + BUILD_LOCK_WAIT_MS;
  let told = false;
  for (;;) {
    try {
      mkdirSync(lockDir);
      writeFileSync(path.join(lockDir, "pid"), String(process.pid));
      return () => rmSync(lockDir, { recursive: true, force: true });
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== "EEXIST") throw err;
    }
    const holder = lockHolder(lockDir);
    // A lock without a live holder is left by a killed build; a fresh one may still be getting its
    // pid file, so only a lock older than a few polls is taken as stale.
    const ageMs = Date.now() - (statSync(lockDir, { throwIfNoEntry: false })?.mtimeMs ?? 0);
    if (holder === null && ageMs > 4 * BUILD_LOCK_POLL_MS) {
      rmSync(lockDir, { recursive: true, force: true });
      continue;
    }
    if (Date.now() > deadline)
      throw new Error(
        `another process (pid ${holder}) has been building the web app for too long; lock ${lockDir}`,
      );
    if (!told) log(`waiting for another build of the web app (pid ${holder ?? "?"}) ...`);
    told = true;
    await new Promise((r) => setTimeout(r, BUILD_LOCK_POLL_MS));
  }
}

function buildIsCurrent(root: string, wanted: string): boolean {
  const stamp = path.join(root, "web", ".next", "teardown-inputs.sha256");
  return (
    existsSync(stamp) &&
    existsSync(path.join(root, "web", ".next", "BUILD_ID")) &&
    readFileSync(stamp, "utf8") === wanted
  );
}

/** Runs `next build` unless the last build was made from the same inputs. Returns whether it built. */
export async function buildWebIfStale(root: string, log: (line: string) => void): Promise<boolean> {
  if (buildIsCurrent(root, webInputsHash(root))) return false;
  const release = await takeBuildLock(root, log);
  try {
    // Another start may have built while this one waited; its sources may also have moved on.
    const wanted = webInputsHash(root);
    if (buildIsCurrent(root, wanted)) return false;
    // A `next build` started by hand (outside this lock) makes Next refuse a second one; wait for it.
    const deadline = Date.now() + BUILD_LOCK_WAIT_MS;
    for (;;) {
      try {
        await runNextBuild(root, log);
        break;
      } catch (err) {
        if (!(err instanceof Error && ANOTHER_BUILD.test(err.message)) || Date.now() > deadline)
          throw err;
        log("another `next build` is running in this checkout; waiting for it ...");
        await new Promise((r) => setTimeout(r, BUILD_LOCK_POLL_MS * 4));
      }
    }
    writeFileSync(path.join(root, "web", ".next", "teardown-inputs.sha256"), wanted);
    return true;
  } finally {
    release();
  }
}

async function runNextBuild(root: string, log: (line: string) => void): Promise<void> {
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
    child.on("close", (code) =>
      code === 0
        ? resolve()
        : reject(
            new Error(
              `the web build failed (exit ${code}):\n${out.trim().split("\n").slice(-30).join("\n")}`,
            ),
          ),
    );
  });
}
