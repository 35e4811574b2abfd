/**
 * Runs before every page render: gives the page a fresh CSP nonce (on the request, where Next
 * reads it for its own inline scripts, and on the answer, where the browser enforces it). API
 * routes and static files get their fixed headers from next.config.ts instead.
 */
import { NextResponse, type NextRequest } from "next/server";
import { newNonce, pagePolicy } from "./lib/security-headers";

/** Adds the page policy with a new nonce to one page request and its answer. */
export function proxy(request: NextRequest): NextResponse {
  const nonce = newNonce();
  const policy = pagePolicy(nonce);
  const headers = new Headers(request.headers);
  headers.set("x-nonce", nonce);
  headers.set("content-security-policy", policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set("content-security-policy", policy);
  return response;
}

export const config = {
  // Pages only: not the API (its bodies must not pass through here), not build assets.
  matcher: [
    {
      source: "/((?!api/|_next/static|_next/image|favicon.ico).*)",
      missing: [{ type: "header", key: "next-router-prefetch" }],
    },
  ],
};
