/**
 * Exact subgraph matching on circuit graphs, in the manner of VF2 (Cordella, Foggia, Sansone and
 * Vento, 2004): grow one partial mapping a part at a time, taking the next pattern part from
 * those that touch nets already mapped, and cut a branch as soon as kinds, pin roles, net
 * injectivity or net degrees disagree. Used by block recognition and by fragment search.
 */
import type { CircuitGraph, NetNode, PartNode, PinEdge } from "./circuit-graph.js";

/** Options of matchSubgraph. */
export interface SubgraphMatchOptions {
  /** Stop after this many distinct mappings (the result then says `cap`). */
  maxMappings: number;
  /** Time budget in milliseconds, only honoured when `now` is given. */
  budgetMs: number | null;
  now: (() => number) | null;
  /** May this pattern net map onto this target net? (Roles, for instance.) Default: any. */
  netCompatible?: (pattern: NetNode, target: NetNode) => boolean;
}

/** One mapping: pattern part ref -> target part ref, pattern net -> target net. */
export interface SubgraphMapping {
  parts: Record<string, string>;
  nets: Record<string, string>;
}

export interface SubgraphMatchResult {
  mappings: SubgraphMapping[];
  complete: boolean;
  reason?: "cap" | "budget";
}

/** How many search steps pass between two looks at the clock. */
const STEPS_PER_CLOCK_READ = 64;

/** Every injective mapping of the pattern's parts and nets into the target, kind and role preserving. */
export function matchSubgraph(
  pattern: CircuitGraph,
  target: CircuitGraph,
  options: SubgraphMatchOptions,
): SubgraphMatchResult {
  const netOk = options.netCompatible ?? (() => true);
  const patternParts = pattern.parts;
  if (patternParts.length === 0) return { mappings: [], complete: true };
  const candidates = new Map<PartNode, PartNode[]>();
  for (const p of patternParts)
    candidates.set(
      p,
      target.parts.filter((t) => partCompatible(p, t)),
    );
  const order = searchOrder(pattern, candidates);

  const partMap = new Map<PartNode, PartNode>();
  const usedTargets = new Set<PartNode>();
  const netMap = new Map<string, string>();
  const netTaken = new Map<string, string>();
  const found = new Map<string, SubgraphMapping>();
  let steps = 0;
  // Held in an object so that narrowing does not survive the recursive calls that change it.
  const state: { stop: "cap" | "budget" | null } = { stop: null };
  const start = options.now !== null && options.budgetMs !== null ? options.now() : 0;

  const overBudget = (): boolean => {
    if (options.now === null || options.budgetMs === null) return false;
    steps += 1;
    if (steps % STEPS_PER_CLOCK_READ !== 0) return false;
    return options.now() - start > options.budgetMs;
  };

  const record = (): void => {
    const parts: Record<string, string> = {};
    for (const p of patternParts) parts[p.ref] = partMap.get(p)!.ref;
    const key = patternParts.map((p) => parts[p.ref]).join("\u0000");
    if (found.has(key)) return;
    if (found.size >= options.maxMappings) {
      state.stop = "cap";
      return;
    }
    found.set(key, { parts, nets: Object.fromEntries(netMap) });
  };

  const extend = (k: number): void => {
    if (state.stop !== null) return;
    if (overBudget()) {
      state.stop = "budget";
      return;
    }
    if (k === order.length) {
      record();
      return;
    }
    const p = order[k]!;
    const anchored = p.pins.find((e) => netMap.has(e.net));
    const pool =
      anchored !== undefined ? partsOn(target, netMap.get(anchored.net)!) : candidates.get(p)!;
    for (const t of pool) {
      if (state.stop !== null) return;
      if (usedTargets.has(t) || !partCompatible(p, t)) continue;
      for (const assignment of pinAssignments(p.pins, t.pins)) {
        const added = bindNets(assignment, pattern, target, netMap, netTaken, netOk);
        if (added === null) continue;
        partMap.set(p, t);
        usedTargets.add(t);
        extend(k + 1);
        partMap.delete(p);
        usedTargets.delete(t);
        for (const net of added) {
          netTaken.delete(netMap.get(net)!);
          netMap.delete(net);
        }
        if (state.stop !== null) return;
      }
    }
  };
  extend(0);
  const mappings = [...found.values()];
  return state.stop === null
    ? { mappings, complete: true }
    : { mappings, complete: false, reason: state.stop };
}

/** Same kind, same polarity, and the same multiset of pin role classes. */
function partCompatible(p: PartNode, t: PartNode): boolean {
  if (p.kind !== t.kind || p.polarised !== t.polarised || p.pins.length !== t.pins.length)
    return false;
  const a = p.pins.map((e) => e.roleClass).sort();
  const b = t.pins.map((e) => e.roleClass).sort();
  return a.every((r, i) => r === b[i]);
}

/** Pattern parts in VF2 order: start from the rarest, then always a part touching mapped nets. */
function searchOrder(pattern: CircuitGraph, candidates: Map<PartNode, PartNode[]>): PartNode[] {
  const left = new Set(pattern.parts);
  const touched = new Set<string>();
  const order: PartNode[] = [];
  while (left.size > 0) {
    let best: PartNode | null = null;
    let bestScore: [number, number, number] = [-1, 0, 0];
    for (const p of left) {
      const links = p.pins.filter((e) => touched.has(e.net)).length;
      const score: [number, number, number] = [links, -(candidates.get(p)?.length ?? 0), -p.index];
      if (best === null || compareScores(score, bestScore) > 0) {
        best = p;
        bestScore = score;
      }
    }
    left.delete(best!);
    order.push(best!);
    for (const e of best!.pins) touched.add(e.net);
  }
  return order;
}

function compareScores(a: [number, number, number], b: [number, number, number]): number {
  for (let i = 0; i < 3; i++) if (a[i] !== b[i]) return a[i]! - b[i]!;
  return 0;
}

function partsOn(graph: CircuitGraph, net: string): PartNode[] {
  const out: PartNode[] = [];
  for (const e of graph.netByName.get(net)?.pins ?? []) {
    const part = graph.partByRef.get(e.part);
    if (part !== undefined && !out.includes(part)) out.push(part);
  }
  return out;
}

/** Every way to pair pattern pins with target pins of the same role class. */
function* pinAssignments(
  pins: PinEdge[],
  targetPins: PinEdge[],
): Generator<Array<[PinEdge, PinEdge]>> {
  const classes = [...new Set(pins.map((e) => e.roleClass))];
  const perClass = classes.map((c) => ({
    mine: pins.filter((e) => e.roleClass === c),
    theirs: targetPins.filter((e) => e.roleClass === c),
  }));
  function* go(i: number, acc: Array<[PinEdge, PinEdge]>): Generator<Array<[PinEdge, PinEdge]>> {
    if (i === perClass.length) {
      yield acc;
      return;
    }
    const { mine, theirs } = perClass[i]!;
    for (const perm of permutations(theirs)) {
      yield* go(i + 1, [...acc, ...mine.map((e, j): [PinEdge, PinEdge] => [e, perm[j]!])]);
    }
  }
  yield* go(0, []);
}

function* permutations<T>(items: T[]): Generator<T[]> {
  if (items.length <= 1) {
    yield items;
    return;
  }
  for (let i = 0; i < items.length; i++) {
    const rest = [...items.slice(0, i), ...items.slice(i + 1)];
    for (const tail of permutations(rest)) yield [items[i]!, ...tail];
  }
}

/**
 * Extend the net mapping for one part's pins. Returns the pattern nets newly bound, or null
 * (with nothing changed) when a pin disagrees with the mapping so far.
 */
function bindNets(
  assignment: Array<[PinEdge, PinEdge]>,
  pattern: CircuitGraph,
  target: CircuitGraph,
  netMap: Map<string, string>,
  netTaken: Map<string, string>,
  netOk: (pattern: NetNode, target: NetNode) => boolean,
): string[] | null {
  const added: string[] = [];
  const undo = (): null => {
    for (const net of added) {
      netTaken.delete(netMap.get(net)!);
      netMap.delete(net);
    }
    return null;
  };
  for (const [mine, theirs] of assignment) {
    const bound = netMap.get(mine.net);
    if (bound !== undefined) {
      if (bound !== theirs.net) return undo();
      continue;
    }
    if (netTaken.has(theirs.net)) return undo();
    const pNet = pattern.netByName.get(mine.net)!;
    const tNet = target.netByName.get(theirs.net)!;
    // A target net must offer at least as many pins as the pattern net asks for.
    if (tNet.pins.length < pNet.pins.length || !netOk(pNet, tNet)) return undo();
    netMap.set(mine.net, theirs.net);
    netTaken.set(theirs.net, mine.net);
    added.push(mine.net);
  }
  return added;
}
