/**
 * The gate in front of better-auth's endpoints: the body is read through the capped reader (an
 * anonymous caller must not make the process hold a 200 MB body), checked like every other API
 * body (depth, NUL characters, field lengths with zod), counted against the sign-in and sign-up
 * limits, and only then handed on. Signing out everywhere also revokes the user's API tokens.
 */
import { z } from "zod";
import { answer } from "./api-error";
import { revokeAllApiTokens } from "./api-tokens";
import { auth, MAX_PASSWORD_CHARS, MAX_USER_NAME_CHARS } from "./auth";
import { database } from "./database";
import { limitAuthAttempt } from "./request-guard";
import { parseJsonText, readBytes, validate } from "./request-body";

/** The largest body any auth endpoint accepts, in bytes (an email, a name and two passwords). */
export const MAX_AUTH_BODY_BYTES = 16 * 1024;
/** The longest email address (RFC 5321's path limit). */
const MAX_EMAIL_CHARS = 254;

const name = z.string().trim().min(1).max(MAX_USER_NAME_CHARS);
const email = z.string().max(MAX_EMAIL_CHARS);
const password = z.string().max(MAX_PASSWORD_CHARS);
const url = z.string().max(2000);

// Only the fields whose size matters are checked here; better-auth checks the rest itself.
const BODY_SCHEMAS: Record<string, z.ZodType> = {
  "sign-up/email": z.looseObject({ name, email, password, image: url.optional() }),
  "sign-in/email": z.looseObject({ email, password, callbackURL: url.optional() }),
  "update-user": z.looseObject({ name: name.optional(), image: url.nullable().optional() }),
  "change-password": z.looseObject({ currentPassword: password, newPassword: password }),
};

/** The endpoint path under /api/auth, e.g. "sign-in/email". */
function endpointOf(req: Request): string {
  return new URL(req.url).pathname.replace(/^\/api\/auth\/?/, "").replace(/\/+$/, "");
}

/** Handles one request to /api/auth/*, guarded as described above. */
export function handleAuthRequest(req: Request): Promise<Response> {
  return answer(async () => {
    if (req.method === "GET" || req.method === "HEAD") return auth().handler(req);
    const endpoint = endpointOf(req);
    const bytes = await readBytes(req, MAX_AUTH_BODY_BYTES);
    const text = new TextDecoder().decode(bytes);
    const body = text.trim() === "" ? {} : parseJsonText(text);
    const schema = BODY_SCHEMAS[endpoint];
    if (schema) validate(schema, body);
    const fields = (body ?? {}) as Record<string, unknown>;
    if (endpoint === "sign-up/email") limitAuthAttempt(req, "sign-up", null);
    if (endpoint === "sign-in/email") {
      const account = typeof fields.email === "string" ? fields.email.toLowerCase() : null;
      limitAuthAttempt(req, "sign-in", account);
    }
    // Who is signing out everywhere must be known before better-auth ends the session.
    const revokesAll =
      endpoint === "revoke-sessions" ||
      (endpoint === "change-password" && fields.revokeOtherSessions === true);
    const before = revokesAll ? await auth().api.getSession({ headers: req.headers }) : null;

    const headers = new Headers(req.headers);
    headers.delete("content-length");
    const forwarded = new Request(req.url, {
      method: req.method,
      headers,
      body: bytes.byteLength > 0 ? bytes : null,
    });
    const res = await auth().handler(forwarded);
    if (before && res.status === 200) {
      await revokeAllApiTokens(database().db, before.user.id, endpoint);
    }
    return res;
  });
}
