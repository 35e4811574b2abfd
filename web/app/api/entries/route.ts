/** GET /api/entries?q&category&flag&block&sort&archived&limit&cursor: search everything the caller may read (public entries for anyone). */
import { answer } from "@/lib/api-error";
import { findCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { listEntries } from "@/lib/entry-list";
import { json, readListQuery } from "@/lib/route-input";

export const dynamic = "force-dynamic";

export function GET(req: Request): Promise<Response> {
  return answer(async () =>
    json(await listEntries(database().db, await findCaller(req), readListQuery(req))),
  );
}
