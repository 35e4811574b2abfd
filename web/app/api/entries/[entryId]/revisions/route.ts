/**
 * GET /api/entries/:entryId/revisions: the history, newest first.
 * POST: a new revision, JSON `{record, baseRevision, message?, title?, category?}` or a multipart
 * upload (`file`, `baseRevision`, ...); 201, or 409 with the current number and what changed
 * since the base when someone saved first (nothing is written).
 */
import { entryWithRole, readableEntry } from "@/lib/access";
import { answer } from "@/lib/api-error";
import { findCaller, requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { reviseEntry } from "@/lib/entries";
import { readRecordSubmission } from "@/lib/record-input";
import { revisionHistory } from "@/lib/revisions";
import { json, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ entryId: string }> };

export function GET(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const { entry } = await readableEntry(
      db,
      await findCaller(req),
      uuidParam((await ctx.params).entryId),
    );
    return json({
      currentRevision: entry.currentRevision,
      revisions: await revisionHistory(db, entry.id),
    });
  });
}

export function POST(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const entryId = uuidParam((await ctx.params).entryId);
    await entryWithRole(database().db, caller, entryId, "editor");
    const { accepted, fields } = await readRecordSubmission(req, caller.userId);
    const saved = await reviseEntry(database().db, caller, entryId, accepted, fields);
    return json({ ...saved, warnings: accepted.warnings }, 201);
  });
}
