/** GET /api/entries/:entryId/revisions/:number: that revision's record and its analysis state. */
import { readableEntry } from "@/lib/access";
import { answer } from "@/lib/api-error";
import { findCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { entryState } from "@/lib/entry-state";
import { json, revisionParam, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

export function GET(
  req: Request,
  ctx: { params: Promise<{ entryId: string; number: string }> },
): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const params = await ctx.params;
    const { entry, role } = await readableEntry(
      db,
      await findCaller(req),
      uuidParam(params.entryId),
    );
    return json(await entryState(db, entry, role, revisionParam(params.number)));
  });
}
