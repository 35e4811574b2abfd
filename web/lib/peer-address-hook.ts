/**
 * Where a request comes from: each incoming request is stamped with its TCP peer's address,
 * under a header a client cannot set, and TRUSTED_PROXY_HOPS says how many proxies to believe.
 * Why a hook: Next's server keeps a client-sent `X-Forwarded-For` as it is and only fills it
 * from the socket when absent, and gives route handlers no socket, so without this a client
 * could choose the address its rate limits count against.
 */
import http from "node:http";

/**
 * The header carrying the TCP peer's address. The hook overwrites whatever a client sent under
 * this name, so it is the one address nobody can forge.
 */
export const PEER_ADDRESS_HEADER = "x-teardown-peer";

/** Overwrites the peer header of one request with its socket's address. */
export function stampPeerAddress(req: http.IncomingMessage): void {
  req.headers[PEER_ADDRESS_HEADER] = req.socket?.remoteAddress ?? "unknown";
}

const globalForHook = globalThis as unknown as { teardownPeerHook?: boolean };

/** Wraps every HTTP server's "request" event (once per process) so the stamp comes first. */
export function installPeerAddressHook(): void {
  if (globalForHook.teardownPeerHook) return;
  globalForHook.teardownPeerHook = true;
  const emit = http.Server.prototype.emit;
  http.Server.prototype.emit = function (
    this: http.Server,
    event: string | symbol,
    ...args: unknown[]
  ): boolean {
    if (event === "request") stampPeerAddress(args[0] as http.IncomingMessage);
    return Reflect.apply(emit, this, [event, ...args]) as boolean;
  } as typeof emit;
}

/**
 * How many proxies in front of the app to believe (`TRUSTED_PROXY_HOPS`, default 0). With 0 the
 * client's own `X-Forwarded-For` is ignored; with 1 the address the nearest proxy appended is
 * used, and so on. A value that is not a small whole number stops the web server at start
 * (instrumentation.ts reads it once) and is read again per request, so a test can change it.
 */
export function trustedProxyHops(): number {
  const raw = process.env.TRUSTED_PROXY_HOPS ?? "0";
  if (!/^[0-9]$/.test(raw.trim())) {
    throw new Error(`TRUSTED_PROXY_HOPS must be a whole number from 0 to 9 (got "${raw}")`);
  }
  return Number(raw.trim());
}
