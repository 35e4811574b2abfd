/** DELETE /api/tokens/:tokenId: revokes one of the caller's tokens (refused with 401 from then on). */
import { answer } from "@/lib/api-error";
import { revokeApiToken } from "@/lib/api-tokens";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { json, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

export function DELETE(
  req: Request,
  ctx: { params: Promise<{ tokenId: string }> },
): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const tokenId = uuidParam((await ctx.params).tokenId, "token");
    return json({ token: await revokeApiToken(database().db, caller.userId, tokenId) });
  });
}
