/**
 * Fragment search's candidates: entries whose fragment features contain all of the fragment's
 * (a GIN containment lookup; see the engine's fragment-features.ts for why containment is
 * necessary), visible to the viewer, with their current record, in id order one batch at a time
 * so the caller can stop once it has confirmed enough.
 */
import { sql } from "drizzle-orm";
import type { Database } from "../client.js";
import { intArrayParam } from "./array-param.js";
import { visibleEntry } from "./visibility.js";

export interface FragmentCandidate {
  id: string;
  /** The current revision's record document, as stored. */
  record: unknown;
}

/** One batch of candidates after `afterId` (null = from the start). */
export async function fragmentCandidates(
  db: Database,
  viewerId: string | null,
  features: readonly number[],
  version: number,
  afterId: string | null,
  batch: number,
): Promise<FragmentCandidate[]> {
  const rows = await db.execute<{ id: string; record: unknown }>(sql`
    select e.id, r.record from entries e
      join revisions r on r.entry_id = e.id and r.number = e.current_revision
    where e.fragment_features @> ${intArrayParam(features)}::int[]
      and e.fingerprint_version = ${version}
      and ${visibleEntry("e", viewerId)}
      and (${afterId}::uuid is null or e.id > ${afterId}::uuid)
    order by e.id limit ${batch}`);
  return rows.rows.map((r) => ({ id: r.id, record: r.record }));
}
