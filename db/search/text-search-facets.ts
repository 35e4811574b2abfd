/**
 * The facets of text search: what each counts by and how each filters. The team facet names only
 * the viewer's own teams: another team's entries (public ones the viewer may read) are found and
 * counted under the other facets, but their team is never listed, by id or by name, and a team
 * filter matches only the viewer's teams. The search puts each team's name beside its id.
 */
import { sql, type SQL } from "drizzle-orm";
import { textArrayParam } from "./array-param.js";
import { viewersTeam } from "./visibility.js";

/** The facets a search counts and filters by. */
export const SEARCH_FACETS = ["category", "flag", "block", "supply", "team", "mismatch"] as const;
export type SearchFacet = (typeof SEARCH_FACETS)[number];

export interface FacetCount {
  value: string;
  count: number;
  /** The value as people read it, where it is not the value itself (a team's name). */
  label?: string;
}

/** The SQL value each facet is counted by, over rows aliased `b` (null values are not counted). */
export function facetValue(facet: SearchFacet, viewerId: string | null): SQL {
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
      return sql`case when ${viewersTeam("b", viewerId)} then b.team_id::text end`;
    case "mismatch":
      return sql`case when b.has_mismatch then 'true' else 'false' end`;
  }
}

/** The filter of one facet over rows aliased `e` (null when the query does not filter by it). */
export function facetFilter(
  facet: SearchFacet,
  values: string[] | undefined,
  viewerId: string | null,
): SQL | null {
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
      // Compared as text so a malformed id matches nothing instead of failing; only the
      // viewer's teams, as the facet lists only those.
      return sql`(e.team_id::text = any(${list}::text[]) and ${viewersTeam("e", viewerId)})`;
    case "mismatch": {
      const wanted = values.filter((v) => v === "true" || v === "false");
      return wanted.length === 0
        ? sql`false`
        : sql`e.has_mismatch = any(${`{${wanted.join(",")}}`}::boolean[])`;
    }
  }
}
