/** GET /api/teams: the caller's teams. POST /api/teams {name, slug?}: a new team, the caller its owner (201). */
import { z } from "zod";
import { answer } from "@/lib/api-error";
import { requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { readJson } from "@/lib/request-body";
import { json } from "@/lib/route-input";
import { createTeam, listTeams } from "@/lib/teams";

export const dynamic = "force-dynamic";

const newTeam = z.object({
  name: z.string().trim().min(1).max(100),
  slug: z
    .string()
    .regex(/^[a-z0-9][a-z0-9-]{0,62}$/, "lower-case letters, digits and dashes")
    .optional(),
});

export function GET(req: Request): Promise<Response> {
  return answer(async () =>
    json({ teams: await listTeams(database().db, await requireCaller(req)) }),
  );
}

export function POST(req: Request): Promise<Response> {
  return answer(async () => {
    const caller = await requireCaller(req);
    const body = await readJson(req, newTeam);
    return json({ team: await createTeam(database().db, caller, body) }, 201);
  });
}
