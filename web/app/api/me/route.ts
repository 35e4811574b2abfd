/** GET /api/me: the signed-in user (session or token), or 401. */
import { answer } from "@/lib/api-error";
import { requireCaller } from "@/lib/caller";
import { json } from "@/lib/route-input";

export const dynamic = "force-dynamic";

export function GET(req: Request): Promise<Response> {
  return answer(async () => {
    const { userId, name, email, via } = await requireCaller(req);
    return json({ user: { id: userId, name, email }, via });
  });
}
