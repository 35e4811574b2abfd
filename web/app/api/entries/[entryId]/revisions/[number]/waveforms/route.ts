/**
 * GET /api/entries/:entryId/revisions/:number/waveforms: the stored waveforms of the finished
 * analysis the entry page shows for that revision (this engine's, else the newest older one),
 * with that analysis's engine version and finish time; `waveforms` is null while none is
 * finished and solved. Entry reads leave the waveforms out (they are most of a solved answer),
 * so the page asks for them here when the waveform tab opens. Same access as the entry itself.
 */
import { readableEntry } from "@/lib/access";
import { answer } from "@/lib/api-error";
import { findCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { shownWaveforms } from "@/lib/entry-state";
import { json, revisionParam, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

export function GET(
  req: Request,
  ctx: { params: Promise<{ entryId: string; number: string }> },
): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const params = await ctx.params;
    const { entry } = await readableEntry(db, await findCaller(req), uuidParam(params.entryId));
    return json(await shownWaveforms(db, entry, revisionParam(params.number)));
  });
}
