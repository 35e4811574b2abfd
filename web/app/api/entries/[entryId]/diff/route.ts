/** GET /api/entries/:entryId/diff?from=&to=: what changed between two revisions (default: the current one and the one before). */
import { z } from "zod";
import { readableEntry } from "@/lib/access";
import { answer } from "@/lib/api-error";
import { findCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { diffBetween } from "@/lib/revisions";
import { json, readQuery, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

const diffQuery = z.object({
  from: z.coerce.number().int().positive().optional(),
  to: z.coerce.number().int().positive().optional(),
});

export function GET(
  req: Request,
  ctx: { params: Promise<{ entryId: string }> },
): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const { entry } = await readableEntry(
      db,
      await findCaller(req),
      uuidParam((await ctx.params).entryId),
    );
    const q = readQuery(req, diffQuery);
    const to = q.to ?? entry.currentRevision ?? 1;
    const from = q.from ?? Math.max(1, to - 1);
    return json({ from, to, diff: await diffBetween(db, entry.id, from, to) });
  });
}
