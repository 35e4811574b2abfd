/**
 * The query strings and body of the search routes, checked once here: facet filters may repeat
 * (`category=a&category=b` means either), the cursor is one the API gave out (else 400 naming
 * `cursor`), and a fragment is read with the circuit readers (else 422 with line and path).
 */
import { z } from "zod";
import {
  decodeSearchCursor,
  SEARCH_FACETS,
  type SearchFacet,
  type TextSearchQuery,
} from "@teardown/db";
import { ApiError } from "../api-error";
import { nulByte, validate } from "../request-body";
import { readFragment, type FragmentFormat } from "./fragment-text";
import type { TeardownRecord } from "@teardown/engine";

/** The most results one page may hold. */
export const MAX_SEARCH_LIMIT = 100;
/** The page size when none is asked for. */
export const DEFAULT_SEARCH_LIMIT = 20;
/** The most values one facet filter may list. */
const MAX_FACET_VALUES = 20;
/** The most characters a pasted fragment may have. */
export const MAX_FRAGMENT_CHARS = 20_000;

const limitSchema = z.coerce
  .number()
  .int()
  .min(1)
  .max(MAX_SEARCH_LIMIT)
  .default(DEFAULT_SEARCH_LIMIT);
const facetValue = z.string().min(1).max(200);

/** GET /api/search's query. */
export function readTextSearchQuery(req: Request): TextSearchQuery {
  const params = new URL(req.url).searchParams;
  for (const [k, v] of params)
    if (k.includes("\u0000") || v.includes("\u0000")) throw nulByte(k.replaceAll("\u0000", ""));
  const filters: Partial<Record<SearchFacet, string[]>> = {};
  for (const facet of SEARCH_FACETS) {
    const values = params.getAll(facet).filter((v) => v !== "");
    if (values.length === 0) continue;
    filters[facet] = validate(
      facet === "mismatch"
        ? z.array(z.enum(["true", "false"])).max(2)
        : z.array(facetValue).max(MAX_FACET_VALUES),
      values,
      `\`${facet}\` filter`,
    );
  }
  const q = validate(z.string().max(200).optional(), params.get("q") || undefined, "`q`");
  const limit = validate(limitSchema, params.get("limit") || undefined, "`limit`");
  const cursorText = params.get("cursor") || undefined;
  let cursor;
  if (cursorText !== undefined) {
    cursor = decodeSearchCursor(cursorText) ?? undefined;
    if (cursor === undefined)
      throw new ApiError(400, "invalid-cursor", "the cursor is not one this API gave out", {
        path: "cursor",
      });
  }
  return { q, filters, limit, cursor };
}

/** GET /api/entries/:id/similar's `limit`. */
export function readSimilarLimit(req: Request): number {
  const v = new URL(req.url).searchParams.get("limit") || undefined;
  return validate(limitSchema, v, "`limit`");
}

const fragmentBody = z.object({
  text: z.string().min(1).max(MAX_FRAGMENT_CHARS),
  format: z.enum(["record", "deck", "csv"]).optional(),
  limit: limitSchema.optional(),
});

/** POST /api/search/fragment's body, read into a record (422 with line and path otherwise). */
export function readFragmentRequest(body: z.infer<typeof fragmentBody>): {
  fragment: TeardownRecord;
  limit: number;
} {
  const format: FragmentFormat = body.format ?? "record";
  const read = readFragment(body.text, format);
  if (!read.ok) {
    const first = read.errors[0];
    throw new ApiError(
      422,
      "invalid-fragment",
      `the fragment does not read as ${format}: ${first ? `${first.path || "(text)"}${first.line !== null ? ` (line ${first.line})` : ""}: ${first.message}` : "unknown problem"}`,
      {
        path: "text",
        errors: read.errors.map((e) => ({
          path: e.path,
          message: e.message,
          code: e.code,
          line: e.line,
          column: e.column,
        })),
      },
    );
  }
  if (read.record.parts.length === 0)
    throw new ApiError(422, "invalid-fragment", "the fragment has no parts", { path: "text" });
  return { fragment: read.record, limit: body.limit ?? DEFAULT_SEARCH_LIMIT };
}

export { fragmentBody };
