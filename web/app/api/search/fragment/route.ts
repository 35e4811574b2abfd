/**
 * POST /api/search/fragment {text, format?, limit?}: the entries the caller may read that
 * contain the fragment, each with every placement (fragment ref -> entry ref); 422 with line
 * and path when the fragment does not read.
 */
import { ENGINE_VERSION } from "@teardown/engine";
import { loadEntrySummaries } from "@teardown/db";
import { answer } from "@/lib/api-error";
import { findCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { readJson } from "@/lib/request-body";
import { json } from "@/lib/route-input";
import { searchFragment } from "@/lib/search/fragment-search";
import { fragmentBody, readFragmentRequest } from "@/lib/search/search-request";

export const dynamic = "force-dynamic";

export function POST(req: Request): Promise<Response> {
  return answer(async () => {
    const caller = await findCaller(req);
    const { fragment, limit } = readFragmentRequest(await readJson(req, fragmentBody));
    const { db } = database();
    const found = await searchFragment(db, caller?.userId ?? null, fragment, limit);
    const entries = await loadEntrySummaries(
      db,
      found.hits.map((h) => h.id),
      ENGINE_VERSION,
    );
    return json({
      results: found.hits
        .filter((h) => entries.has(h.id))
        .map((h) => ({ entry: entries.get(h.id)!, matches: h.matches })),
      complete: found.complete,
    });
  });
}
