/** GET /api/teams/:teamId/audit?limit=&before=: the team's audit trail, newest first (owners only). */
import { z } from "zod";
import { answer } from "@/lib/api-error";
import { MAX_AUDIT_PAGE, teamAuditLog } from "@/lib/audit";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { json, readQuery, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

const auditQuery = z.object({
  limit: z.coerce.number().int().min(1).max(MAX_AUDIT_PAGE).default(50),
  before: z.coerce.number().int().positive().max(Number.MAX_SAFE_INTEGER).optional(),
});

export function GET(req: Request, ctx: { params: Promise<{ teamId: string }> }): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const teamId = uuidParam((await ctx.params).teamId, "team");
    const page = readQuery(req, auditQuery);
    const { rows, nextBefore } = await teamAuditLog(database().db, caller, teamId, page);
    return json({ events: rows, nextBefore });
  });
}
