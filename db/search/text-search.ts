/**
 * Text search with facets. Words match a weighted full-text vector (title A; category and tags
 * B; summary, part kinds, markings, values and notes C) and, for members of the entry's team
 * only, its comments (weight D, since comments stay with the team). Filters: several values per
 * facet are alternatives (OR); different facets must all hold (AND). Each facet's counts are
 * taken under the words and every other facet's filter but not its own, so picking one
 * category still shows how many the others would give. Visibility is inside every statement.
 *
 * Bounded work at any size. A common word can match a third of a 100,000-entry repository, and
 * ranking or counting every match means reading every matching row (rows are wide: the search
 * text, fingerprint and structure live beside them), far beyond the 30 ms budget. So:
 * - Ranking: at most `rankCap` matches (under the words, the visibility rule and every filter)
 *   are ranked, taken in the order the full-text index hands them over (storage order), which
 *   lets the scan stop at the cap instead of reading every match. When more match, the page says
 *   so (`rankedAll: false`); narrowing by a word or a facet brings the set under the cap, where
 *   the ranking is exact over every match. Cursor pages walk the same capped set.
 * - Facet counts: taken over at most `facetSample` matches (under the words and the visibility
 *   rule), found the same way. Below the cap the counts are exact; above it they are lower
 *   bounds (`facetsExact: false`) and the page shows them as "at least".
 * Both caps are 500: ranking 500 rows and counting six facets over them takes a few
 * milliseconds, and a repository's search rarely needs to order more than that before a person
 * adds a word. Without words, the newest entries come first (an index on the update time) and
 * the facets are counted the same capped way.
 */
import { sql, type SQL } from "drizzle-orm";
import type { Database } from "../client.js";
import { encodeSearchCursor, type SearchCursor } from "./search-cursor.js";
import {
  facetFilter,
  facetValue,
  SEARCH_FACETS,
  type FacetCount,
  type SearchFacet,
} from "./text-search-facets.js";
import { viewersTeam, visibleEntry } from "./visibility.js";

export { SEARCH_FACETS, type FacetCount, type SearchFacet } from "./text-search-facets.js";

/** The most matches ranked (see the module comment). */
export const RANK_CAP = 500;
/** The most matches the facets are counted over (see the module comment). */
export const FACET_SAMPLE = 500;

export interface TextSearchQuery {
  q?: string | undefined;
  /** Facet -> the values any of which an entry must have. */
  filters: Partial<Record<SearchFacet, string[]>>;
  limit: number;
  cursor?: SearchCursor | undefined;
  /** Smaller caps, for tests on small data (default RANK_CAP and FACET_SAMPLE). */
  caps?: { rank: number; facets: number };
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
  /** False when more entries matched than the facets were counted over: counts are lower bounds. */
  facetsExact: boolean;
  /** False when more entries matched than were ranked: the hits are the best of the first ones. */
  rankedAll: boolean;
  nextCursor: string | null;
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
  const rankCap = query.caps?.rank ?? RANK_CAP;
  const facetCap = query.caps?.facets ?? FACET_SAMPLE;
  const tsq = sql`websearch_to_tsquery('simple', ${words})`;
  const visible = visibleEntry("e", viewerId);
  const filters = SEARCH_FACETS.map((f) => facetFilter(f, query.filters[f], viewerId));
  const allFilters = sql.join(
    filters.map((f) => f ?? sql`true`),
    sql` and `,
  );
  // The facet sample's columns, with whether each facet's own filter holds.
  const sampleColumns = sql`e.id, e.team_id, e.category, e.search_supply, e.search_flags,
    e.search_blocks, e.has_mismatch, ${sql.join(
      SEARCH_FACETS.map((f, i) => sql`${filters[i] ?? sql`true`} as ${sql.raw(`f_${f}`)}`),
      sql`, `,
    )}`;

  // Comment hits (members of the entry's team only), at most the rank cap of comments, each
  // entry ranked by its best comment.
  const commentsFound = ranked
    ? sql`select c.entry_id as id, ts_rank(c.search_vector, ${tsq}) as r
        from comments c join entries y on y.id = c.entry_id
        where c.search_vector @@ ${tsq} and ${viewersTeam("y", viewerId)} limit ${rankCap + 1}`
    : sql`select null::uuid as id, 0::real as r where false`;
  // Without filters, the ranked set is the facet sample itself (one scan, not two).
  const reuseSample = ranked && filters.every((f) => f === null) && rankCap <= facetCap;
  // Without ORDER BY the scans stop at the cap (see the module comment).
  const sampleWords = ranked
    ? sql`select ${sampleColumns}, ${reuseSample ? sql`ts_rank(e.search_vector, ${tsq})` : sql`0::real`} as r
        from entries e where e.search_vector @@ ${tsq} and ${visible} limit ${facetCap + 1}`
    : sql`select ${sampleColumns}, 0::real as r from entries e where ${visible} limit ${facetCap + 1}`;
  // Entries found by a comment join the sample (once each).
  const sample = sql`select distinct on (u.id) * from (select * from (select * from sample_words limit ${facetCap}) w
    union all select ${sampleColumns}, 0::real from cm join entries e on e.id = cm.id where ${visible}) u`;

  const c = query.cursor;
  const page = ranked
    ? sql`found as materialized (${
        reuseSample
          ? sql`select w.id, w.r from sample_words w limit ${rankCap + 1}`
          : sql`select e.id, ts_rank(e.search_vector, ${tsq}) as r from entries e
              where e.search_vector @@ ${tsq} and ${visible} and ${allFilters} limit ${rankCap + 1}`
      }),
      parts as materialized (
        (select f.id, f.r from found f limit ${rankCap})
        union all
        (select e.id, cm.r from cm join entries e on e.id = cm.id
          where ${visible} and ${allFilters})
      ), scored as (select p.id, sum(p.r)::real as rank from parts p group by p.id),
      page as (select s.id, s.rank::text as rank_text, null::text as at_text,
          row_number() over (order by s.rank desc, s.id desc)::int as ord from scored s
        where ${c?.kind === "rank" ? sql`(s.rank, s.id) < (${c.rank}::real, ${c.id}::uuid)` : c ? sql`false` : sql`true`}
        order by s.rank desc, s.id desc limit ${query.limit + 1}),
      ranked_count as (select count(*)::int as n from found)`
    : sql`page as (select e.id, null::text as rank_text, e.updated_at::text as at_text,
          row_number() over (order by e.updated_at desc, e.id desc)::int as ord from entries e
        where ${visible} and ${allFilters}
          and ${c?.kind === "time" ? sql`(e.updated_at, e.id) < (${c.at}::timestamptz, ${c.id}::uuid)` : c ? sql`false` : sql`true`}
        order by e.updated_at desc, e.id desc limit ${query.limit + 1}),
      ranked_count as (select 0 as n)`;

  const facetQueries = SEARCH_FACETS.map((f) => {
    const others = SEARCH_FACETS.filter((g) => g !== f).map((g) => sql.raw(`b.f_${g}`));
    // Team values are the viewer's team ids (uuid text); each is named.
    const label =
      f === "team" ? sql`(select t.name from teams t where t.id = v::uuid)` : sql`null::text`;
    return sql`select ${f}::text as facet, v as value, count(*)::int as count, ${label} as label
      from (select ${facetValue(f, viewerId)} as v from sample b where ${sql.join(others, sql` and `)}) s
      where v is not null group by v`;
  });

  return db.transaction(async (tx) => {
    // With a LIMIT, the planner likes a sequential scan that tests the words on each row; but that
    // reads each row's full-text vector out of line storage, where the index answers the words
    // without reading any vector. Within this transaction only, it is told to prefer the index.
    // JIT compiling is off too: it costs more than these short statements ever run.
    await tx.execute(
      sql`select set_config('enable_seqscan', 'off', true), set_config('jit', 'off', true)`,
    );
    const rows = await tx.execute<{
      kind: "hit" | "facet" | "meta";
      facet: string | null;
      value: string | null;
      count: number | null;
      id: string | null;
      rank_text: string | null;
      at_text: string | null;
      /** A hit's snippet; a team's name. */
      label: string | null;
    }>(sql`
      with cm_found as materialized (${commentsFound}),
      cm as (select id, max(r) as r from cm_found group by id),
      sample_words as materialized (${sampleWords}),
      sample as materialized (${sample}),
      ${page},
      facets as (${sql.join(facetQueries, sql` union all `)})
      select 'hit' as kind, null as facet, null as value, p.ord as count, p.id, p.rank_text, p.at_text,
        ${ranked ? headline(tsq) : sql`''`} as label
        from page p join entries e on e.id = p.id
      union all
      select 'facet', f.facet, f.value, f.count, null, null, null, f.label from facets f
      union all
      select 'meta', 'sample', null, (select count(*)::int from sample_words), null, null, null, null
      union all
      select 'meta', 'ranked', null, (select n from ranked_count), null, null, null, null
      union all
      select 'meta', 'comments', null, (select count(*)::int from cm_found), null, null, null, null`);
    const hits = rows.rows.filter((r) => r.kind === "hit");
    // The page's order, as SQL numbered it (a union keeps no order).
    hits.sort((a, b) => a.count! - b.count!);
    const pageRows = hits.slice(0, query.limit);
    const meta = (name: string) => rows.rows.find((r) => r.kind === "meta" && r.facet === name)!;
    const facets = Object.fromEntries(SEARCH_FACETS.map((f) => [f, [] as FacetCount[]])) as Record<
      SearchFacet,
      FacetCount[]
    >;
    for (const r of rows.rows)
      if (r.kind === "facet")
        facets[r.facet as SearchFacet].push(
          r.label === null
            ? { value: r.value!, count: r.count! }
            : { value: r.value!, count: r.count!, label: r.label },
        );
    for (const list of Object.values(facets))
      list.sort(
        (a, b) => b.count - a.count || (a.value < b.value ? -1 : a.value > b.value ? 1 : 0),
      );
    const last = pageRows[pageRows.length - 1];
    const nextCursor =
      hits.length > query.limit && last
        ? encodeSearchCursor(
            ranked
              ? { kind: "rank", rank: last.rank_text!, id: last.id! }
              : { kind: "time", at: last.at_text!, id: last.id! },
          )
        : null;
    return {
      hits: pageRows.map((p) => ({
        id: p.id!,
        score: ranked ? Number(p.rank_text) : 0,
        snippet: ranked ? markedHtml(p.label ?? "") : "",
      })),
      facets,
      facetsExact: meta("sample").count! <= facetCap && meta("comments").count! <= rankCap,
      rankedAll: meta("ranked").count! <= rankCap && meta("comments").count! <= rankCap,
      nextCursor,
    };
  });
}

/** A hit's highlighted snippet over `e` (costly, so only ever for the rows of one page). */
function headline(tsq: SQL): SQL {
  return sql`ts_headline('simple',
    translate(concat_ws(' · ', e.title, e.category, nullif(e.search_tags, ''), e.search_text), ${MARK_START + MARK_STOP}, '  '),
    ${tsq},
    ${`StartSel=${MARK_START}, StopSel=${MARK_STOP}, MaxWords=30, MinWords=10, MaxFragments=2, FragmentDelimiter=" … "`})`;
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
