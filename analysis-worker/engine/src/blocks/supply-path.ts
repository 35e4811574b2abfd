/**
 * The supply path: which nets are still "the mains", and the runs of series passives (fuse,
 * resistor, capacitor, inductor, switch) that current from the mains must pass before it reaches
 * the rest of the circuit. Parts that go straight across to the other side of the supply (an X
 * capacitor, a varistor, a lamp) are shunts and do not end a run. Droppers, fuses, surge
 * resistors and rectifier inputs are all read off these runs.
 *
 * Two views, for two uses:
 * - `chains`: one run per declared line or neutral net, ending at the first place the path
 *   branches. The supply-protection flags read these ("is there a fuse in series").
 * - `branches`: every run that leaves a mains net, and every run after a net where the path
 *   forks into several series runs and feeds nothing else. Block recognition reads these, so
 *   that a dropper is found the same whether its board has one branch or five hanging on the
 *   same fused line.
 */
import {
  netsOfPart,
  netsWithRole,
  otherNet,
  partsOnNet,
  type CircuitGraph,
  type PartNode,
} from "../graph/circuit-graph.js";

/** Kinds that can sit in series in the supply path. */
const SERIES_KINDS: ReadonlySet<string> = new Set([
  "fuse",
  "resistor",
  "capacitor",
  "inductor",
  "switch",
]);
/** A polarised capacitor cannot carry the mains' alternating current in series. */
function inSeriesKind(part: PartNode): boolean {
  return SERIES_KINDS.has(part.kind) && !(part.kind === "capacitor" && part.polarised);
}

/** Kinds through which a net is still "the mains" for surge and X-capacitor purposes. */
const LOW_IMPEDANCE_KINDS: ReadonlySet<string> = new Set(["fuse", "inductor", "switch"]);

/** One series step: the parts in parallel between two consecutive nets of a run. */
export interface ChainStep {
  from: string;
  to: string;
  parts: PartNode[];
}

/** A run of series steps from a net on one side of the supply. */
export interface SupplyChain {
  side: "line" | "neutral";
  start: string;
  steps: ChainStep[];
  /** The last net of the run, where the rest of the circuit begins. */
  end: string;
  /** True when the end net carries more of the circuit (a rectifier, a load, a branch). */
  feedsCircuit: boolean;
  /** Passive parts from the end net straight across to the other side (a load resistor, an RC leg). */
  across: PartNode[];
  /**
   * A load, semiconductor or switch joins the end back to the run's start or its own side's
   * mains: the run sits in parallel with that part (a snubber across a triac, a reservoir
   * across a load, a gate RC), it does not feed it.
   */
  returnsHome: boolean;
}

/** All runs and the net sets derived from them. */
export interface SupplyPaths {
  /** One run per declared supply net, to the first branch (see the file comment). */
  chains: SupplyChain[];
  /** Every run leaving a mains net or a pure branch point (see the file comment). */
  branches: SupplyChain[];
  /** Every net on the line side (mains nets, runs and branches), and likewise for neutral. */
  lineSide: Set<string>;
  neutralSide: Set<string>;
  /** Nets reached from the supply through fuses, switches and inductors only: still "the mains". */
  mainsLine: Set<string>;
  mainsNeutral: Set<string>;
  /** The declared supply nets. */
  lineNets: string[];
  neutralNets: string[];
}

/** Trace the supply paths of a circuit graph from its declared line and neutral nets. */
export function traceSupplyPaths(graph: CircuitGraph): SupplyPaths {
  const lineNets = netsWithRole(graph, ["line"]);
  const neutralNets = netsWithRole(graph, ["neutral"]);
  const mainsLine = mainsReach(graph, lineNets, new Set(neutralNets));
  const mainsNeutral = mainsReach(graph, neutralNets, new Set(lineNets));
  const sides = [
    { side: "line" as const, starts: lineNets, own: mainsLine, opposite: mainsNeutral },
    { side: "neutral" as const, starts: neutralNets, own: mainsNeutral, opposite: mainsLine },
  ];
  const chains = sides.flatMap((s) =>
    s.starts.map((n) => walk(graph, s.side, n, null, s.own, s.opposite)),
  );
  const branches = sides.flatMap((s) => branchesOf(graph, s.side, s.own, s.opposite));
  const sideNets = (side: SupplyChain["side"], mains: Set<string>): Set<string> =>
    new Set([
      ...mains,
      ...[...chains, ...branches]
        .filter((c) => c.side === side && !c.returnsHome)
        .flatMap(chainNets),
    ]);
  return {
    chains,
    branches,
    lineSide: sideNets("line", mainsLine),
    neutralSide: sideNets("neutral", mainsNeutral),
    mainsLine,
    mainsNeutral,
    lineNets,
    neutralNets,
  };
}

/** Every net of a run, start to end. */
export function chainNets(chain: SupplyChain): string[] {
  return [chain.start, ...chain.steps.map((s) => s.to)];
}

/** The declared nets and every net reached from them through fuses, switches and inductors. */
function mainsReach(
  graph: CircuitGraph,
  starts: readonly string[],
  stop: ReadonlySet<string>,
): Set<string> {
  const reached = new Set(starts);
  const queue = [...starts];
  for (let net = queue.shift(); net !== undefined; net = queue.shift()) {
    for (const p of partsOnNet(graph, net)) {
      if (!p.simulated || !LOW_IMPEDANCE_KINDS.has(p.kind)) continue;
      const far = otherNet(p, net);
      if (far === null || reached.has(far) || stop.has(far)) continue;
      reached.add(far);
      queue.push(far);
    }
  }
  return reached;
}

/** What one net of a run offers: series groups onward, shunts across, and anything else. */
interface NetSurvey {
  /** Series parts to each next net (parts in parallel form one group). */
  onward: Map<string, PartNode[]>;
  /** Passive parts straight across to the other side. */
  across: PartNode[];
  /** Loads, semiconductors, multi-pin parts: what the run feeds. */
  others: number;
  /** One of the `others` has another pin on a `home` net (see SupplyChain.returnsHome). */
  returnsHome: boolean;
}

/**
 * Looks at one net. While on the mains, every two-pin part across to the other side is a shunt
 * (an X capacitor, a varistor, a lamp); further on, a passive part across is still passed over,
 * but an active part or a load there is what the run feeds. Series parts back to this side's
 * mains close a loop and are left out.
 */
function survey(
  graph: CircuitGraph,
  net: string,
  used: ReadonlySet<PartNode>,
  onMains: boolean,
  own: ReadonlySet<string>,
  opposite: ReadonlySet<string>,
  home: ReadonlySet<string> = own,
): NetSurvey {
  const out: NetSurvey = { onward: new Map(), across: [], others: 0, returnsHome: false };
  for (const part of partsOnNet(graph, net)) {
    if (used.has(part) || !part.simulated || netsOfPart(part).length < 2) continue;
    const far = otherNet(part, net);
    const series = far !== null && inSeriesKind(part);
    if (!series && part.pins.some((e) => e.net !== net && home.has(e.net))) out.returnsHome = true;
    if (far !== null && opposite.has(far)) {
      if (onMains || series) out.across.push(part);
      else out.others += 1;
    } else if (series && own.has(far!)) {
      continue; // back to this side's mains: a loop, or a mains-to-mains link
    } else if (series) {
      const group = out.onward.get(far!) ?? [];
      group.push(part);
      out.onward.set(far!, group);
    } else {
      out.others += 1;
    }
  }
  return out;
}

/**
 * Walks one run from `start`. With `first` null the run is the declared net's chain: it stops
 * where the path branches. With a first step given, the run starts with it (a branch).
 */
function walk(
  graph: CircuitGraph,
  side: SupplyChain["side"],
  start: string,
  first: ChainStep | null,
  own: ReadonlySet<string>,
  opposite: ReadonlySet<string>,
): SupplyChain {
  const steps: ChainStep[] = [];
  const used = new Set<PartNode>();
  const visited = new Set([start]);
  let current = start;
  let onMains = own.has(start);
  const take = (step: ChainStep): void => {
    steps.push(step);
    for (const p of step.parts) used.add(p);
    visited.add(step.to);
    onMains = onMains && own.has(step.to);
    current = step.to;
  };
  if (first !== null) take(first);
  for (;;) {
    const home = new Set([...own, start]);
    const s = survey(graph, current, used, onMains, onMains ? new Set() : own, opposite, home);
    const end = (feedsCircuit: boolean): SupplyChain => ({
      side,
      start,
      steps,
      end: current,
      feedsCircuit,
      across: s.across,
      returnsHome: current !== start && s.returnsHome,
    });
    const [only] = [...s.onward];
    if (s.others > 0 || s.onward.size !== 1 || only === undefined)
      return end(s.others > 0 || s.onward.size > 1);
    const [next, parts] = only;
    if (visited.has(next)) return end(false);
    take({ from: current, to: next, parts });
  }
}

/**
 * Every branch of one side: a run for each series group leaving a mains net towards a net that
 * is not the mains, and, where a run ends at a pure branch point (several series groups onward
 * and nothing else), a run for each group from there. Each net is branched from once and each
 * part walks in at most one branch step, so the work stays linear in the board's size.
 */
function branchesOf(
  graph: CircuitGraph,
  side: SupplyChain["side"],
  own: ReadonlySet<string>,
  opposite: ReadonlySet<string>,
): SupplyChain[] {
  const out: SupplyChain[] = [];
  const claimed = new Set<PartNode>();
  const branched = new Set<string>();
  const queue = [...own];
  for (let net = queue.shift(); net !== undefined; net = queue.shift()) {
    if (branched.has(net)) continue;
    branched.add(net);
    const s = survey(graph, net, claimed, own.has(net), own, opposite);
    for (const [far, parts] of s.onward) {
      if (own.has(far)) continue;
      const run = walk(graph, side, net, { from: net, to: far, parts }, own, opposite);
      for (const step of run.steps) for (const p of step.parts) claimed.add(p);
      out.push(run);
      const last = run.steps[run.steps.length - 1]!;
      const fork = survey(graph, run.end, new Set(last.parts), false, own, opposite);
      if (fork.others === 0 && fork.onward.size > 1) queue.push(run.end);
    }
  }
  return out;
}
