/**
 * Runs before every page render: gives the page a fresh CSP nonce (on the request, where Next
 * reads it for its own inline scripts, and on the answer, where the browser enforces it), and
 * answers 503 with a readable page while the database is restarting or unreachable (a page that
 * fails mid-render would otherwise answer 500). API routes answer their own 503 (api-error.ts);
 * they and static files get their fixed headers from next.config.ts.
 */
import { NextResponse, type NextRequest } from "next/server";
import { pingDatabase } from "./lib/database-ping";
import { OUTAGE_RETRY_AFTER_SECONDS, outagePageHtml } from "./lib/outage-page";
import { newNonce, pagePolicy } from "./lib/security-headers";

/** Adds the page policy with a new nonce to one page request and its answer. */
export async function proxy(request: NextRequest): Promise<NextResponse> {
  const nonce = newNonce();
  const policy = pagePolicy(nonce);
  if ((await pingDatabase()) === "away") {
    return new NextResponse(outagePageHtml(nonce), {
      status: 503,
      headers: {
        "content-type": "text/html; charset=utf-8",
        "content-security-policy": policy,
        "retry-after": String(OUTAGE_RETRY_AFTER_SECONDS),
        "cache-control": "no-store",
      },
    });
  }
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
