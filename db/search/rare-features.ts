/**
 * The candidate method of similar-circuit search: an inverted index over the rarer fingerprint
 * features. The fingerprint column has a GIN index, but every mains circuit shares its first
 * labels (a resistor, the line net, ...), so `fingerprint && query` would match nearly every row.
 * Instead the query keeps only its rarest features, judged by the element frequencies Postgres's
 * ANALYZE keeps for the column (pg_stats.most_common_elems), adding them rarest first while the
 * estimated number of rows they reach stays within a budget. An entry that shares none of them
 * shares none of the query's distinctive structure, so it could not rank near the top anyway;
 * a twin shares most of them. The exact Jaccard score is then computed over the candidates only.
 */

/** Element frequencies of the fingerprint column, from pg_stats (null before ANALYZE). */
export interface FeatureStats {
  /** Estimated rows in the table. */
  rows: number;
  /** Feature -> fraction of rows holding it, for the most common features. */
  common: Map<number, number>;
  /** The frequency below which features are not listed (an upper bound for those). */
  floor: number;
}

/** Estimated rows the chosen features may reach together, at least this many. */
export const MIN_CANDIDATE_BUDGET_ROWS = 500;
/** ... or this share of the table, whichever is more. */
export const CANDIDATE_BUDGET_SHARE = 0.005;

/**
 * The features to look candidates up by: all of them when there are no statistics or the table
 * is within the budget anyway; else the rarest, rarest first, while their estimated reach fits
 * the budget (always at least the rarest one).
 */
export function rareFeatures(features: readonly number[], stats: FeatureStats | null): number[] {
  if (stats === null) return [...features];
  const budget = Math.max(MIN_CANDIDATE_BUDGET_ROWS, CANDIDATE_BUDGET_SHARE * stats.rows);
  if (stats.rows <= budget) return [...features];
  const byRarity = features
    .map((f) => ({ f, share: stats.common.get(f) ?? stats.floor }))
    .sort((a, b) => a.share - b.share || a.f - b.f);
  const out: number[] = [];
  let reach = 0;
  for (const { f, share } of byRarity) {
    const rows = share * stats.rows;
    if (out.length > 0 && reach + rows > budget) break;
    out.push(f);
    reach += rows;
  }
  return out.sort((a, b) => a - b);
}
