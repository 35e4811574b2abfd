/**
 * The search page's whole state lives in its URL, so a search can be shared and the back button
 * steps through it. This file reads that state from the query string and writes it back; the
 * page never keeps a second copy. Three views share the page:
 * - words and facts: `q`, one parameter per facet value (`category=a&category=b`), `cursor`;
 * - similar circuits: `similar=ENTRY_ID`;
 * - circuit fragment: `view=fragment`, the pasted `fragment` text and its `format`.
 */
import type { FragmentFormat } from "../../client/api-types";

/** The facets a text search filters by; several values of one facet are alternatives. */
export const FACETS = ["team", "category", "supply", "block", "flag", "mismatch"] as const;
export type Facet = (typeof FACETS)[number];

export const FRAGMENT_FORMATS: readonly FragmentFormat[] = ["record", "deck", "csv"];

/** Results per page of a text search. */
export const SEARCH_PAGE_SIZE = 20;
/** How many similar circuits are listed. */
export const SIMILAR_LIMIT = 20;

export interface TextSearchState {
  view: "text";
  q: string;
  filters: Record<Facet, string[]>;
  cursor: string | null;
}
export interface SimilarState {
  view: "similar";
  entryId: string;
}
export interface FragmentState {
  view: "fragment";
  text: string;
  format: FragmentFormat;
}
export type SearchState = TextSearchState | SimilarState | FragmentState;

/** A text search with nothing typed and nothing picked. */
export function emptyTextSearch(): TextSearchState {
  return {
    view: "text",
    q: "",
    filters: Object.fromEntries(FACETS.map((f) => [f, []])) as unknown as Record<Facet, string[]>,
    cursor: null,
  };
}

/** Reads the page's state from its query string (unknown parameters are ignored). */
export function readSearchState(params: URLSearchParams): SearchState {
  const similar = params.get("similar")?.trim();
  if (similar) return { view: "similar", entryId: similar };
  if (params.get("view") === "fragment") {
    const format = params.get("format");
    return {
      view: "fragment",
      text: params.get("fragment") ?? "",
      format: FRAGMENT_FORMATS.includes(format as FragmentFormat)
        ? (format as FragmentFormat)
        : "deck",
    };
  }
  const state = emptyTextSearch();
  state.q = params.get("q") ?? "";
  for (const f of FACETS)
    state.filters[f] = [...new Set(params.getAll(f).filter((v) => v !== ""))].sort();
  state.cursor = params.get("cursor") || null;
  return state;
}

/** The query string of a text search, shared by the page's URL and the API's. */
function textParams(s: TextSearchState): URLSearchParams {
  const p = new URLSearchParams();
  if (s.q.trim()) p.set("q", s.q.trim());
  for (const f of FACETS) for (const v of s.filters[f]) p.append(f, v);
  if (s.cursor) p.set("cursor", s.cursor);
  return p;
}

/** The page's own address for a state. */
export function searchHref(s: SearchState): string {
  let p: URLSearchParams;
  if (s.view === "similar") p = new URLSearchParams({ similar: s.entryId });
  else if (s.view === "fragment") {
    p = new URLSearchParams({ view: "fragment", format: s.format });
    if (s.text) p.set("fragment", s.text);
  } else p = textParams(s);
  const qs = p.toString();
  return qs ? `/search?${qs}` : "/search";
}

/** GET /api/search for a text search, one page. */
export function searchApiUrl(s: TextSearchState): string {
  const p = textParams(s);
  p.set("limit", String(SEARCH_PAGE_SIZE));
  return `/api/search?${p.toString()}`;
}

/** The same search with one facet value picked or unpicked; back to the first page. */
export function toggleFacetValue(s: TextSearchState, facet: Facet, value: string): TextSearchState {
  const had = s.filters[facet].includes(value);
  const values = had ? s.filters[facet].filter((v) => v !== value) : [...s.filters[facet], value];
  return { ...s, filters: { ...s.filters, [facet]: values.sort() }, cursor: null };
}

/** How many facet values are picked in all. */
export function pickedCount(s: TextSearchState): number {
  return FACETS.reduce((n, f) => n + s.filters[f].length, 0);
}

/** The compare page for two entries. */
export function compareHref(a: string, b: string): string {
  return `/compare?${new URLSearchParams({ a, b }).toString()}`;
}
