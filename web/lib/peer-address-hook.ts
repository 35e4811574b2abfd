/**
 * Stamps each incoming request with its TCP peer's address, under a header a client cannot set.
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
