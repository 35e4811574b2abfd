/** GET /api/teams/:teamId: the team, its members and the caller's role (404 for non-members). */
import { answer } from "@/lib/api-error";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { json, uuidParam } from "@/lib/route-input";
import { getTeam } from "@/lib/teams";

export const dynamic = "force-dynamic";

export function GET(req: Request, ctx: { params: Promise<{ teamId: string }> }): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const teamId = uuidParam((await ctx.params).teamId, "team");
    return json({ team: await getTeam(database().db, caller, teamId) });
  });
}
