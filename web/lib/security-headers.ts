/**
 * The content security policy of the app's pages. Scripts run only from our own origin or with
 * the per-request nonce, which Next puts on its own inline bootstrap scripts when it finds the
 * policy on the request (so no 'unsafe-inline' for scripts and no hashes to keep in step).
 *
 * Styles allow 'unsafe-inline' on purpose: React writes `style` attributes (the schematic and
 * waveform SVGs, bar widths), and a nonce cannot cover an attribute. Inline styles cannot run
 * code, so this keeps the part of the policy that stops script injection strict.
 */

/** The policy for one page answer, with its nonce. */
export function pagePolicy(nonce: string): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'`,
    "style-src 'self' 'unsafe-inline'",
    // Photos come from our own API; blob: is the preview of a photo before it is uploaded.
    "img-src 'self' blob: data:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

/** A fresh nonce: 128 random bits, base64 (what CSP nonces are written in). */
export function newNonce(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return btoa(String.fromCharCode(...bytes));
}
