/**
 * The supply path: from each declared line and neutral net, the chain of series passives (fuse,
 * resistor, capacitor, inductor, switch) that the load current must pass before it reaches the
 * rest of the circuit. Parts that go straight across to the other side of the supply (an X
 * capacitor, a varistor, a lamp) are shunts and do not end the chain. Droppers, fuses, surge
 * resistors and rectifier inputs are all read off these chains.
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
/** Kinds through which the chain is still "the mains" for surge and X-capacitor purposes. */
const LOW_IMPEDANCE_KINDS: ReadonlySet<string> = new Set(["fuse", "inductor", "switch"]);

/** One series step: the parts in parallel between two consecutive nets of a chain. */
export interface ChainStep {
  from: string;
  to: string;
  parts: PartNode[];
}

/** A chain from one supply net. */
export interface SupplyChain {
  side: "line" | "neutral";
  start: string;
  steps: ChainStep[];
  /** The last net of the chain, where the rest of the circuit begins. */
  end: string;
  /** True when the end net carries more of the circuit (a rectifier, a load, a branch). */
  feedsCircuit: boolean;
}

/** All chains and the net sets derived from them. */
export interface SupplyPaths {
  chains: SupplyChain[];
  /** Every net on a line-side chain (start, steps, end), and likewise for the neutral side. */
  lineSide: Set<string>;
  neutralSide: Set<string>;
  /** Nets reached from the supply through fuses, switches and inductors only: still "the mains". */
  mainsLine: Set<string>;
  mainsNeutral: Set<string>;
  /** The declared supply nets. */
  lineNets: string[];
  neutralNets: string[];
}

/** Trace the supply chains of a circuit graph from its declared line and neutral nets. */
export function traceSupplyPaths(graph: CircuitGraph): SupplyPaths {
  const lineNets = netsWithRole(graph, ["line"]);
  const neutralNets = netsWithRole(graph, ["neutral"]);
  const supply = new Set([...lineNets, ...neutralNets]);
  // First pass: only the declared nets count as "the other side"; the second pass also treats
  // the other side's mains nets that way, so an X capacitor after a neutral fuse is a shunt.
  let line = lineNets.map((n) => walk(graph, n, "line", new Set(neutralNets), supply));
  let neutral = neutralNets.map((n) => walk(graph, n, "neutral", new Set(lineNets), supply));
  const mainsOf = (chains: SupplyChain[]): Set<string> => new Set(chains.flatMap(mainsNets));
  const firstLine = mainsOf(line);
  const firstNeutral = mainsOf(neutral);
  line = lineNets.map((n) => walk(graph, n, "line", firstNeutral, supply));
  neutral = neutralNets.map((n) => walk(graph, n, "neutral", firstLine, supply));
  const chains = [...line, ...neutral];
  return {
    chains,
    lineSide: new Set(line.flatMap(chainNets)),
    neutralSide: new Set(neutral.flatMap(chainNets)),
    mainsLine: mainsOf(line),
    mainsNeutral: mainsOf(neutral),
    lineNets,
    neutralNets,
  };
}

/** Every net of a chain, start to end. */
export function chainNets(chain: SupplyChain): string[] {
  return [chain.start, ...chain.steps.map((s) => s.to)];
}

/** The start net and the nets after it reached through low-impedance steps only. */
function mainsNets(chain: SupplyChain): string[] {
  const out = [chain.start];
  for (const step of chain.steps) {
    if (!step.parts.every((p) => LOW_IMPEDANCE_KINDS.has(p.kind))) break;
    out.push(step.to);
  }
  return out;
}

/**
 * Walk one chain. While the chain is still on the mains (only fuses, switches and inductors
 * behind it), every two-pin part straight across to the other side is a shunt (an X capacitor,
 * a varistor, a lamp). Further on, a passive part across to the other side (a series RC, a
 * resistor) is still passed over, but an active part or a load there is what the chain feeds.
 */
function walk(
  graph: CircuitGraph,
  start: string,
  side: SupplyChain["side"],
  opposite: ReadonlySet<string>,
  supply: ReadonlySet<string>,
): SupplyChain {
  const steps: ChainStep[] = [];
  const used = new Set<PartNode>();
  const visited = new Set([start]);
  let current = start;
  let onMains = true;
  for (;;) {
    const onward = new Map<string, PartNode[]>();
    let others = 0;
    for (const part of partsOnNet(graph, current)) {
      if (used.has(part) || !part.simulated || netsOfPart(part).length < 2) continue;
      const far = otherNet(part, current);
      const series = far !== null && SERIES_KINDS.has(part.kind);
      if (far !== null && opposite.has(far)) {
        if (onMains || series) continue; // a shunt across the supply
        others += 1; // a load or a semiconductor across to the other side: what the chain feeds
      } else if (series) {
        const group = onward.get(far) ?? [];
        group.push(part);
        onward.set(far, group);
      } else {
        others += 1;
      }
    }
    const [only] = [...onward];
    if (others > 0 || onward.size !== 1 || only === undefined) {
      return { side, start, steps, end: current, feedsCircuit: others > 0 || onward.size > 1 };
    }
    const [next, parts] = only;
    if (visited.has(next) || supply.has(next))
      return { side, start, steps, end: current, feedsCircuit: false };
    steps.push({ from: current, to: next, parts });
    for (const p of parts) used.add(p);
    visited.add(next);
    onMains = onMains && parts.every((p) => LOW_IMPEDANCE_KINDS.has(p.kind));
    current = next;
  }
}
