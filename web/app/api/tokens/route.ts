/** GET /api/tokens: the caller's API tokens. POST /api/tokens {name, expiresInDays?}: a new token, shown once (201); one made with a token is its child. */
import { z } from "zod";
import { answer } from "@/lib/api-error";
import { createApiToken, listApiTokens, MAX_TOKEN_DAYS } from "@/lib/api-tokens";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { readJson } from "@/lib/request-body";
import { json } from "@/lib/route-input";

export const dynamic = "force-dynamic";

const newToken = z.object({
  name: z.string().trim().min(1).max(100),
  expiresInDays: z.number().int().min(1).max(MAX_TOKEN_DAYS).optional(),
});

export function GET(req: Request): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    return json({ tokens: await listApiTokens(database().db, caller.userId) });
  });
}

export function POST(req: Request): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const body = await readJson(req, newToken);
    // A token minting a token passes on its lineage: the child ends with (or before) it.
    const token = await createApiToken(database().db, caller.userId, body.name, {
      expiresInDays: body.expiresInDays,
      parentTokenId: caller.via === "token" ? caller.tokenId : undefined,
    });
    return json({ token }, 201);
  });
}
