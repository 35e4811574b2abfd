/**
 * The API's one error shape, `{ error: { code, message, path?, errors? } }`, and the one place
 * that turns a thrown ApiError (or an unexpected failure) into a response.
 */
import { NextResponse } from "next/server";
import { isTransientDatabaseError } from "@teardown/db";

/** One problem inside a request or an uploaded file. */
export interface ProblemDetail {
  path: string;
  message: string;
  code?: string;
  line?: number | null;
  column?: number | null;
}

/** An expected failure of a request, carried up to the route's edge and answered as JSON. */
export class ApiError extends Error {
  override readonly name = "ApiError";
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly extra: { path?: string; errors?: ProblemDetail[]; [key: string]: unknown } = {},
  ) {
    super(message);
  }
}

/** 404 in the one wording used for unknown ids and for things the caller may not see. */
export function notFound(what = "entry"): ApiError {
  return new ApiError(404, "not-found", `no such ${what}`);
}

/** 401: the request carries no valid session or token. */
export function unauthenticated(): ApiError {
  return new ApiError(
    401,
    "unauthenticated",
    "sign in, or send a valid `Authorization: Bearer` token",
  );
}

/** 403: the caller can see the team but their role does not allow this. */
export function forbidden(needed: string): ApiError {
  return new ApiError(403, "forbidden", `this needs the ${needed} role on the team`);
}

/** The JSON response for an error body. */
export function errorResponse(err: ApiError): NextResponse {
  const { path, errors, ...rest } = err.extra;
  const body: Record<string, unknown> = { code: err.code, message: err.message, ...rest };
  if (path !== undefined) body.path = path;
  if (errors !== undefined) body.errors = errors;
  // A refusal that passes (busy, rate-limited, database restarting) says when to come back.
  const retry = rest.retryAfterSeconds;
  const headers = typeof retry === "number" ? { "retry-after": String(retry) } : undefined;
  return NextResponse.json(
    { error: body },
    { status: err.status, ...(headers ? { headers } : {}) },
  );
}

// Postgres: invalid text for a type (a malformed uuid that slipped past validation).
const PG_INVALID_TEXT = "22P02";

/** Any failure as a response: ApiErrors as they are, a bad uuid as 404, the rest as a logged 500. */
export function toErrorResponse(err: unknown): NextResponse {
  if (err instanceof ApiError) return errorResponse(err);
  const code =
    (err as { code?: string; cause?: { code?: string } }).code ??
    (err as { cause?: { code?: string } }).cause?.code;
  if (code === PG_INVALID_TEXT) return errorResponse(notFound("object"));
  // The database restarting or unreachable is not a bug of the request: say so, and when to retry.
  if (isTransientDatabaseError(err))
    return errorResponse(
      new ApiError(
        503,
        "database-unavailable",
        "the database is unavailable for a moment; try again shortly",
        {
          retryAfterSeconds: 5,
        },
      ),
    );
  // An unexpected failure is a bug: say so without leaking internals, and keep the detail in the log.
  console.error("api: unexpected failure", err);
  return errorResponse(new ApiError(500, "internal", "the server failed to answer this request"));
}

/** Runs a route body and answers any thrown failure with the shared error shape. */
export async function answer(fn: () => Promise<Response>): Promise<Response> {
  try {
    return await fn();
  } catch (err) {
    return toErrorResponse(err);
  }
}
