/**
 * The start prints `http://localhost:PORT`, but people (and scripts) open the same server as
 * `http://127.0.0.1:PORT` or `http://[::1]:PORT`. All three name this machine's loopback
 * interface, so when the app's own origin is one of them the others are trusted too; any other
 * host (a real name behind a proxy) gets no aliases.
 */

/** Host names that mean this machine's loopback interface. */
const LOOPBACK_HOSTS = ["localhost", "127.0.0.1", "[::1]"];

/** The other loopback spellings of `origin` (same scheme and port), or none for a real host. */
export function loopbackAliases(origin: string): string[] {
  let url: URL;
  try {
    url = new URL(origin);
  } catch {
    return [];
  }
  if (!LOOPBACK_HOSTS.includes(url.hostname)) return [];
  const port = url.port ? `:${url.port}` : "";
  return LOOPBACK_HOSTS.filter((h) => h !== url.hostname).map(
    (h) => `${url.protocol}//${h}${port}`,
  );
}
