/**
 * Next runs `register` once when the server starts, before it answers any request: it installs
 * the peer-address hook (sign-in limits count real client addresses), checks TRUSTED_PROXY_HOPS,
 * installs the page outage guard (a page whose queries lose the database answers 503, not 500),
 * and warms a record reader thread (loading the engine takes seconds, better here than inside
 * the first upload's request).
 */
export async function register(): Promise<void> {
  // Only the Node server has sockets and threads; the hook module imports node:http.
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { installPeerAddressHook, trustedProxyHops } = await import("./lib/peer-address-hook");
  // A mistyped TRUSTED_PROXY_HOPS stops the server here, with its own message, not per request.
  trustedProxyHops();
  installPeerAddressHook();
  const { installPageOutageGuard } = await import("./lib/page-outage-guard");
  installPageOutageGuard();
  const { warmRecordParsePool } = await import("./lib/record-parse/record-parse-pool");
  warmRecordParsePool();
}

/**
 * Next reports every failed request here. A page that lost the database is marked for a 503; the
 * mark is set synchronously (through the guard's installed hook, not a dynamic import) so it is
 * in place before Next writes the failed page's status.
 */
export function onRequestError(
  err: unknown,
  _request: unknown,
  context: { routeType: string },
): void {
  noteRequestErrorHook()?.(err, context.routeType);
}

/** The guard's marker, put on globalThis by installPageOutageGuard (Node runtime only). */
function noteRequestErrorHook() {
  return (globalThis as { teardownNoteRequestError?: (err: unknown, routeType: string) => void })
    .teardownNoteRequestError;
}
