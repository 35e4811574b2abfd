/**
 * The start script's children (the worker and the web server), each in its own process group
 * so that stopping one stops everything it started, and none is left behind.
 */
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";

/** Preloaded into every child: it exits when the start script dies (see the file). */
const EXIT_WITH_PARENT = path.join(
  path.dirname(fileURLToPath(import.meta.url)),
  "exit-with-parent.cjs",
);

/** How long a child may take to finish its work after SIGTERM before it is killed. */
export const CHILD_STOP_GRACE_MS = 15_000;

export interface ManagedChild {
  name: string;
  process: ChildProcess;
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  stop(): Promise<void>;
}

/** Starts `args` with node, prefixing each output line with the child's name. */
export function startChild(
  name: string,
  args: string[],
  env: NodeJS.ProcessEnv,
  cwd: string,
): ManagedChild {
  const child = spawn(process.execPath, ["--require", EXIT_WITH_PARENT, ...args], {
    cwd,
    env: { ...env, TEARDOWN_EXIT_WITH_PARENT: "1" },
    detached: true,
    stdio: ["pipe", "pipe", "pipe"],
  });
  const relay = (stream: NodeJS.ReadableStream, out: NodeJS.WriteStream) => {
    let buf = "";
    stream.on("data", (chunk: Buffer) => {
      buf += chunk.toString();
      const lines = buf.split("\n");
      buf = lines.pop() ?? "";
      for (const line of lines) out.write(`[${name}] ${line}\n`);
    });
  };
  relay(child.stdout!, process.stdout);
  relay(child.stderr!, process.stderr);
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.once("exit", (code, signal) => resolve({ code, signal })),
  );
  let stopping: Promise<void> | null = null;
  const signalGroup = (sig: NodeJS.Signals) => {
    try {
      process.kill(-child.pid!, sig);
    } catch {
      /* already gone */
    }
  };
  return {
    name,
    process: child,
    exited,
    stop: () =>
      (stopping ??= (async () => {
        if (child.exitCode !== null || child.signalCode !== null) return signalGroup("SIGKILL");
        signalGroup("SIGTERM");
        const killer = setTimeout(() => signalGroup("SIGKILL"), CHILD_STOP_GRACE_MS);
        await exited;
        clearTimeout(killer);
        signalGroup("SIGKILL"); // anything the child itself started and left behind
      })()),
  };
}
