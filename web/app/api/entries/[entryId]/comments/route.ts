/**
 * GET /api/entries/:entryId/comments?part=R1: the team's comments (members only).
 * POST {body, partRef?}: a comment on the entry or on one part; @mentions of members are resolved.
 */
import { z } from "zod";
import { entryWithRole } from "@/lib/access";
import { answer } from "@/lib/api-error";
import { addComment, listComments } from "@/lib/comments";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { readJson } from "@/lib/request-body";
import { json, readQuery, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ entryId: string }> };

const newComment = z.object({
  body: z.string().trim().min(1).max(10_000),
  partRef: z.string().min(1).max(100).optional(),
});
const commentQuery = z.object({ part: z.string().max(100).optional() });

export function GET(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const { entry } = await entryWithRole(
      db,
      await requireCaller(req),
      uuidParam((await ctx.params).entryId),
      "viewer",
    );
    return json({ comments: await listComments(db, entry.id, readQuery(req, commentQuery).part) });
  });
}

export function POST(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const caller = await requireCaller(req);
    const { entry } = await entryWithRole(
      db,
      caller,
      uuidParam((await ctx.params).entryId),
      "viewer",
    );
    const body = await readJson(req, newComment);
    return json({ comment: await addComment(db, caller, entry, body) }, 201);
  });
}
