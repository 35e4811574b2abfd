/**
 * PATCH /api/teams/:teamId/members/:userId {role}: changes a role (owner only).
 * DELETE /api/teams/:teamId/members/:userId: removes a member (owner), or leaves (your own id).
 */
import { z } from "zod";
import { answer, notFound } from "@/lib/api-error";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { readJson } from "@/lib/request-body";
import { json, uuidParam } from "@/lib/route-input";
import { changeRole, removeMember } from "@/lib/teams";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ teamId: string; userId: string }> };

const roleChange = z.object({ role: z.enum(["owner", "editor", "viewer"]) });

async function ids(ctx: Ctx): Promise<{ teamId: string; userId: string }> {
  const p = await ctx.params;
  if (p.userId.length === 0 || p.userId.length > 100) throw notFound("member");
  return { teamId: uuidParam(p.teamId, "team"), userId: p.userId };
}

export function PATCH(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const { teamId, userId } = await ids(ctx);
    const body = await readJson(req, roleChange);
    return json({ member: await changeRole(database().db, caller, teamId, userId, body.role) });
  });
}

export function DELETE(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const { teamId, userId } = await ids(ctx);
    await removeMember(database().db, caller, teamId, userId === "me" ? caller.userId : userId);
    return json({ removed: true });
  });
}
