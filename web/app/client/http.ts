/**
 * The browser's one HTTP client for our API: same-origin requests with the session cookie, JSON
 * or multipart in, JSON out, and one error type that keeps the status and the API's error body,
 * so a page can show a 422's problem list, a 409's `changedSince` or a plain message as it is.
 * Every component uses this file; response shapes live beside it in `api-types.ts`.
 */
import type { ApiErrorBody } from "./api-types";

/** A request the API refused, or a network failure (status 0). */
export class ApiFailure extends Error {
  override readonly name = "ApiFailure";
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody,
  ) {
    super(body.message);
  }
}

/**
 * The error body of a refused request: ours is `{ error: { code, message, ... } }`, the sign-in
 * library's is `{ code?, message }`; anything else gets a plain line with the status.
 */
function errorBodyOf(data: unknown, status: number): ApiErrorBody {
  const d = data as { error?: ApiErrorBody; message?: string; code?: string } | null;
  if (d?.error?.message) return d.error;
  if (typeof d?.message === "string" && d.message) {
    return { code: d.code ?? `http-${status}`, message: d.message };
  }
  if (status === 401) return { code: "unauthenticated", message: "you are not signed in" };
  return { code: `http-${status}`, message: `the server answered ${status}` };
}

async function send<T>(url: string, init: RequestInit): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, { credentials: "same-origin", ...init });
  } catch {
    throw new ApiFailure(0, {
      code: "network",
      message: "the server could not be reached; check your connection and try again",
    });
  }
  const text = await res.text();
  let data: unknown = null;
  try {
    data = text === "" ? null : JSON.parse(text);
  } catch {
    data = null;
  }
  if (!res.ok) throw new ApiFailure(res.status, errorBodyOf(data, res.status));
  return data as T;
}

/** GET a JSON answer. */
export function getJson<T>(url: string): Promise<T> {
  return send<T>(url, { headers: { accept: "application/json" } });
}

/** POST, PATCH or DELETE a JSON body (or none) and read the JSON answer. */
export function sendJson<T>(
  url: string,
  body?: unknown,
  method: "POST" | "PATCH" | "DELETE" = "POST",
): Promise<T> {
  const hasBody = body !== undefined;
  return send<T>(url, {
    method,
    headers: hasBody
      ? { "content-type": "application/json", accept: "application/json" }
      : { accept: "application/json" },
    body: hasBody ? JSON.stringify(body) : undefined,
  });
}

/** POST a multipart form and read the JSON answer. */
export function sendForm<T>(url: string, form: FormData): Promise<T> {
  return send<T>(url, { method: "POST", body: form, headers: { accept: "application/json" } });
}

/** A line for people saying why a request failed. */
export function failureText(err: unknown): string {
  if (err instanceof ApiFailure) {
    if (err.status === 401) return "You are not signed in.";
    if (err.status === 403) return `Your role does not allow this: ${err.body.message}.`;
    if (err.status === 404) return "Not found, or not visible to you.";
    return err.body.message;
  }
  return err instanceof Error ? err.message : String(err);
}
