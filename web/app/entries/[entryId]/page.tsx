import { isTransientDatabaseError } from "@teardown/db";
import { readableEntry } from "@/lib/access";
import { database } from "@/lib/database";
import { entryState } from "@/lib/entry-state";
import type { EntryState } from "@/app/client/api-types";
import { EntryPage } from "@/app/components/entry/view/entry-page";
import { currentCaller } from "@/app/components/current-caller";

export const dynamic = "force-dynamic";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

// The first render carries the entry (as the API would answer it), so the page needs no
// round trip to show it; anything unusual (unknown id, no access) is left to the client's
// own request, which shows the API's answer. The database going away is not unusual in that
// sense: it fails the render, which the outage guard answers with 503 (page-outage-guard.ts).
async function firstState(entryId: string): Promise<EntryState | null> {
  if (!UUID.test(entryId)) return null;
  try {
    // The header asked already; this is the same lookup's answer, not a second one.
    const caller = await currentCaller();
    const { db } = database();
    const { entry, role } = await readableEntry(db, caller, entryId.toLowerCase());
    return JSON.parse(JSON.stringify(await entryState(db, entry, role))) as EntryState;
  } catch (err) {
    if (isTransientDatabaseError(err)) throw err;
    return null;
  }
}

/** /entries/[entryId]: the entry, its analysis, photos, comments and history. */
export default async function EntryRoute({ params }: { params: Promise<{ entryId: string }> }) {
  const { entryId } = await params;
  return <EntryPage entryId={entryId} initial={await firstState(entryId)} />;
}
