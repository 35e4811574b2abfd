/** GET /api/tokens: the caller's API tokens. POST /api/tokens {name}: a new token, shown once (201). */
import { z } from "zod";
import { answer } from "@/lib/api-error";
import { createApiToken, listApiTokens } from "@/lib/api-tokens";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { readJson } from "@/lib/request-body";
import { json } from "@/lib/route-input";

export const dynamic = "force-dynamic";

const newToken = z.object({ name: z.string().trim().min(1).max(100) });

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
    return json({ token: await createApiToken(database().db, caller.userId, body.name) }, 201);
  });
}
