/**
 * GET /api/teams/:teamId/entries?q&category&flag&block&sort&archived&limit&cursor: the team's entries.
 * POST /api/teams/:teamId/entries: a new entry from JSON `{record, title?, category?, visibility?, message?}`
 * or a multipart upload (`file` + the same fields); 201 with its id, 422 with every record problem.
 */
import { requireTeamRole } from "@/lib/access";
import { answer } from "@/lib/api-error";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { createTeamEntry } from "@/lib/entries";
import { listEntries } from "@/lib/entry-list";
import { readRecordSubmission } from "@/lib/record-input";
import { json, readListQuery, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ teamId: string }> };

export function GET(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const teamId = uuidParam((await ctx.params).teamId, "team");
    return json(await listEntries(database().db, caller, readListQuery(req, teamId)));
  });
}

export function POST(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const teamId = uuidParam((await ctx.params).teamId, "team");
    // The role is checked before the body is read, so a viewer learns 403, not how their file reads.
    await requireTeamRole(database().db, caller, teamId, "editor");
    const { accepted, fields } = await readRecordSubmission(req, caller.userId);
    const created = await createTeamEntry(database().db, caller, teamId, accepted, fields);
    return json({ ...created, warnings: accepted.warnings }, 201);
  });
}
