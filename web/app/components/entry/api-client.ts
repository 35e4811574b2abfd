/**
 * The browser side of the HTTP API (web/app/api/README.md): JSON and multipart requests with
 * the session cookie, and one error type that keeps the status and the API's error body, so
 * pages can show a 422's problem list or a 409's `changedSince`.
 */

/** One problem the API lists (422 bodies), with the file line for records. */
export interface ApiProblem {
  path: string;
  message: string;
  code?: string;
  line?: number | null;
  column?: number | null;
}

/** The API's error body (`{ error: {...} }`), with the extra fields some answers carry. */
export interface ApiErrorBody {
  code: string;
  message: string;
  path?: string;
  errors?: ApiProblem[];
  [key: string]: unknown;
}

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

async function send<T>(url: string, init: RequestInit): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, { credentials: "same-origin", ...init });
  } catch (err) {
    throw new ApiFailure(0, {
      code: "network",
      message: `the server could not be reached (${(err as Error).message})`,
    });
  }
  const text = await res.text();
  let data: unknown = null;
  try {
    data = text === "" ? null : JSON.parse(text);
  } catch {
    data = null;
  }
  if (!res.ok) {
    const body = (data as { error?: ApiErrorBody } | null)?.error;
    throw new ApiFailure(
      res.status,
      body ?? { code: "http-" + res.status, message: `the server answered ${res.status}` },
    );
  }
  return data as T;
}

/** GET a JSON answer. */
export function getJson<T>(url: string): Promise<T> {
  return send<T>(url, { headers: { accept: "application/json" } });
}

/** POST (or PATCH) a JSON body and read the JSON answer. */
export function sendJson<T>(
  url: string,
  body: unknown,
  method: "POST" | "PATCH" | "DELETE" = "POST",
): Promise<T> {
  return send<T>(url, {
    method,
    headers: { "content-type": "application/json", accept: "application/json" },
    body: JSON.stringify(body),
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
