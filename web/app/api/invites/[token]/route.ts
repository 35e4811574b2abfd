/**
 * GET /api/invites/:token: which team and role the link is for (404 unknown, 410 used or expired).
 * POST /api/invites/:token: joins the team (signed in; 410 used or expired, 409 already a member).
 */
import { answer } from "@/lib/api-error";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { acceptInvite, inviteInfo } from "@/lib/invites";
import { json } from "@/lib/route-input";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ token: string }> };

export function GET(_req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () =>
    json({ invite: await inviteInfo(database().db, (await ctx.params).token) }),
  );
}

export function POST(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    return json({
      membership: await acceptInvite(database().db, caller, (await ctx.params).token),
    });
  });
}
