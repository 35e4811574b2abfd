/**
 * Which parts of two records correspond. Structure first: Weisfeiler-Lehman labels of the part
 * nodes with values left out; parts whose labels agree only with each other are paired, and
 * when several look alike one pair is fixed (the closest values) and its label made unique on
 * both sides, so the relabelling refines the rest (individualisation and refinement). What is
 * left is paired by kind and equal value, then by kind alone. Deterministic for given inputs.
 */
import { buildCircuitGraph, type CircuitGraph, type PartNode } from "../graph/circuit-graph.js";
import type { TeardownRecord } from "../record/types.js";
import { pairByNeighbours, type PairingState } from "./pair-by-neighbours.js";
import { WL_ITERATIONS, wlLabels, type WlLabels } from "./wl-labels.js";

export interface PartPair {
  a: string;
  b: string;
  by: "structure" | "value" | "kind";
}

export interface ValueDiff {
  a: string;
  b: string;
  kind: string;
  valueA: number | null;
  valueB: number | null;
}

export interface TopologyComparison {
  pairs: PartPair[];
  valueDiffs: ValueDiff[];
  onlyInA: string[];
  onlyInB: string[];
}

/** Structure pairs need labels that agree after at least this many rounds (neighbours' kinds seen). */
const MIN_STRUCTURE_DEPTH = 2;
/** Two values closer than this, relative to the larger, count as equal. */
const EQUAL_VALUE_RELATIVE = 1e-9;
/** How far apart, in decades, a known value and an unknown one count (farther than any real pair). */
const UNKNOWN_VALUE_DISTANCE_DECADES = 1e6;

/** Pair the parts of two records and list the values that differ and the parts left over. */
export function compareTopology(a: TeardownRecord, b: TeardownRecord): TopologyComparison {
  const ga = buildCircuitGraph(a);
  const gb = buildCircuitGraph(b);
  const pairs = new Map<PartNode, { other: PartNode; by: PartPair["by"] }>();
  const pairedB = new Set<PartNode>();
  const add = (x: PartNode, y: PartNode, by: PartPair["by"]): void => {
    pairs.set(x, { other: y, by });
    pairedB.add(y);
  };

  structurePhase(ga, gb, { pairs, pairedB, add, netRole: netRoles(ga, gb) });

  const restA = (): PartNode[] => ga.parts.filter((p) => !pairs.has(p)).sort(byRef);
  const restB = (): PartNode[] => gb.parts.filter((p) => !pairedB.has(p)).sort(byRef);
  for (const x of restA()) {
    const y = restB().find(
      (q) =>
        q.kind === x.kind && x.value !== null && q.value !== null && sameValue(x.value, q.value),
    );
    if (y !== undefined) add(x, y, "value");
  }
  for (const x of restA()) {
    const candidates = restB().filter((q) => q.kind === x.kind);
    if (candidates.length > 0) add(x, closest(x, candidates), "kind");
  }

  const list = [...pairs]
    .map(([x, { other, by }]) => ({ a: x.ref, b: other.ref, by, x, y: other }))
    .sort((p, q) => cmp(p.a, q.a));
  return {
    pairs: list.map(({ a: ra, b: rb, by }) => ({ a: ra, b: rb, by })),
    valueDiffs: list
      .filter(
        ({ x, y }) =>
          !(x.value === null && y.value === null) &&
          !(x.value !== null && y.value !== null && sameValue(x.value, y.value)),
      )
      .map(({ x, y }) => ({ a: x.ref, b: y.ref, kind: x.kind, valueA: x.value, valueB: y.value })),
    onlyInA: restA().map((p) => p.ref),
    onlyInB: restB().map((p) => p.ref),
  };
}

/**
 * Pair by structure: exact WL agreement after at least MIN_STRUCTURE_DEPTH rounds, then growth
 * through corresponding nets; only when both are stuck, agreement after one round (kind, pin
 * roles and net roles) fixes one more pair to grow from.
 */
function structurePhase(ga: CircuitGraph, gb: CircuitGraph, state: PairingState): void {
  const anchors = new Map<PartNode, number>();
  const seed = (p: PartNode): string => (anchors.has(p) ? `#${anchors.get(p)}` : "");
  const anchored: PairingState = {
    ...state,
    add: (x, y, by) => {
      state.add(x, y, by);
      // One shared anchor id per pair, so the pair's two parts get the same seeded label.
      const id = anchors.size / 2;
      anchors.set(x, id);
      anchors.set(y, id);
    },
  };
  for (;;) {
    const la = wlLabels(ga, { iterations: WL_ITERATIONS, useValues: false, partSeed: seed });
    const lb = wlLabels(gb, { iterations: WL_ITERATIONS, useValues: false, partSeed: seed });
    // Exact one-to-one agreement first, then growth through the nets; only when both are stuck
    // is one of several alike parts fixed, so a chain of identical parts is paired from its
    // ends inwards rather than from a guess that would follow the refs.
    if (wlRound(ga, gb, la, lb, anchored, MIN_STRUCTURE_DEPTH, false)) continue;
    // Equally anchored candidates: the one whose WL labels agree over more rounds, then the
    // closer value.
    const agreement = (x: PartNode, y: PartNode): number =>
      la.parts[x.index]!.filter((label, k) => label === lb.parts[y.index]![k]).length;
    const alike = (p: { a: PartNode; b: PartNode }, q: { a: PartNode; b: PartNode }): number =>
      agreement(q.a, q.b) - agreement(p.a, p.b) ||
      valueDistance(p.a, p.b) - valueDistance(q.a, q.b);
    if (pairByNeighbours(ga, gb, anchored, alike)) continue;
    if (wlRound(ga, gb, la, lb, anchored, MIN_STRUCTURE_DEPTH, true)) continue;
    if (!wlRound(ga, gb, la, lb, anchored, 1, true)) return;
  }
}

/**
 * One round of WL pairing at the deepest depth (down to minDepth) where unpaired parts of A
 * and B share a label: every one-to-one group pairs; failing that (and when asked to
 * individualise), one pair of the first shared group is fixed by closest value. False when
 * nothing was paired.
 */
function wlRound(
  ga: CircuitGraph,
  gb: CircuitGraph,
  la: WlLabels,
  lb: WlLabels,
  state: PairingState,
  minDepth: number,
  /** Fix one pair of a group of alike parts when no group is one-to-one. */
  individualise: boolean,
): boolean {
  for (let depth = WL_ITERATIONS; depth >= minDepth; depth--) {
    const groups = new Map<number, { a: PartNode[]; b: PartNode[] }>();
    const group = (label: number): { a: PartNode[]; b: PartNode[] } => {
      let g = groups.get(label);
      if (g === undefined) groups.set(label, (g = { a: [], b: [] }));
      return g;
    };
    ga.parts.forEach((p, i) => !state.pairs.has(p) && group(la.parts[i]![depth]!).a.push(p));
    gb.parts.forEach((p, i) => !state.pairedB.has(p) && group(lb.parts[i]![depth]!).b.push(p));
    const shared = [...groups]
      .filter(([, g]) => g.a.length > 0 && g.b.length > 0)
      .sort(([x], [y]) => x - y);
    if (shared.length === 0) continue;
    const unique = shared.filter(([, g]) => g.a.length === 1 && g.b.length === 1);
    if (unique.length > 0) {
      for (const [, g] of unique) state.add(g.a[0]!, g.b[0]!, "structure");
    } else if (!individualise) {
      continue;
    } else {
      const [, g] = shared[0]!;
      const x = [...g.a].sort(byRef)[0]!;
      state.add(x, closest(x, g.b), "structure");
    }
    return true;
  }
  return false;
}

/** The role of a net of either board (null when it has none). */
export function netRoles(
  ga: CircuitGraph,
  gb: CircuitGraph,
): (side: "a" | "b", net: string) => string | null {
  return (side, net) => (side === "a" ? ga : gb).netByName.get(net)?.role ?? null;
}

/** The candidate whose value is nearest on a log scale, ties broken by ref. */
function closest(x: PartNode, candidates: readonly PartNode[]): PartNode {
  return [...candidates].sort(
    (p, q) => valueDistance(x, p) - valueDistance(x, q) || byRef(p, q),
  )[0]!;
}

/** Distance of two values in decades; both unknown is 0, one unknown is a large constant. */
function valueDistance(x: PartNode, q: PartNode): number {
  if (x.value === null && q.value === null) return 0;
  if (x.value === null || q.value === null || x.value <= 0 || q.value <= 0)
    return UNKNOWN_VALUE_DISTANCE_DECADES;
  return Math.abs(Math.log10(x.value) - Math.log10(q.value));
}

function sameValue(x: number, y: number): boolean {
  return Math.abs(x - y) <= EQUAL_VALUE_RELATIVE * Math.max(Math.abs(x), Math.abs(y));
}

function byRef(p: PartNode, q: PartNode): number {
  return cmp(p.ref, q.ref) || p.index - q.index;
}

function cmp(x: string, y: string): number {
  return x < y ? -1 : x > y ? 1 : 0;
}
