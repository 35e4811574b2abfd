/** GET /api/teams/:teamId/export: the whole team as one archive (owners only; docs/team-archive.md). */
import { requireTeamRole } from "@/lib/access";
import { answer, notFound } from "@/lib/api-error";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { uploadStore } from "@/lib/storage/local-disk-store";
import { ARCHIVE_MEDIA_TYPE, ARCHIVE_SUFFIX } from "@/lib/team-archive/archive-format";
import { exportTeam } from "@/lib/team-archive/export-team";
import { uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ teamId: string }> };

export function GET(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const teamId = uuidParam((await ctx.params).teamId, "team");
    await requireTeamRole(database().db, caller, teamId, "owner");
    const text = await exportTeam(database().db, uploadStore(), teamId, new Date());
    if (text === null) throw notFound("team");
    const day = new Date().toISOString().slice(0, 10);
    return new Response(text, {
      headers: {
        "content-type": `${ARCHIVE_MEDIA_TYPE}; charset=utf-8`,
        "content-disposition": `attachment; filename="team-${teamId.slice(0, 8)}-${day}${ARCHIVE_SUFFIX}"`,
        "x-content-type-options": "nosniff",
        "cache-control": "no-store",
      },
    });
  });
}
