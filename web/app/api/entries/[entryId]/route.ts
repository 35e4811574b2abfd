/**
 * GET /api/entries/:entryId: the entry, its current revision and that revision's analysis state
 * (public entries need no account). PATCH {archived?, visibility?}: archive, unarchive, make
 * public or team-only (editor or owner).
 */
import { z } from "zod";
import { readableEntry } from "@/lib/access";
import { answer } from "@/lib/api-error";
import { findCaller, requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { updateEntry } from "@/lib/entries";
import { entryState, entryView } from "@/lib/entry-state";
import { readJson } from "@/lib/request-body";
import { json, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ entryId: string }> };

const entryChange = z
  .object({ archived: z.boolean().optional(), visibility: z.enum(["team", "public"]).optional() })
  .refine(
    (c) => c.archived !== undefined || c.visibility !== undefined,
    "give `archived` or `visibility`",
  );

export function GET(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const { entry, role } = await readableEntry(
      db,
      await findCaller(req),
      uuidParam((await ctx.params).entryId),
    );
    return json(await entryState(db, entry, role));
  });
}

export function PATCH(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const entryId = uuidParam((await ctx.params).entryId);
    const body = await readJson(req, entryChange);
    return json({ entry: entryView(await updateEntry(database().db, caller, entryId, body)) });
  });
}
