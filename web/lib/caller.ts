/**
 * Who is calling: a personal API token (`Authorization: Bearer tl_...`) or the session cookie.
 * A request that sends a bearer token is judged by the token alone, so a bad token is a 401
 * even when a cookie rides along. A cookie-authenticated write from a foreign origin is a 403.
 */
import { schema } from "@teardown/db";
import { eq } from "drizzle-orm";
import { unauthenticated } from "./api-error";
import { userForToken } from "./api-tokens";
import { auth } from "./auth";
import { database } from "./database";
import { checkWriteOrigin } from "./request-guard";

/** The signed-in user behind a request. */
export interface Caller {
  userId: string;
  name: string;
  email: string;
  via: "session" | "token";
  /** The API token the request was authenticated by (when `via` is "token"). */
  tokenId?: string;
}

/** The caller, or null for an anonymous request; a present but bad bearer token throws 401. */
export async function findCaller(req: Request): Promise<Caller | null> {
  const header = req.headers.get("authorization");
  if (header !== null) {
    const m = /^Bearer\s+(\S+)$/i.exec(header.trim());
    if (!m) throw unauthenticated();
    const { db } = database();
    const found = await userForToken(db, m[1]!);
    if (!found) throw unauthenticated();
    const [user] = await db
      .select({ name: schema.users.name, email: schema.users.email })
      .from(schema.users)
      .where(eq(schema.users.id, found.userId));
    if (!user) throw unauthenticated();
    return { userId: found.userId, ...user, via: "token", tokenId: found.tokenId };
  }
  if (!(req.headers.get("cookie") ?? "").includes("session_token")) return null;
  const session = await auth().api.getSession({ headers: req.headers });
  if (!session) return null;
  // The cookie rides along on any request a browser sends, so a write must prove it came from
  // our own pages (a bearer token is never sent by a browser on its own, so it needs no check).
  checkWriteOrigin(req);
  return {
    userId: session.user.id,
    name: session.user.name,
    email: session.user.email,
    via: "session",
  };
}

/** The caller, or 401. */
export async function requireCaller(req: Request): Promise<Caller> {
  const caller = await findCaller(req);
  if (!caller) throw unauthenticated();
  return caller;
}
