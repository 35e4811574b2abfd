/**
 * GET /api/compare?a=ENTRY_ID&b=ENTRY_ID[&aRevision=N&bRevision=M]: two boards compared, parts
 * matched by structure. 404 when the caller may not read either entry, as for an unknown id.
 */
import { answer } from "@/lib/api-error";
import { findCaller } from "@/lib/caller";
import { compareEntries, compareQuery } from "@/lib/compare/compare-entries";
import { database } from "@/lib/database";
import { json, readQuery } from "@/lib/route-input";

export const dynamic = "force-dynamic";

export function GET(req: Request): Promise<Response> {
  return answer(async () => {
    const q = readQuery(req, compareQuery);
    return json(await compareEntries(database().db, await findCaller(req), q));
  });
}
