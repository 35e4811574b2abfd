/**
 * Who is looking at a page, for server components: the better-auth session behind the request's
 * cookie, in the same `Caller` shape the API uses, or null when nobody is signed in.
 */
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";
import { auth } from "@/lib/auth";
import type { Caller } from "@/lib/caller";

/**
 * The signed-in user, or null. Once per request: the header and the page both ask, and each
 * lookup is a session query, a user query and a cookie signature check.
 */
export const currentCaller = cache(async function currentCaller(): Promise<Caller | null> {
  const h = await headers();
  // No session cookie means nobody is signed in; skip the database round trip.
  if (!(h.get("cookie") ?? "").includes("session_token")) return null;
  const session = await auth().api.getSession({ headers: h });
  if (!session) return null;
  return {
    userId: session.user.id,
    name: session.user.name,
    email: session.user.email,
    via: "session",
  };
});

/** The signed-in user, or a redirect to the sign-in page that comes back to `here`. */
export async function requirePageCaller(here: string): Promise<Caller> {
  const caller = await currentCaller();
  if (!caller) redirect(`/sign-in?next=${encodeURIComponent(here)}`);
  return caller;
}
