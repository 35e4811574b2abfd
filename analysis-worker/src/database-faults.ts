/**
 * Riding out a short database outage (the server restarting, a connection cut). A job's calls
 * are retried: without that, a call that fails while the server is away fails the job, and when
 * the queue cannot record that failure either (same outage), the job sits until its expiry
 * (minutes). And a pooled connection that dies while checked out must not crash the process.
 */

/** The first wait after a failed call; each further wait doubles, up to the next constant. */
const FIRST_RETRY_DELAY_MS = 250;
const MAX_RETRY_DELAY_MS = 4_000;

/** SQLSTATEs that mean "the connection or server is away, try again", not "this query is wrong". */
const TRANSIENT_SQLSTATES = new Set([
  "57P01",
  "57P02",
  "57P03",
  "53300",
  "08000",
  "08001",
  "08003",
  "08004",
  "08006",
]);
/** Socket-level error codes of an unreachable or vanished server. */
const TRANSIENT_NET_CODES = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "ETIMEDOUT",
  "EPIPE",
  "EHOSTUNREACH",
  "ENETUNREACH",
  "EAI_AGAIN",
]);
/** node-postgres reports a dropped or refused connection with these messages and no code. */
const TRANSIENT_MESSAGE =
  /connection terminated|connection timeout|timeout exceeded when trying to connect|not queryable|server closed the connection/i;

/** True when `err` (or any error in its cause chain) is a lost or refused database connection. */
export function isTransientDatabaseError(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== "object" || depth > 5) return false;
  const e = err as { code?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
  if (
    typeof e.code === "string" &&
    (TRANSIENT_SQLSTATES.has(e.code) || TRANSIENT_NET_CODES.has(e.code))
  )
    return true;
  if (typeof e.message === "string" && TRANSIENT_MESSAGE.test(e.message)) return true;
  // node's happy-eyeballs connect wraps several attempts in an AggregateError
  if (Array.isArray(e.errors) && e.errors.some((x) => isTransientDatabaseError(x, depth + 1)))
    return true;
  // drizzle wraps the driver's error in its own, with the driver's as the cause
  return isTransientDatabaseError(e.cause, depth + 1);
}

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
