/**
 * The browser side of the HTTP API: same-origin fetches with the session cookie, JSON in and
 * out, and one error type whose message is fit to show as it is.
 */

/** A refused request: the HTTP status and the API's (or better-auth's) own message. */
export class RequestFailed extends Error {
  override readonly name = "RequestFailed";
  constructor(
    readonly status: number,
    message: string,
    readonly code?: string,
  ) {
    super(message);
  }
}

/** The readable message inside an error body: ours is `{error: {message}}`, better-auth's `{message}`. */
function messageOf(body: unknown, status: number): { message: string; code?: string } {
  const b = body as {
    error?: { message?: string; code?: string };
    message?: string;
    code?: string;
  };
  if (b?.error?.message) return { message: b.error.message, code: b.error.code };
  if (b?.message) return { message: b.message, code: b.code };
  if (status === 401) return { message: "you are not signed in" };
  return { message: `the server answered ${status}` };
}

/** Sends a request to our own API and returns its JSON, or throws RequestFailed. */
export async function apiFetch<T>(
  path: string,
  init: { method?: string; body?: unknown } = {},
): Promise<T> {
  const hasBody = init.body !== undefined;
  let res: Response;
  try {
    res = await fetch(path, {
      method: init.method ?? (hasBody ? "POST" : "GET"),
      credentials: "same-origin",
      headers: hasBody ? { "content-type": "application/json" } : {},
      body: hasBody ? JSON.stringify(init.body) : undefined,
    });
  } catch {
    throw new RequestFailed(
      0,
      "the server could not be reached; check your connection and try again",
    );
  }
  const text = await res.text();
  let body: unknown = null;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    body = null;
  }
  if (!res.ok) {
    const { message, code } = messageOf(body, res.status);
    throw new RequestFailed(res.status, message, code);
  }
  return body as T;
}

/**
 * Where to go after signing in: only a path on this site. Browsers drop tabs and newlines from a
 * URL and read `\\` as `/`, so `/<tab>/host` or `/\\host` would leave the site; the path is
 * resolved the way a browser would and kept only when it stays on the same origin, and any
 * control character or backslash refuses it outright.
 */
export function safeNext(next: string | null | undefined, fallback = "/teams"): string {
  // eslint-disable-next-line no-control-regex -- control characters are exactly what is refused
  if (!next || !next.startsWith("/") || /[\u0000-\u001f\u007f\\]/.test(next)) return fallback;
  const base = "http://same-origin.invalid";
  let resolved: URL;
  try {
    resolved = new URL(next, base);
  } catch {
    return fallback;
  }
  if (resolved.origin !== base || next.startsWith("//")) return fallback;
  return resolved.pathname + resolved.search + resolved.hash;
}
