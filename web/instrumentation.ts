/**
 * Next runs `register` once when the server starts, before it answers any request: it installs
 * the peer-address hook (sign-in limits count real client addresses), checks TRUSTED_PROXY_HOPS,
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
  const { warmRecordParsePool } = await import("./lib/record-parse/record-parse-pool");
  warmRecordParsePool();
}
