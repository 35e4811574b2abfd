/**
 * POST /api/teams/:teamId/import: a team archive as the body (owners only, into a team with no
 * entries). 201 with what was imported; 422 naming the first bad line; nothing is written then.
 */
import { requireTeamRole } from "@/lib/access";
import { ApiError, answer } from "@/lib/api-error";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { readBytes } from "@/lib/request-body";
import { uploadStore } from "@/lib/storage/local-disk-store";
import { maxArchiveBytes } from "@/lib/team-archive/archive-format";
import { importTeam } from "@/lib/team-archive/import-team";
import { readArchive } from "@/lib/team-archive/read-archive";
import { json, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ teamId: string }> };

export function POST(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const teamId = uuidParam((await ctx.params).teamId, "team");
    await requireTeamRole(database().db, caller, teamId, "owner");
    const bytes = await readBytes(req, maxArchiveBytes(), "team archive");
    let text: string;
    try {
      text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
    } catch {
      throw new ApiError(422, "invalid-archive", "the team archive is not UTF-8 text", {
        path: "archive",
      });
    }
    const archive = readArchive(text);
    if ("message" in archive)
      throw new ApiError(422, "invalid-archive", `line ${archive.line}: ${archive.message}`, {
        path: `archive:${archive.line}`,
      });
    const imported = await importTeam(database().db, uploadStore(), teamId, caller.userId, archive);
    return json({ imported }, 201);
  });
}
