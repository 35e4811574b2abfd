/**
 * Riding out a short database outage (the server restarting, a connection cut). A job's calls
 * are retried: without that, a call that fails while the server is away fails the job, and when
 * the queue cannot record that failure either (same outage), the job sits until its expiry
 * (minutes). And a pooled connection that dies while checked out must not crash the process.
 */

/** The first wait after a failed call; each further wait doubles, up to the next constant. */
const FIRST_RETRY_DELAY_MS = 250;
const MAX_RETRY_DELAY_MS = 4_000;

// Which errors count as "the database is away" is shared with the web app (503 answers).
import { isTransientDatabaseError } from "@teardown/db";
export { isTransientDatabaseError };

export interface RetryOptions {
  /** Stop retrying once this long has passed since the first attempt, and throw the last error. */
  maxElapsedMs: number;
  /** Told of each retry before its wait. */
  onRetry?: (err: unknown, attempt: number, delayMs: number) => void;
  sleep?: (ms: number) => Promise<void>;
}

/** Runs `call`, repeating it with doubling waits while it fails with a transient database error. */
export async function withDatabaseRetry<T>(call: () => Promise<T>, opts: RetryOptions): Promise<T> {
  const sleep = opts.sleep ?? ((ms: number) => new Promise<void>((r) => setTimeout(r, ms)));
  const start = performance.now();
  let delayMs = FIRST_RETRY_DELAY_MS;
  for (let attempt = 1; ; attempt++) {
    try {
      return await call();
    } catch (err) {
      // Anything else (a constraint, a bad query) would fail the same way again: let it throw.
      if (!isTransientDatabaseError(err) || performance.now() - start + delayMs > opts.maxElapsedMs)
        throw err;
      opts.onRetry?.(err, attempt, delayMs);
      await sleep(delayMs);
      delayMs = Math.min(MAX_RETRY_DELAY_MS, delayMs * 2);
    }
  }
}

// The pool guard lives with the pool factory (db/pool-guard.ts); re-exported for the worker's tests.
export { guardPoolClients } from "@teardown/db";
