/**
 * Which failures mean "the database is away for now" (restarting, unreachable, out of
 * connections) rather than "this query is wrong": the worker retries them, and the web app
 * answers them with 503 and a message instead of a 500.
 */

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
