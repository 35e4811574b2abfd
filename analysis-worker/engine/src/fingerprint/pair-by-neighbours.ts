/**
 * The second half of compareTopology's structure phase: grow the pairing outwards from parts
 * already paired. Two nets correspond when the paired parts' pins vote them onto each other
 * (mutual best). An unpaired part then pairs with a part of the same kind on the other side
 * whose pins, role by role, sit on the corresponding nets; pins on nets that correspond to
 * nothing yet must land on nets that are free too. The best-anchored candidates go first and
 * the votes are counted again after each round, so the pairing spreads across local changes
 * that exact Weisfeiler-Lehman labels cannot see past.
 */
import type { CircuitGraph, PartNode, PinEdge } from "../graph/circuit-graph.js";

/** A pairing under construction: part of A -> part of B, with the taken parts of B. */
export interface PairingState {
  pairs: Map<PartNode, { other: PartNode; by: "structure" | "value" | "kind" }>;
  pairedB: Set<PartNode>;
  add: (a: PartNode, b: PartNode, by: "structure") => void;
  /**
   * The role of a net of A or B (line, neutral, ...), when known. A symmetric part with one end
   * on a role net votes that end onto its partner's end of the same role, so the pairing can
   * grow from resistors and fuses in the mains leads without a guess.
   */
  netRole?: (side: "a" | "b", net: string) => string | null;
}

/** One round of pairing by neighbourhood; false when no unpaired part has an anchored counterpart. */
export function pairByNeighbours(
  ga: CircuitGraph,
  gb: CircuitGraph,
  state: PairingState,
  /** Orders equally anchored candidate pairs, most alike first (a tie-break, never a filter). */
  alike: (x: { a: PartNode; b: PartNode }, y: { a: PartNode; b: PartNode }) => number,
): boolean {
  {
    const { forward, backward } = correspondingNets(state);
    const candidates: Array<{ a: PartNode; b: PartNode; score: number }> = [];
    for (const a of ga.parts) {
      if (state.pairs.has(a)) continue;
      for (const b of gb.parts) {
        if (
          state.pairedB.has(b) ||
          a.kind !== b.kind ||
          a.polarised !== b.polarised ||
          a.pins.length !== b.pins.length
        )
          continue;
        const score = anchoredPins(a.pins, b.pins, forward, backward);
        if (score > 0) candidates.push({ a, b, score });
      }
    }
    if (candidates.length === 0) return false;
    const best = Math.max(...candidates.map((c) => c.score));
    const top = candidates
      .filter((c) => c.score === best)
      .sort((x, y) => alike(x, y) || cmp(x.a.ref, y.a.ref) || cmp(x.b.ref, y.b.ref));
    const takenA = new Set<PartNode>();
    const takenB = new Set<PartNode>();
    for (const c of top) {
      if (takenA.has(c.a) || takenB.has(c.b)) continue;
      takenA.add(c.a);
      takenB.add(c.b);
      state.add(c.a, c.b, "structure");
    }
    return true;
  }
}

/**
 * Nets of A and B that correspond (net roles are not forced to agree: a dropper moved from the
 * line leg to the neutral leg still pairs its parts). Round by round, each paired part votes its pins' nets onto
 * its partner's (a pin whose role is unique in its part votes at once; the two ends of a
 * symmetric part vote once one end is placed) and mutual unique best votes are taken.
 */
export function correspondingNets(state: PairingState): {
  forward: Map<string, string>;
  backward: Map<string, string>;
} {
  const forward = new Map<string, string>();
  const backward = new Map<string, string>();
  const link = (x: string, y: string): void => {
    forward.set(x, y);
    backward.set(y, x);
  };
  for (;;) {
    const votes = new Map<string, Map<string, number>>();
    const back = new Map<string, Map<string, number>>();
    const vote = (x: string, y: string): void => {
      if (forward.has(x) || backward.has(y)) return;
      for (const [table, k, v] of [
        [votes, x, y],
        [back, y, x],
      ] as const) {
        const row = table.get(k) ?? new Map<string, number>();
        row.set(v, (row.get(v) ?? 0) + 1);
        table.set(k, row);
      }
    };
    for (const [a, { other: b }] of state.pairs) {
      for (const cls of new Set(a.pins.map((e) => e.roleClass))) {
        const mine = a.pins.filter((e) => e.roleClass === cls);
        const theirs = b.pins.filter((e) => e.roleClass === cls);
        // Pins already placed take their partners out; one pin left on each side is a vote.
        const openMine = mine.filter((e) => !theirs.some((t) => forward.get(e.net) === t.net));
        const openTheirs = theirs.filter((t) => !mine.some((e) => forward.get(e.net) === t.net));
        if (openMine.length === 1 && openTheirs.length === 1)
          vote(openMine[0]!.net, openTheirs[0]!.net);
        else if (openMine.length === 2 && openTheirs.length === 2 && state.netRole !== undefined)
          voteByRole(openMine, openTheirs, state.netRole, vote);
      }
    }
    let added = false;
    for (const [x, row] of [...votes].sort(([p], [q]) => cmp(p, q))) {
      const y = uniqueBest(row);
      if (y === null || forward.has(x) || backward.has(y) || uniqueBest(back.get(y)!) !== x)
        continue;
      link(x, y);
      added = true;
    }
    if (!added) return { forward, backward };
  }
}

/** Two open ends on each side: when exactly one end on each has the same role, vote both ends. */
function voteByRole(
  mine: PinEdge[],
  theirs: PinEdge[],
  netRole: (side: "a" | "b", net: string) => string | null,
  vote: (x: string, y: string) => void,
): void {
  const rm = mine.map((e) => netRole("a", e.net));
  const rt = theirs.map((e) => netRole("b", e.net));
  for (const [i, j] of [
    [0, 0],
    [0, 1],
    [1, 0],
    [1, 1],
  ] as const) {
    const role = rm[i];
    if (role === null || role === undefined || rt[j] !== role) continue;
    // Only when the role singles out one end on both sides (not both ends on line nets).
    if (rm[1 - i] === role || rt[1 - j] === role) continue;
    vote(mine[i]!.net, theirs[j]!.net);
    vote(mine[1 - i]!.net, theirs[1 - j]!.net);
    return;
  }
}

/** The key with the highest count, or null on a tie (a tie means we cannot tell yet). */
function uniqueBest(row: Map<string, number>): string | null {
  let best: string | null = null;
  let bestVotes = -1;
  let tie = false;
  for (const [k, v] of [...row].sort(([p], [q]) => cmp(p, q))) {
    if (v > bestVotes) {
      best = k;
      bestVotes = v;
      tie = false;
    } else if (v === bestVotes) {
      tie = true;
    }
  }
  return tie ? null : best;
}

/**
 * The number of pins on corresponding nets under the best pin pairing of equal role classes,
 * or 0 when no pairing is consistent (a pin on a corresponding net that lands elsewhere, or a
 * pin on a net of its own that lands on a net already spoken for).
 */
function anchoredPins(
  pa: PinEdge[],
  pb: PinEdge[],
  forward: Map<string, string>,
  backward: Map<string, string>,
): number {
  let best = 0;
  const tryPairing = (i: number, used: boolean[], score: number): void => {
    if (i === pa.length) {
      best = Math.max(best, score);
      return;
    }
    const pin = pa[i]!;
    pb.forEach((other, j) => {
      if (used[j] || other.roleClass !== pin.roleClass) return;
      const mapped = forward.get(pin.net);
      let gain: number;
      if (mapped !== undefined) {
        if (mapped !== other.net) return;
        gain = 1;
      } else {
        if (backward.has(other.net)) return;
        gain = 0;
      }
      used[j] = true;
      tryPairing(i + 1, used, score + gain);
      used[j] = false;
    });
  };
  tryPairing(
    0,
    pa.map(() => false),
    0,
  );
  return best;
}

function cmp(x: string, y: string): number {
  return x < y ? -1 : x > y ? 1 : 0;
}
