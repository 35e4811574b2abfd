/**
 * Failures at the database edge, wrapped in one error type that says which server and why in a
 * single line (the start script prints `message` alone, never a stack trace).
 */

/** The database could not be reached or used; `message` is one line naming the host. */
export class DatabaseUnavailableError extends Error {
  override readonly name = "DatabaseUnavailableError";
  constructor(
    readonly host: string,
    readonly reason: string,
    options?: { cause?: unknown },
  ) {
    super(`cannot use the database at ${host}: ${reason}`, options);
  }
}

/** `host:port/database` of a postgres URL, without the password, for messages. */
export function describeDatabaseUrl(url: string): string {
  try {
    const u = new URL(url);
    const db = u.pathname.replace(/^\//, "") || "(default database)";
    return `${u.hostname || "localhost"}:${u.port || "5432"}/${db}`;
  } catch {
    return "(unparseable DATABASE_URL)";
  }
}

/** A plain-words reason for a driver or network failure. */
export function explainConnectionFailure(err: unknown): string {
  const e = err as { code?: string; message?: string; errors?: unknown[] };
  // node's happy-eyeballs connect wraps several attempts in an AggregateError
  if (!e.code && Array.isArray(e.errors) && e.errors.length > 0)
    return explainConnectionFailure(e.errors[0]);
  switch (e.code) {
    case "ECONNREFUSED":
      return "connection refused (is the server running and listening on that port?)";
    case "ENOTFOUND":
    case "EAI_AGAIN":
      return "host name not found";
    case "ETIMEDOUT":
      return "connection timed out";
    case "ECONNRESET":
      return "connection reset by the server";
    case "28P01":
    case "28000":
      return "authentication failed for that user";
    case "3D000":
      return "that database does not exist";
    case "57P03":
      return "the server is starting up or shutting down";
    default:
      return (e.message ?? String(err)).split("\n")[0] || "unknown error";
  }
}
