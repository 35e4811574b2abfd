/**
 * Where to go after signing in: only a path on this site. Browsers drop tabs and newlines from a
 * URL and read `\\` as `/`, so `/<tab>/host` or `/\\host` would leave the site; the path is
 * resolved the way a browser would and kept only when it stays on the same origin, and any
 * control character or backslash refuses it outright.
 */
export function safeNext(next: string | null | undefined, fallback = "/teams"): string {
  // eslint-disable-next-line no-control-regex -- control characters are exactly what is refused
  if (!next || !next.startsWith("/") || /[\u0000-\u001f\u007f\\]/.test(next)) return fallback;
  const base = "http://same-origin.invalid";
  let resolved: URL;
  try {
    resolved = new URL(next, base);
  } catch {
    return fallback;
  }
  if (resolved.origin !== base || next.startsWith("//")) return fallback;
  return resolved.pathname + resolved.search + resolved.hash;
}
