/**
 * The keyset cursor of text search: the last row's sort key and id, base64url JSON. Ranked pages
 * carry the rank as Postgres printed the `real` (so it compares exactly when cast back); unranked
 * pages carry the update time as Postgres printed it. Decoding checks every part before it can
 * reach SQL; anything else is null (the API answers 400 naming `cursor`).
 */

export type SearchCursor =
  { kind: "rank"; rank: string; id: string } | { kind: "time"; at: string; id: string };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
// How Postgres prints a real: digits, an optional fraction and exponent (never NaN or Infinity,
// which ts_rank does not produce).
const REAL_TEXT = /^\d{1,20}(\.\d{1,20})?(e[+-]?\d{1,2})?$/i;
/** Ranks are small non-negative numbers; a larger one could overflow the cast to real. */
const MAX_RANK = 1e6;
// How Postgres prints a timestamptz.
const TIME_TEXT = /^\d{4}-\d{2}-\d{2} \d{2}:\d{2}:\d{2}(\.\d{1,6})?[+-](0\d|1[0-5])(:[0-5]\d)?$/;
/** A cursor longer than this was not made here. */
export const MAX_CURSOR_CHARS = 300;

/** The cursor text of a page's last row. */
export function encodeSearchCursor(c: SearchCursor): string {
  const body = c.kind === "rank" ? { r: c.rank, id: c.id } : { t: c.at, id: c.id };
  return Buffer.from(JSON.stringify(body)).toString("base64url");
}

/** The cursor, or null when the text is not one encodeSearchCursor made. */
export function decodeSearchCursor(text: string): SearchCursor | null {
  if (text.length > MAX_CURSOR_CHARS || !/^[A-Za-z0-9_-]+$/.test(text)) return null;
  let body: unknown;
  try {
    body = JSON.parse(Buffer.from(text, "base64url").toString("utf8"));
  } catch {
    return null;
  }
  if (typeof body !== "object" || body === null) return null;
  const { r, t, id } = body as { r?: unknown; t?: unknown; id?: unknown };
  if (typeof id !== "string" || !UUID.test(id)) return null;
  if (typeof r === "string" && t === undefined && REAL_TEXT.test(r) && Number(r) <= MAX_RANK)
    return { kind: "rank", rank: r, id };
  if (typeof t === "string" && r === undefined && TIME_TEXT.test(t) && isRealTime(t))
    return { kind: "time", at: t, id };
  return null;
}

/** A calendar time that exists (31 February does not), so the cast in SQL cannot fail. */
function isRealTime(t: string): boolean {
  const [y, mo, d, h, mi, s] = t.slice(0, 19).split(/[- :]/).map(Number) as number[];
  const at = new Date(Date.UTC(y!, mo! - 1, d!, h!, mi!, s!));
  return (
    y! >= 1 &&
    at.getUTCFullYear() === y &&
    at.getUTCMonth() === mo! - 1 &&
    at.getUTCDate() === d &&
    at.getUTCHours() === h &&
    at.getUTCMinutes() === mi &&
    at.getUTCSeconds() === s
  );
}
