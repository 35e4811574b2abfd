/**
 * What every block finder reads: the circuit graph, the supply chains and the AC sources a
 * rectifier can take its input from (either side of the mains, or a mains transformer's
 * secondary), each with the nets its current returns through.
 */
import { buildCircuitGraph, netOfPin, type CircuitGraph } from "../graph/circuit-graph.js";
import type { TeardownRecord } from "../record/types.js";
import { chainNets, traceSupplyPaths, type SupplyPaths } from "./supply-path.js";

/** An AC source for a rectifier: the nets it offers and the nets its current returns to. */
export interface AcSource {
  nets: ReadonlySet<string>;
  returns: ReadonlySet<string>;
}

export interface BlockContext {
  graph: CircuitGraph;
  paths: SupplyPaths;
  /**
   * The mains nets and the nets of each declared net's chain, either side: where a divider's
   * midpoint or a rectifier's output cannot be. Branch nets are left out on purpose: a divider
   * hung from the mains has its midpoint on a branch.
   */
  pathNets: ReadonlySet<string>;
  sources: AcSource[];
}

/** Build the shared context of block recognition for a record. */
export function blockContext(record: TeardownRecord): BlockContext {
  const graph = buildCircuitGraph(record);
  const paths = traceSupplyPaths(graph);
  const pathNets = new Set([
    ...paths.mainsLine,
    ...paths.mainsNeutral,
    ...paths.chains.flatMap(chainNets),
  ]);
  const sources: AcSource[] = [
    { nets: paths.lineSide, returns: paths.neutralSide },
    { nets: paths.neutralSide, returns: paths.lineSide },
  ];
  // A transformer whose primary sits on the supply path is a mains transformer; each end of its
  // secondary is a source returning through the other end.
  for (const t of graph.parts) {
    if (t.kind !== "transformer") continue;
    const [p1, p2, s1, s2] = ["p1", "p2", "s1", "s2"].map((r) => netOfPin(t, r));
    if (p1 == null || p2 == null || s1 == null || s2 == null || p1 === p2 || s1 === s2) continue;
    if (!pathNets.has(p1) || !pathNets.has(p2)) continue;
    sources.push(
      { nets: new Set([s1]), returns: new Set([s2]) },
      { nets: new Set([s2]), returns: new Set([s1]) },
    );
  }
  return { graph, paths, pathNets, sources };
}

/** True when the net is one a rectifier may take mains or transformer AC from. */
export function isSourceNet(ctx: BlockContext, net: string): boolean {
  return ctx.sources.some((s) => s.nets.has(net));
}
