/**
 * GET /api/search?q&category&flag&block&supply&mismatch&team&limit&cursor: ranked text search
 * over everything the caller may read, with each facet's counts under the query (`facetsExact`
 * false: more matched than were counted, so the counts are lower bounds; `rankedAll` false: more
 * matched than were ranked).
 */
import { ENGINE_VERSION } from "@teardown/engine";
import { loadEntrySummaries, searchText } from "@teardown/db";
import { answer } from "@/lib/api-error";
import { findCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { json } from "@/lib/route-input";
import { readTextSearchQuery } from "@/lib/search/search-request";

export const dynamic = "force-dynamic";

export function GET(req: Request): Promise<Response> {
  return answer(async () => {
    const query = readTextSearchQuery(req);
    const { db } = database();
    const caller = await findCaller(req);
    const page = await searchText(db, caller?.userId ?? null, query);
    const entries = await loadEntrySummaries(
      db,
      page.hits.map((h) => h.id),
      ENGINE_VERSION,
    );
    return json({
      results: page.hits
        .filter((h) => entries.has(h.id))
        .map((h) => ({ entry: entries.get(h.id)!, score: h.score, snippet: h.snippet })),
      facets: page.facets,
      facetsExact: page.facetsExact,
      rankedAll: page.rankedAll,
      nextCursor: page.nextCursor,
    });
  });
}
