/**
 * Calls the web app's route handlers in-process, as Next would: a path is matched to its route
 * module, the handler gets a real `Request` and its params. Sessions are cookies captured from
 * better-auth's answers; tokens go in `Authorization`. Set DATABASE_URL and TEARDOWN_DATA_DIR
 * before the first call (web/lib opens its database and data dir lazily, on first use).
 */
import { closeDatabase } from "@/lib/database";
import { closeQueue } from "@/lib/queue";
import { closeRecordParsePool } from "@/lib/record-parse/record-parse-pool";
import { closeWhatIfPool } from "@/lib/what-if/what-if-pool";

/** The origin every request claims, matching the default APP_URL (better-auth checks it). */
export const TEST_ORIGIN = "http://localhost:3000";

// `never` params: every route's own params type is assignable here; the router supplies them.
type Handler = (req: Request, ctx: { params: Promise<never> }) => Promise<Response> | Response;
type RouteModule = Partial<Record<"GET" | "POST" | "PATCH" | "PUT" | "DELETE", Handler>>;

const ROUTES: [string, () => Promise<RouteModule>][] = [
  ["/api/auth/*all", () => import("@/app/api/auth/[...all]/route")],
  ["/api/health", () => import("@/app/api/health/route")],
  ["/api/schema/:file", () => import("@/app/api/schema/[file]/route")],
  ["/api/me", () => import("@/app/api/me/route")],
  ["/api/tokens", () => import("@/app/api/tokens/route")],
  ["/api/tokens/:tokenId", () => import("@/app/api/tokens/[tokenId]/route")],
  ["/api/teams", () => import("@/app/api/teams/route")],
  ["/api/teams/:teamId", () => import("@/app/api/teams/[teamId]/route")],
  [
    "/api/teams/:teamId/members/:userId",
    () => import("@/app/api/teams/[teamId]/members/[userId]/route"),
  ],
  ["/api/teams/:teamId/invites", () => import("@/app/api/teams/[teamId]/invites/route")],
  ["/api/teams/:teamId/entries", () => import("@/app/api/teams/[teamId]/entries/route")],
  ["/api/teams/:teamId/audit", () => import("@/app/api/teams/[teamId]/audit/route")],
  ["/api/teams/:teamId/export", () => import("@/app/api/teams/[teamId]/export/route")],
  ["/api/teams/:teamId/import", () => import("@/app/api/teams/[teamId]/import/route")],
  ["/api/invites/:token", () => import("@/app/api/invites/[token]/route")],
  ["/api/entries", () => import("@/app/api/entries/route")],
  ["/api/search", () => import("@/app/api/search/route")],
  ["/api/search/fragment", () => import("@/app/api/search/fragment/route")],
  ["/api/entries/:entryId/similar", () => import("@/app/api/entries/[entryId]/similar/route")],
  ["/api/entries/:entryId", () => import("@/app/api/entries/[entryId]/route")],
  ["/api/entries/:entryId/revisions", () => import("@/app/api/entries/[entryId]/revisions/route")],
  [
    "/api/entries/:entryId/revisions/:number/waveforms",
    () => import("@/app/api/entries/[entryId]/revisions/[number]/waveforms/route"),
  ],
  [
    "/api/entries/:entryId/revisions/:number",
    () => import("@/app/api/entries/[entryId]/revisions/[number]/route"),
  ],
  ["/api/entries/:entryId/diff", () => import("@/app/api/entries/[entryId]/diff/route")],
  ["/api/entries/:entryId/what-if", () => import("@/app/api/entries/[entryId]/what-if/route")],
  ["/api/entries/:entryId/photos", () => import("@/app/api/entries/[entryId]/photos/route")],
  [
    "/api/entries/:entryId/photos/:photoId",
    () => import("@/app/api/entries/[entryId]/photos/[photoId]/route"),
  ],
  ["/api/entries/:entryId/comments", () => import("@/app/api/entries/[entryId]/comments/route")],
  [
    "/api/entries/:entryId/export/:file",
    () => import("@/app/api/entries/[entryId]/export/[file]/route"),
  ],
];

function match(pattern: string, path: string): Record<string, string | string[]> | null {
  const want = pattern.split("/");
  const got = path.split("/");
  const params: Record<string, string | string[]> = {};
  for (let i = 0; i < want.length; i++) {
    const w = want[i]!;
    if (w.startsWith("*")) {
      params[w.slice(1)] = got.slice(i).map(decodeURIComponent);
      return got.length > i ? params : null;
    }
    if (got[i] === undefined) return null;
    if (w.startsWith(":")) params[w.slice(1)] = decodeURIComponent(got[i]!);
    else if (w !== got[i]) return null;
  }
  return got.length === want.length ? params : null;
}

/** Who a request is sent as: a session cookie, an API token, or nobody. */
export interface As {
  cookie?: string;
  token?: string;
}

export interface CallOptions {
  json?: unknown;
  form?: FormData;
  body?: BodyInit;
  headers?: Record<string, string>;
  as?: As | null;
}

/** An answer, with the body read once as text (and as JSON when it is JSON). */
export interface ApiResponse {
  status: number;
  headers: Headers;
  text: string;
  bytes: Uint8Array;
  body: any; // eslint-disable-line @typescript-eslint/no-explicit-any
}

/** Sends one request to the route handler for its path. */
export async function call(
  method: string,
  pathAndQuery: string,
  opts: CallOptions = {},
): Promise<ApiResponse> {
  const url = new URL(pathAndQuery, TEST_ORIGIN);
  let found: { mod: RouteModule; params: Record<string, string | string[]> } | null = null;
  for (const [pattern, load] of ROUTES) {
    const params = match(pattern, url.pathname);
    if (params) {
      found = { mod: await load(), params };
      break;
    }
  }
  if (!found) throw new Error(`no route for ${url.pathname}`);
  const handler = found.mod[method as keyof RouteModule];
  if (!handler) throw new Error(`${url.pathname} has no ${method} handler`);
  const headers = new Headers({ origin: TEST_ORIGIN, ...opts.headers });
  if (opts.as?.cookie) headers.set("cookie", opts.as.cookie);
  if (opts.as?.token) headers.set("authorization", `Bearer ${opts.as.token}`);
  let body: BodyInit | undefined = opts.body;
  if (opts.json !== undefined) {
    body = JSON.stringify(opts.json);
    if (!headers.has("content-type")) headers.set("content-type", "application/json");
  } else if (opts.form) {
    // Let Request pick the multipart boundary, as a browser would.
    const encoded = new Request(url, { method: "POST", body: opts.form });
    headers.set("content-type", encoded.headers.get("content-type")!);
    body = new Uint8Array(await encoded.arrayBuffer());
  }
  // duplex "half" lets a test send a streamed body (Node's fetch requires it for streams).
  const init = { method, headers, ...(body !== undefined ? { body, duplex: "half" } : {}) };
  const req = new Request(url, init as RequestInit);
  const res = await handler(req, { params: Promise.resolve(found.params) as Promise<never> });
  const bytes = new Uint8Array(await res.arrayBuffer());
  const text = new TextDecoder().decode(bytes);
  let parsed: unknown = undefined;
  if ((res.headers.get("content-type") ?? "").includes("json"))
    parsed = text ? JSON.parse(text) : null;
  return { status: res.status, headers: res.headers, text, bytes, body: parsed };
}

/** The `name=value` pairs of an answer's Set-Cookie headers, as a Cookie header. */
export function cookieFrom(res: ApiResponse): string {
  return res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0]!)
    .filter((c) => !c.endsWith("="))
    .join("; ");
}

/** A signed-up user with a live session. */
export interface TestUser {
  id: string;
  name: string;
  email: string;
  password: string;
  as: As;
}

/** Signs a new user up through better-auth and returns their session cookie. */
export async function signUp(
  name: string,
  email: string,
  password = "correct horse battery",
): Promise<TestUser> {
  const res = await call("POST", "/api/auth/sign-up/email", { json: { name, email, password } });
  if (res.status !== 200) throw new Error(`sign-up failed (${res.status}): ${res.text}`);
  // Sign-up signs nobody in (so it cannot tell a taken email from a new one): sign in next.
  const signedIn = await call("POST", "/api/auth/sign-in/email", { json: { email, password } });
  if (signedIn.status !== 200)
    throw new Error(`sign-in after sign-up failed (${signedIn.status}): ${signedIn.text}`);
  return { id: signedIn.body.user.id, name, email, password, as: { cookie: cookieFrom(signedIn) } };
}

/** Signs in again (a second session). */
export async function signIn(email: string, password: string): Promise<{ status: number; as: As }> {
  const res = await call("POST", "/api/auth/sign-in/email", { json: { email, password } });
  return { status: res.status, as: { cookie: cookieFrom(res) } };
}

/** Closes the web code's pool and queue at the end of a test file. */
export async function closeWebApp(): Promise<void> {
  await closeRecordParsePool();
  await closeWhatIfPool();
  await closeQueue();
  await closeDatabase();
}

/** A test database and data dir wired into the web code, for one test file. */
export interface TestWebApp {
  db: import("./test-database.js").TestDatabase;
  dataDir: string;
  close(): Promise<void>;
}

/** Creates a database from the migrations and a temp data dir, and points the web code at them. */
export async function openTestWebApp(): Promise<TestWebApp> {
  const { createTestDatabase } = await import("./test-database.js");
  const { mkdtemp, rm } = await import("node:fs/promises");
  const { tmpdir } = await import("node:os");
  const path = await import("node:path");
  const db = await createTestDatabase();
  const dataDir = await mkdtemp(path.join(tmpdir(), "tl-api-"));
  process.env.DATABASE_URL = db.url;
  process.env.TEARDOWN_DATA_DIR = dataDir;
  delete process.env.BETTER_AUTH_SECRET;
  // API tests make entries far faster than a person; the upload limit has its own test.
  process.env.RECORD_SUBMISSION_BURST ??= "100000";
  return {
    db,
    dataDir,
    async close() {
      await closeWebApp();
      await db.drop();
      await rm(dataDir, { recursive: true, force: true });
    },
  };
}
