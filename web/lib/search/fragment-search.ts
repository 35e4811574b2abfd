/**
 * Fragment search: candidates from the containment index (in id order, a batch at a time), each
 * confirmed by exact subgraph matching on the entry's current record. Stops when `limit` entries
 * are confirmed, when the candidates run out, or when the time budget is spent (then
 * `complete` is false). Free of Next.js, so the benchmark runs it as the route does.
 */
import {
  FINGERPRINT_VERSION,
  fragmentFeatures,
  matchFragment,
  recordFromTopology,
  type TeardownRecord,
} from "@teardown/engine";
import { fragmentCandidates, type Database } from "@teardown/db";

/** Candidates read from the index per round trip. */
const CANDIDATE_BATCH = 100;
/** Placements listed per entry at most. */
export const MAX_PLACEMENTS_PER_ENTRY = 20;
/** The most one candidate's matching may take, in milliseconds. */
const PER_ENTRY_BUDGET_MS = 250;
/** The most a whole fragment search may take, in milliseconds. */
export const FRAGMENT_SEARCH_BUDGET_MS = 5000;

export interface FragmentHit {
  id: string;
  matches: Array<{ parts: Record<string, string> }>;
}

export interface FragmentSearchOutcome {
  hits: FragmentHit[];
  /** False when the budget ran out before every candidate was checked. */
  complete: boolean;
  /** How many candidates the index gave and were checked. */
  checked: number;
}

/** Entries the viewer may read that contain the fragment, in id order, at most `limit`. */
export async function searchFragment(
  db: Database,
  viewerId: string | null,
  fragment: TeardownRecord,
  limit: number,
  now: () => number = () => performance.now(),
): Promise<FragmentSearchOutcome> {
  const features = fragmentFeatures(fragment);
  const start = now();
  const hits: FragmentHit[] = [];
  let after: string | null = null;
  let checked = 0;
  // A candidate whose matching ran out of time without a placement is not known to miss.
  let undecided = false;
  for (;;) {
    const batch = await fragmentCandidates(
      db,
      viewerId,
      features,
      FINGERPRINT_VERSION,
      after,
      CANDIDATE_BATCH,
    );
    for (const c of batch) {
      if (now() - start > FRAGMENT_SEARCH_BUDGET_MS) return { hits, complete: false, checked };
      checked++;
      const circuit = recordFromTopology(c.topology);
      if (circuit === null) continue;
      const found = matchFragment(fragment, circuit, {
        maxMappings: MAX_PLACEMENTS_PER_ENTRY,
        budgetMs: PER_ENTRY_BUDGET_MS,
        now,
      });
      if (found.mappings.length === 0) {
        if (!found.complete) undecided = true;
        continue;
      }
      hits.push({ id: c.id, matches: found.mappings.map((parts) => ({ parts })) });
      if (hits.length >= limit) return { hits, complete: !undecided, checked };
    }
    if (batch.length < CANDIDATE_BATCH) return { hits, complete: !undecided, checked };
    after = batch[batch.length - 1]!.id;
  }
}
