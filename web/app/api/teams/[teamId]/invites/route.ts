/** POST /api/teams/:teamId/invites {role, expiresInHours?}: a one-time invitation link (owner only, 201). */
import { z } from "zod";
import { answer } from "@/lib/api-error";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { MAX_INVITE_HOURS, createInvite } from "@/lib/invites";
import { readJson } from "@/lib/request-body";
import { json, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

const newInvite = z.object({
  role: z.enum(["owner", "editor", "viewer"]),
  expiresInHours: z.number().int().min(1).max(MAX_INVITE_HOURS).optional(),
});

export function POST(
  req: Request,
  ctx: { params: Promise<{ teamId: string }> },
): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const teamId = uuidParam((await ctx.params).teamId, "team");
    const body = await readJson(req, newInvite);
    return json({ invite: await createInvite(database().db, caller, teamId, body) }, 201);
  });
}
