/**
 * POST /api/entries/:entryId/what-if `{ supply?: { vrms, hz }, changes?: [{ part, value }] }`:
 * the analysis of the entry's current revision at another supply and/or with some part values
 * changed, `{ result, input, cached, revision }` (the result has the stored result's shape).
 * 422 names the bad field (`changes[0].part`); 404 when the caller may not read the entry;
 * 429 past the caller's what-if allowance; 503 when busy or past the analysis budget.
 */
import { answer } from "@/lib/api-error";
import { findCaller } from "@/lib/caller";
import { json, uuidParam } from "@/lib/route-input";
import { answerWhatIf } from "@/lib/what-if/run-what-if";
import { readWhatIfBody } from "@/lib/what-if/what-if-body";

export const dynamic = "force-dynamic";

export function POST(
  req: Request,
  ctx: { params: Promise<{ entryId: string }> },
): Promise<Response> {
  return answer(async () => {
    const caller = await findCaller(req);
    const entryId = uuidParam((await ctx.params).entryId);
    const body = await readWhatIfBody(req);
    return json(await answerWhatIf(req, caller, entryId, body));
  });
}
