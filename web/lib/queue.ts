/**
 * The web process's pg-boss handle, made on first use: revisions are written together with their
 * analysis job, so saving needs the queue. It does not supervise (the workers do that).
 */
import { createQueue, startQueue } from "@teardown/db";
import type { PgBoss } from "pg-boss";
import { database } from "./database";

const globalForQueue = globalThis as unknown as { teardownQueue?: Promise<PgBoss> };

/** The started queue, shared by every request in this process. */
export function analysisQueue(): Promise<PgBoss> {
  if (!globalForQueue.teardownQueue) {
    const boss = createQueue(database().url, { supervise: false });
    // pg-boss is an EventEmitter: an "error" with no listener (57P01 when the database restarts
    // under an idle connection) would be thrown as uncaught and end the web process. The failed
    // call itself still rejects to its request, which answers 503; the handle reconnects.
    boss.on("error", (err: Error) => {
      if (process.env.NODE_ENV !== "test")
        process.stderr.write(
          `teardown-ledger web: queue connection error (retrying): ${err.message}\n`,
        );
    });
    const started = startQueue(boss).then(() => boss);
    // A failed start must not stick: the next request tries again.
    started.catch(() => {
      globalForQueue.teardownQueue = undefined;
    });
    globalForQueue.teardownQueue = started;
  }
  return globalForQueue.teardownQueue;
}

/** Stops the queue (tests and shutdown). */
export async function closeQueue(): Promise<void> {
  const pending = globalForQueue.teardownQueue;
  globalForQueue.teardownQueue = undefined;
  if (pending)
    await (await pending.catch(() => null))?.stop({ close: true, graceful: false }).catch(() => {});
}
