/**
 * GET /api/entries/:entryId/similar?limit: the circuits most like this entry's by topology, best
 * first, never the entry itself, only among entries the caller may read (404 when the entry
 * itself is not readable, exactly as for an unknown id).
 */
import { ENGINE_VERSION, FINGERPRINT_VERSION } from "@teardown/engine";
import { entryFeatures, loadEntrySummaries, similarEntries } from "@teardown/db";
import { readableEntry } from "@/lib/access";
import { answer } from "@/lib/api-error";
import { findCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { json, uuidParam } from "@/lib/route-input";
import { readSimilarLimit } from "@/lib/search/search-request";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ entryId: string }> };

export function GET(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const caller = await findCaller(req);
    const limit = readSimilarLimit(req);
    const { entry } = await readableEntry(db, caller, uuidParam((await ctx.params).entryId));
    const own = await entryFeatures(db, entry.id, FINGERPRINT_VERSION);
    // An entry not analysed (or not backfilled) yet has no features to compare: no neighbours.
    if (own === null) return json({ results: [] });
    const hits = await similarEntries(db, caller?.userId ?? null, {
      entryId: entry.id,
      ...own,
      version: FINGERPRINT_VERSION,
      limit,
    });
    const entries = await loadEntrySummaries(
      db,
      hits.map((h) => h.id),
      ENGINE_VERSION,
    );
    return json({
      results: hits
        .filter((h) => entries.has(h.id))
        .map((h) => ({ entry: entries.get(h.id)!, score: h.score, sharedBlocks: h.sharedBlocks })),
    });
  });
}
