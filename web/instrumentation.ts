/** Runs once when the Next server starts, before it answers any request. */
export async function register(): Promise<void> {
  // Only the Node server has sockets; the hook module imports node:http.
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { installPeerAddressHook, trustedProxyHops } = await import("./lib/peer-address-hook");
    // A mistyped TRUSTED_PROXY_HOPS stops the server here, with its own message, not per request.
    trustedProxyHops();
    installPeerAddressHook();
  }
}
