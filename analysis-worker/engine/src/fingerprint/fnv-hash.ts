/**
 * FNV-1a, 32 bits (Fowler, Noll and Vo), over the UTF-8 octets of a string, returned as a
 * signed 32-bit integer so that it fits a Postgres int4 column unchanged.
 */

/** The FNV-1a 32-bit offset basis. */
const FNV_OFFSET_BASIS_32 = 0x811c9dc5;
/** The FNV 32-bit prime. */
const FNV_PRIME_32 = 0x01000193;

const UTF8 = new TextEncoder();

/** FNV-1a hash of a string's UTF-8 octets as a signed 32-bit integer (-2^31 .. 2^31-1). */
export function fnv1a32(text: string): number {
  let hash = FNV_OFFSET_BASIS_32;
  // ASCII text is its own UTF-8: hash the char codes without encoding (the labels are ASCII, and
  // encoding every label was most of the fingerprint's time).
  let ascii = true;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c >= 0x80) {
      ascii = false;
      break;
    }
    hash ^= c;
    hash = Math.imul(hash, FNV_PRIME_32);
  }
  if (ascii) return hash | 0;
  hash = FNV_OFFSET_BASIS_32;
  for (const octet of UTF8.encode(text)) {
    hash ^= octet;
    // Math.imul keeps the product modulo 2^32, as the algorithm needs.
    hash = Math.imul(hash, FNV_PRIME_32);
  }
  return hash | 0;
}
