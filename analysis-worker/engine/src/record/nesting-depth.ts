/**
 * How deep JSON text nests, counted without parsing it. A record is a few levels deep; text
 * nested 100k levels deep exhausts the memory or stack of whatever reads it next (the YAML
 * reader, a validator, a recursive walk), so readers refuse it before parsing.
 */

/** The deepest nesting of objects and arrays a record or JSON body may have. */
export const MAX_NESTING_DEPTH = 64;

/**
 * The nesting depth of JSON text, counted from brackets outside strings, stopping as soon as it
 * passes `limit`: returns the 0-based character offset where it did, or -1.
 */
export function nestingExceededAt(text: string, limit = MAX_NESTING_DEPTH): number {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 0x5c)
        i++; // backslash: skip the escaped character
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x7b || c === 0x5b) {
      if (++depth > limit) return i;
    } else if (c === 0x7d || c === 0x5d) depth--;
  }
  return -1;
}
