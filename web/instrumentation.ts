/** Runs once when the Next server starts, before it answers any request. */
export async function register(): Promise<void> {
  // Only the Node server has sockets; the hook module imports node:http.
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { installPeerAddressHook } = await import("./lib/peer-address-hook");
    installPeerAddressHook();
  }
}
