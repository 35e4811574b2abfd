/**
 * Fragment search's candidates: entries whose fragment features contain all of the fragment's
 * (a GIN containment lookup; see the engine's fragment-features.ts for why containment is
 * necessary), visible to the viewer, with their stored structure, in id order one batch at a time
 * so the caller can stop once it has confirmed enough.
 */
import { sql } from "drizzle-orm";
import type { Database } from "../client.js";
import { intArrayParam } from "./array-param.js";
import { visibleEntry } from "./visibility.js";

export interface FragmentCandidate {
  id: string;
  /** The current revision's structure, as the engine's topologyOf wrote it. */
  topology: unknown;
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
  const rows = await db.execute<{ id: string; topology: unknown }>(sql`
    select e.id, e.topology from entries e
    where e.fragment_features @> ${intArrayParam(features)}::int[]
      and e.fingerprint_version = ${version}
      and ${visibleEntry("e", viewerId)}
      and (${afterId}::uuid is null or e.id > ${afterId}::uuid)
    order by e.id limit ${batch}`);
  return rows.rows.map((r) => ({ id: r.id, topology: r.topology }));
}
