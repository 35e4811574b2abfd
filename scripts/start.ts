/**
 * `npm start`: the whole app on one machine. Starts Postgres (embedded unless DATABASE_URL is
 * set), applies migrations, loads the demo data once, builds the web app if needed, starts one
 * worker and the web server, prints the URL, and stops everything on Ctrl-C or SIGTERM (also when
 * sent by npm, a process manager or a container runtime, and when its parent goes away).
 * A crashed worker or web server is restarted, with the reason logged, up to a limit
 * (`start/restart-policy.ts`); a crash of the database stops the whole start (exit 1).
 */
import path from "node:path";
import { fileURLToPath } from "node:url";
import {
  applyMigrations,
  createQueue,
  DatabaseUnavailableError,
  openDatabase,
  startQueue,
  type DatabaseHandle,
} from "@teardown/db";
import { loadDemoData } from "@teardown/seed-demo";
import { buildWebIfStale } from "./start/build-web.js";
import { startChild, type ManagedChild } from "./start/child-processes.js";
import { portProblem } from "./start/port-check.js";
import {
  describeExit,
  MAX_RESTARTS,
  RestartBudget,
  RESTART_WINDOW_MS,
  restartDelayMs,
} from "./start/restart-policy.js";

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
/** How long the web server may take to answer its health check after it starts. */
const WEB_READY_TIMEOUT_MS = 60_000;

const log = (line: string) => process.stdout.write(`[start] ${line}\n`);
function fail(line: string): never {
  process.stderr.write(`teardown-ledger: ${line}\n`);
  process.exit(1);
}

async function waitForHealth(url: string, child: ManagedChild): Promise<void> {
  const deadline = Date.now() + WEB_READY_TIMEOUT_MS;
  let exited = false;
  void child.exited.then(() => (exited = true));
  while (Date.now() < deadline && !exited) {
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) return;
    } catch {
      /* not listening yet */
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(
    exited
      ? "the web server exited during start-up"
      : `the web server did not become healthy within ${WEB_READY_TIMEOUT_MS / 1000} s`,
  );
}

async function main(): Promise<void> {
  const port = Number(process.env.PORT ?? 3000);
  if (!Number.isInteger(port) || port <= 0 || port > 65535)
    fail(`PORT must be a TCP port number, got "${process.env.PORT}"`);
  const busy = await portProblem(port);
  if (busy) fail(busy);

  let handle: DatabaseHandle;
  try {
    handle = await openDatabase({ poolSize: 4 });
  } catch (err) {
    if (err instanceof DatabaseUnavailableError) fail(err.message);
    fail(
      `cannot start the database: ${err instanceof Error ? err.message.split("\n")[0] : String(err)}`,
    );
  }
  const children: ManagedChild[] = [];
  let shuttingDown = false;
  const shutdown = async (code: number, why?: string) => {
    if (shuttingDown) return;
    shuttingDown = true;
    if (why) process.stderr.write(`teardown-ledger: ${why}; stopping everything\n`);
    else log("stopping ...");
    await Promise.all(children.map((c) => c.stop()));
    await handle.close();
    log("stopped");
    process.exit(code);
  };
  process.on("SIGINT", () => void shutdown(0));
  process.on("SIGTERM", () => void shutdown(0));
  process.on("SIGHUP", () => void shutdown(0));
  // Orphaned (npm or a wrapper shell was killed without passing the signal on): stop too, so
  // nothing is left running that no one can stop.
  const parentAtStart = process.ppid;
  setInterval(() => {
    if (process.ppid !== parentAtStart)
      void shutdown(0, "the process that ran the start went away");
  }, 1000).unref();

  try {
    log(
      handle.embedded
        ? `embedded Postgres on port ${handle.embedded.port} (data in ${path.relative(ROOT, handle.embedded.dataDir)})`
        : "using DATABASE_URL",
    );
    void handle.embedded?.exited.then(({ code, signal }) =>
      shutdown(1, `the embedded Postgres server exited (code ${code}, signal ${signal})`),
    );
    await applyMigrations(handle.url);
    const boss = createQueue(handle.url, { supervise: false });
    await startQueue(boss);
    const seeded = await loadDemoData(handle.db, boss);
    await boss.stop({ close: true });
    log(
      seeded.loaded ? `demo data loaded (${seeded.entries} entries)` : "demo data already present",
    );
    process.stdout.write(`demo sign-in: ${seeded.signIn.email} / ${seeded.signIn.password}\n`);
    await buildWebIfStale(ROOT, log);
  } catch (err) {
    const msg = err instanceof Error ? err.message : String(err);
    return shutdown(1, msg);
  }
  if (shuttingDown) return;

  const env = {
    ...process.env,
    DATABASE_URL: handle.url,
    PORT: String(port),
    NODE_ENV: "production",
    NEXT_TELEMETRY_DISABLED: "1",
  };
  const specs: Array<{ name: string; args: string[] }> = [
    { name: "worker", args: ["--import", "tsx", "analysis-worker/src/main.ts"] },
    {
      name: "web",
      args: [
        path.join(ROOT, "node_modules", "next", "dist", "bin", "next"),
        "start",
        "web",
        "-p",
        String(port),
      ],
    },
  ];
  // Each child is restarted when it dies on its own, with the reason logged, until its budget of
  // restarts is spent; the database under the other child is never stopped for it.
  const supervise = (
    spec: { name: string; args: string[] },
    budget: RestartBudget,
  ): ManagedChild => {
    const child = startChild(spec.name, spec.args, env, ROOT);
    children.push(child);
    void child.exited.then(async ({ code, signal }) => {
      if (shuttingDown) return;
      children.splice(children.indexOf(child), 1);
      const how = describeExit(code, signal);
      const n = budget.take(Date.now());
      if (n === null)
        return shutdown(
          1,
          `the ${spec.name} process exited (${how}) after ${MAX_RESTARTS} restarts within ${RESTART_WINDOW_MS / 60_000} minutes`,
        );
      const delay = restartDelayMs(n);
      process.stderr.write(
        `teardown-ledger: the ${spec.name} process exited (${how}); restarting it in ${delay / 1000} s (restart ${n} of at most ${MAX_RESTARTS} within ${RESTART_WINDOW_MS / 60_000} minutes)\n`,
      );
      await new Promise((r) => setTimeout(r, delay));
      if (!shuttingDown) supervise(spec, budget);
    });
    return child;
  };
  supervise(specs[0]!, new RestartBudget());
  const web = supervise(specs[1]!, new RestartBudget());

  const url = `http://localhost:${port}`;
  try {
    await waitForHealth(url, web);
  } catch (err) {
    return shutdown(1, err instanceof Error ? err.message : String(err));
  }
  log(`Teardown Ledger is running at ${url}  (Ctrl-C stops it)`);
}

void main();
