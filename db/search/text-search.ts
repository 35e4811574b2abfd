/**
 * Text search with facets. Words match a weighted full-text vector (title A; category and tags
 * B; summary, part kinds, markings, values and notes C) and, for members of the entry's team
 * only, its comments (weight D, since comments stay with the team). Filters: several values per
 * facet are alternatives (OR); different facets must all hold (AND). Each facet's counts are
 * taken under the words and every other facet's filter but not its own, so picking one
 * category still shows how many the others would give. Visibility is inside every statement.
 * Ranked by ts_rank (a `real`), then id; without words, newest update first.
 */
import { sql, type SQL } from "drizzle-orm";
import type { Database } from "../client.js";
import { textArrayParam } from "./array-param.js";
import { encodeSearchCursor, type SearchCursor } from "./search-cursor.js";
import { viewersTeam, visibleEntry } from "./visibility.js";

/** The facets a search counts and filters by. */
export const SEARCH_FACETS = ["category", "flag", "block", "supply", "team", "mismatch"] as const;
export type SearchFacet = (typeof SEARCH_FACETS)[number];

export interface TextSearchQuery {
  q?: string | undefined;
  /** Facet -> the values any of which an entry must have. */
  filters: Partial<Record<SearchFacet, string[]>>;
  limit: number;
  cursor?: SearchCursor | undefined;
}

export interface FacetCount {
  value: string;
  count: number;
}

export interface TextSearchHit {
  id: string;
  score: number;
  /** HTML-escaped text with each matched word inside <mark>…</mark>; "" without words. */
  snippet: string;
}

export interface TextSearchPage {
  hits: TextSearchHit[];
  facets: Record<SearchFacet, FacetCount[]>;
  nextCursor: string | null;
}

/** The SQL value each facet is counted by, over the `base` rows. */
function facetValue(facet: SearchFacet): SQL {
  switch (facet) {
    case "category":
      return sql`b.category`;
    case "flag":
      return sql`unnest(b.search_flags)`;
    case "block":
      return sql`unnest(b.search_blocks)`;
    case "supply":
      return sql`b.search_supply`;
    case "team":
      return sql`b.team_id::text`;
    case "mismatch":
      return sql`case when b.has_mismatch then 'true' else 'false' end`;
  }
}

/** The filter of one facet over `e` (null when the query does not filter by it). */
function facetFilter(facet: SearchFacet, values: string[] | undefined): SQL | null {
  if (values === undefined || values.length === 0) return null;
  const list = textArrayParam(values);
  switch (facet) {
    case "category":
      return sql`e.category = any(${list}::text[])`;
    case "flag":
      return sql`e.search_flags && ${list}::text[]`;
    case "block":
      return sql`e.search_blocks && ${list}::text[]`;
    case "supply":
      return sql`e.search_supply = any(${list}::text[])`;
    case "team":
      // Team ids are compared as text so a malformed one matches nothing instead of failing.
      return sql`e.team_id::text = any(${list}::text[])`;
    case "mismatch": {
      const wanted = values.filter((v) => v === "true" || v === "false");
      return wanted.length === 0
        ? sql`false`
        : sql`e.has_mismatch = any(${`{${wanted.join(",")}}`}::boolean[])`;
    }
  }
}

/** Snippet markers: control characters that cannot survive in the source (they are stripped). */
const MARK_START = "\u0002";
const MARK_STOP = "\u0003";

/** One page of hits, every facet's counts and the next page's cursor. */
export async function searchText(
  db: Database,
  viewerId: string | null,
  query: TextSearchQuery,
): Promise<TextSearchPage> {
  const words = query.q?.trim() ?? "";
  const ranked = words !== "";
  const tsq = sql`websearch_to_tsquery('simple', ${words})`;
  // Comment hits (members of the entry's team only), ranked once and joined, rather than looked
  // up per matched entry.
  const commentHits = ranked
    ? sql`select c.entry_id as id, max(ts_rank(c.search_vector, ${tsq})) as r
        from comments c join entries y on y.id = c.entry_id
        where c.search_vector @@ ${tsq} and ${viewersTeam("y", viewerId)} group by c.entry_id`
    : sql`select null::uuid as id, 0::real as r where false`;
  // A union of ids, so the entries' own GIN index answers the words (an OR would not use it).
  const source = ranked
    ? sql`(select x.id from entries x where x.search_vector @@ ${tsq} union select id from cm) ids
        join entries e on e.id = ids.id left join cm on cm.id = e.id`
    : sql`entries e left join cm on false`;
  const rank = ranked
    ? sql`(ts_rank(e.search_vector, ${tsq}) + coalesce(cm.r, 0))::real`
    : sql`0::real`;
  const filters = SEARCH_FACETS.map((f) => facetFilter(f, query.filters[f]));
  const flagColumns = SEARCH_FACETS.map(
    (f, i) => sql`${filters[i] ?? sql`true`} as ${sql.raw(`f_${f}`)}`,
  );
  const base = sql`select e.id, e.team_id, e.category, e.search_supply, e.search_flags,
      e.search_blocks, e.has_mismatch, e.updated_at, ${rank} as rank, ${sql.join(flagColumns, sql`, `)}
    from ${source} where ${visibleEntry("e", viewerId)}`;
  const allFilters = sql.join(
    SEARCH_FACETS.map((f) => sql.raw(`b.f_${f}`)),
    sql` and `,
  );

  const c = query.cursor;
  const after =
    c === undefined
      ? sql`true`
      : c.kind === "rank"
        ? sql`(b.rank, b.id) < (${c.rank}::real, ${c.id}::uuid)`
        : sql`(b.updated_at, b.id) < (${c.at}::timestamptz, ${c.id}::uuid)`;
  const order = ranked ? sql`b.rank desc, b.id desc` : sql`b.updated_at desc, b.id desc`;

  const facetQueries = SEARCH_FACETS.map((f) => {
    const others = SEARCH_FACETS.filter((g) => g !== f).map((g) => sql.raw(`b.f_${g}`));
    return sql`select ${f}::text as facet, v as value, count(*)::int as count
      from (select ${facetValue(f)} as v from base b where ${sql.join(others, sql` and `)}) s
      where v is not null group by v`;
  });

  return db.transaction(async (tx) => {
    const rows = await tx.execute<{
      kind: "hit" | "facet";
      facet: string | null;
      value: string | null;
      count: number | null;
      id: string | null;
      rank_text: string | null;
      at_text: string | null;
    }>(sql`
      with cm as (${commentHits}),
      base as materialized (${base}),
      page as (select b.id, b.rank::text as rank_text, b.updated_at::text as at_text from base b
        where ${allFilters} and ${after} order by ${order} limit ${query.limit + 1}),
      facets as (${sql.join(facetQueries, sql` union all `)})
      select 'hit' as kind, null as facet, null as value, null::int as count, p.id, p.rank_text, p.at_text
        from page p
      union all
      select 'facet', f.facet, f.value, f.count, null, null, null from facets f`);
    const hits = rows.rows.filter((r) => r.kind === "hit");
    const page = hits.slice(0, query.limit);
    const facets = Object.fromEntries(SEARCH_FACETS.map((f) => [f, [] as FacetCount[]])) as Record<
      SearchFacet,
      FacetCount[]
    >;
    for (const r of rows.rows)
      if (r.kind === "facet")
        facets[r.facet as SearchFacet].push({ value: r.value!, count: r.count! });
    for (const list of Object.values(facets))
      list.sort(
        (a, b) => b.count - a.count || (a.value < b.value ? -1 : a.value > b.value ? 1 : 0),
      );
    const last = page[page.length - 1];
    const nextCursor =
      hits.length > query.limit && last
        ? encodeSearchCursor(
            ranked
              ? { kind: "rank", rank: last.rank_text!, id: last.id! }
              : { kind: "time", at: last.at_text!, id: last.id! },
          )
        : null;
    const snippets = ranked
      ? await snippetsOf(
          tx,
          page.map((p) => p.id!),
          words,
        )
      : new Map();
    return {
      hits: page.map((p) => ({
        id: p.id!,
        score: Number(p.rank_text),
        snippet: snippets.get(p.id!) ?? "",
      })),
      facets,
      nextCursor,
    };
  });
}

/** Highlighted snippets for one page (ts_headline is costly, so never for more than a page). */
async function snippetsOf(
  db: Pick<Database, "execute">,
  ids: string[],
  words: string,
): Promise<Map<string, string>> {
  if (ids.length === 0) return new Map();
  const rows = await db.execute<{ id: string; snippet: string }>(sql`
    select e.id, ts_headline('simple',
      translate(concat_ws(' · ', e.title, e.category, nullif(e.search_tags, ''), e.search_text), ${MARK_START + MARK_STOP}, '  '),
      websearch_to_tsquery('simple', ${words}),
      ${`StartSel=${MARK_START}, StopSel=${MARK_STOP}, MaxWords=30, MinWords=10, MaxFragments=2, FragmentDelimiter=" … "`}) as snippet
    from entries e where e.id = any(${textArrayParam(ids)}::uuid[])`);
  return new Map(rows.rows.map((r) => [r.id, markedHtml(r.snippet)]));
}

/** Escapes the text for HTML, then turns the markers into <mark> elements. */
function markedHtml(text: string): string {
  return text
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;")
    .replaceAll(MARK_START, "<mark>")
    .replaceAll(MARK_STOP, "</mark>");
}
