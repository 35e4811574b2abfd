/**
 * Starts `npm run worker`'s entry point as a real child process against a test database, and
 * reads its structured log lines.
 */
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import { projectRoot } from "@teardown/db";

export interface WorkerProcess {
  child: ChildProcess;
  /** Parsed JSON log lines so far. */
  logs: Array<Record<string, unknown>>;
  stderr: () => string;
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  waitForLog(
    pred: (line: Record<string, unknown>) => boolean,
    ms?: number,
  ): Promise<Record<string, unknown>>;
}

/** Starts one worker process; `env` adds to (and overrides) the test defaults. */
export function startWorkerProcess(
  databaseUrl: string,
  env: Record<string, string> = {},
): WorkerProcess {
  const root = projectRoot();
  const child = spawn(
    process.execPath,
    ["--import", "tsx", path.join(root, "analysis-worker", "src", "main.ts")],
    {
      cwd: root,
      env: {
        ...process.env,
        DATABASE_URL: databaseUrl,
        WORKER_CONCURRENCY: "2",
        JOB_EXPIRE_SECONDS: "30",
        QUEUE_SUPERVISE_SECONDS: "2",
        QUEUE_POLL_SECONDS: "0.5",
        LOG_LEVEL: "info",
        ...env,
      },
      stdio: ["ignore", "pipe", "pipe"],
    },
  );
  const logs: Array<Record<string, unknown>> = [];
  let buf = "";
  let err = "";
  child.stdout!.on("data", (c: Buffer) => {
    buf += c.toString();
    const lines = buf.split("\n");
    buf = lines.pop() ?? "";
    for (const line of lines) {
      try {
        logs.push(JSON.parse(line) as Record<string, unknown>);
      } catch {
        logs.push({ raw: line });
      }
    }
  });
  child.stderr!.on("data", (c: Buffer) => (err += c.toString()));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((r) =>
    child.on("exit", (code, signal) => r({ code, signal })),
  );
  return {
    child,
    logs,
    stderr: () => err,
    exited,
    async waitForLog(pred, ms = 60_000) {
      const end = Date.now() + ms;
      for (;;) {
        const hit = logs.find(pred);
        if (hit) return hit;
        if (Date.now() > end)
          throw new Error(
            `no matching worker log line within ${ms} ms; stderr: ${err.slice(-500)}`,
          );
        if (child.exitCode !== null)
          throw new Error(`worker exited (${child.exitCode}); stderr: ${err.slice(-1000)}`);
        await new Promise((r) => setTimeout(r, 100));
      }
    },
  };
}
