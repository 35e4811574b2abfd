/**
 * Similar circuits: candidates by the rarer fingerprint features (see rare-features.ts), then
 * ranked in SQL by the Jaccard similarity of the topology-only fingerprints; the value features'
 * Jaccard only orders equal topology scores (it never outweighs structure). Never the entry
 * itself; visibility is inside the statement; rows whose features are from an older definition
 * (not yet backfilled) are left out rather than compared wrongly.
 */
import { sql } from "drizzle-orm";
import type { Database } from "../client.js";
import { intArrayParam, textArrayParam } from "./array-param.js";
import { rareFeatures, type FeatureStats } from "./rare-features.js";
import { visibleEntry } from "./visibility.js";

export interface SimilarHit {
  id: string;
  /** Jaccard similarity of the topology fingerprints, 0..1. */
  score: number;
  /** Jaccard similarity of the value features (the tie-break). */
  valueScore: number;
  /** Block kinds both entries have. */
  sharedBlocks: string[];
}

/** How long the column statistics are trusted before they are read again, in milliseconds. */
const STATS_TTL_MS = 60_000;
let statsCache: { at: number; stats: FeatureStats | null } | null = null;

/** The fingerprint column's element frequencies (cached a minute per process). */
export async function fingerprintStats(db: Database, fresh = false): Promise<FeatureStats | null> {
  if (!fresh && statsCache && Date.now() - statsCache.at < STATS_TTL_MS) return statsCache.stats;
  const rows = await db.execute<{ elems: string | null; freqs: number[] | null; rows: number }>(sql`
    select s.most_common_elems::text as elems, s.most_common_elem_freqs as freqs,
      greatest(c.reltuples, 0)::float8 as rows
    from pg_class c left join pg_stats s
      on s.schemaname = current_schema() and s.tablename = 'entries' and s.attname = 'fingerprint'
    where c.oid = 'entries'::regclass`);
  const r = rows.rows[0];
  let stats: FeatureStats | null = null;
  if (r && r.elems && r.freqs && r.rows > 0) {
    const elems = r.elems.replace(/[{}]/g, "").split(",").map(Number);
    // most_common_elem_freqs holds one frequency per element, then the minimum, the maximum
    // and the null fraction.
    const common = new Map(elems.map((e, i) => [e, Number(r.freqs![i])]));
    stats = { rows: Number(r.rows), common, floor: Number(r.freqs[elems.length]) };
  }
  statsCache = { at: Date.now(), stats };
  return stats;
}

/** The entry's features, or null when it has none of the current definition. */
export async function entryFeatures(
  db: Database,
  entryId: string,
  version: number,
): Promise<{ fingerprint: number[]; valueFeatures: number[]; blocks: string[] } | null> {
  const rows = await db.execute<{
    fingerprint: number[];
    value_features: number[];
    search_blocks: string[];
  }>(
    sql`select fingerprint, value_features, search_blocks from entries
      where id = ${entryId} and fingerprint_version = ${version}`,
  );
  const r = rows.rows[0];
  return r
    ? { fingerprint: r.fingerprint, valueFeatures: r.value_features, blocks: r.search_blocks }
    : null;
}

export interface SimilarQuery {
  /** The entry whose neighbours are wanted (left out of the answer). */
  entryId: string | null;
  fingerprint: number[];
  valueFeatures: number[];
  blocks: string[];
  version: number;
  limit: number;
  /** Compare with every row (the benchmark's full scan); default false. */
  fullScan?: boolean;
}

/** The most similar entries the viewer may read, best first. */
export async function similarEntries(
  db: Database,
  viewerId: string | null,
  query: SimilarQuery,
): Promise<SimilarHit[]> {
  if (query.fingerprint.length === 0) return [];
  const lookup = query.fullScan
    ? null
    : rareFeatures(query.fingerprint, await fingerprintStats(db));
  const fp = intArrayParam(query.fingerprint);
  const vf = intArrayParam(query.valueFeatures);
  const candidate =
    lookup === null ? sql`true` : sql`e.fingerprint && ${intArrayParam(lookup)}::int[]`;
  // Intersections by hash join (each candidate's features against the query's), which stays
  // linear where per-row array intersections did not.
  const rows = await db.execute<{
    id: string;
    score: number;
    value_score: number;
    shared: string[];
  }>(sql`
    with c as materialized (
      select e.id, e.fingerprint, e.value_features, e.search_blocks from entries e
      where ${candidate} and e.fingerprint_version = ${query.version}
        and e.id is distinct from ${query.entryId}::uuid and ${visibleEntry("e", viewerId)}
    ), fi as (
      select c.id, count(*) as n from c cross join lateral unnest(c.fingerprint) f(x)
      where f.x in (select unnest(${fp}::int[])) group by c.id
    ), vi as (
      select c.id, count(*) as n from c cross join lateral unnest(c.value_features) v(x)
      where v.x in (select unnest(${vf}::int[])) group by c.id
    )
    select c.id,
      fi.n::float8 / (cardinality(c.fingerprint) + ${query.fingerprint.length} - fi.n) as score,
      coalesce(vi.n::float8 / nullif(cardinality(c.value_features) + ${query.valueFeatures.length} - vi.n, 0), 0) as value_score,
      array(select unnest(c.search_blocks) intersect select unnest(${textArrayParam(query.blocks)}::text[]) order by 1) as shared
    from c join fi on fi.id = c.id left join vi on vi.id = c.id
    order by score desc, value_score desc, c.id
    limit ${query.limit}`);
  return rows.rows.map((r) => ({
    id: r.id,
    score: Number(r.score),
    valueScore: Number(r.value_score),
    sharedBlocks: r.shared,
  }));
}
