/**
 * Exact search for a pasted fragment in a record: a VF2-style subgraph isomorphism (Cordella et
 * al., 2004) that honours kinds and pin roles (symmetric kinds may swap their pins), maps the
 * fragment's nets injectively onto the record's nets (a fragment net declared line or neutral
 * only onto a net with that role), and returns every distinct part mapping, up to a cap and
 * within an optional time budget measured on the clock the caller passes in.
 */
import { buildCircuitGraph } from "../graph/circuit-graph.js";
import { matchSubgraph } from "../graph/subgraph-match.js";
import type { TeardownRecord } from "../record/types.js";

/** How many mappings matchFragment returns at most unless told otherwise. */
export const DEFAULT_MAX_MAPPINGS = 1000;
/** The time budget when a clock is given without a budget, in milliseconds. */
export const DEFAULT_MATCH_BUDGET_MS = 2000;

export interface MatchFragmentOptions {
  maxMappings?: number;
  budgetMs?: number;
  /** Milliseconds from any fixed origin; without it there is no time budget. */
  now?: () => number;
}

export interface FragmentMatch {
  /** Each mapping: fragment part ref -> record part ref. */
  mappings: Array<Record<string, string>>;
  /** False when the search stopped at the cap or the budget before trying everything. */
  complete: boolean;
  reason?: "cap" | "budget";
}

/** Every placement of a fragment's parts in a record (see the file comment for the rules). */
export function matchFragment(
  fragment: TeardownRecord,
  record: TeardownRecord,
  opts: MatchFragmentOptions = {},
): FragmentMatch {
  const now = opts.now ?? null;
  const result = matchSubgraph(buildCircuitGraph(fragment), buildCircuitGraph(record), {
    maxMappings: opts.maxMappings ?? DEFAULT_MAX_MAPPINGS,
    budgetMs: now === null ? null : (opts.budgetMs ?? DEFAULT_MATCH_BUDGET_MS),
    now,
    netCompatible: (p, t) => (p.role === "line" || p.role === "neutral" ? t.role === p.role : true),
  });
  const mappings = result.mappings.map((m) => m.parts);
  return result.complete
    ? { mappings, complete: true }
    : { mappings, complete: false, reason: result.reason! };
}
