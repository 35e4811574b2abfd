/**
 * The common matcher of the block finders: a block's pattern is written as a handful of parts
 * with pin roles on named pattern nets, turned into a small circuit graph and searched for with
 * the VF2-style matcher, so every finder honours kinds and pin roles the same way. Also small
 * lookups the finders share (parts of a kind on a net, parts across two nets).
 */
import {
  buildCircuitGraph,
  joins,
  otherNet,
  partsOnNet,
  type CircuitGraph,
  type NetNode,
  type PartNode,
} from "../graph/circuit-graph.js";
import { matchSubgraph, type SubgraphMapping } from "../graph/subgraph-match.js";
import type { TeardownRecord } from "../record/types.js";

/** One part of a block pattern: a kind and its pins on pattern nets. */
export interface PatternPart {
  name: string;
  kind: string;
  pins: Record<string, string>;
}

/** Internal searches never expect more than this many mappings of one small pattern. */
const BLOCK_MATCH_CAP = 10_000;

/** A pattern as a circuit graph (the pattern's nets carry no roles). */
export function patternGraph(parts: readonly PatternPart[]): CircuitGraph {
  const record: TeardownRecord = {
    record: 1,
    title: "block pattern",
    summary: null,
    device: { category: null, rated_supply: { vrms: 0, hz: 0 }, tags: [] },
    parts: parts.map((p) => ({
      ref: p.name,
      kind: p.kind,
      value: null,
      value_text: null,
      tolerance: null,
      rating: {},
      marking: null,
      polarised: false,
      closed: true,
      model: {},
      pins: p.pins,
      note: null,
    })),
    nets: {},
    measurements: [],
    board: { spacings: [] },
  };
  return buildCircuitGraph(record);
}

/** Every placement of the pattern in the circuit (pattern nets map to distinct circuit nets). */
export function matchPattern(
  pattern: CircuitGraph,
  graph: CircuitGraph,
  netCompatible?: (pattern: NetNode, target: NetNode) => boolean,
): SubgraphMapping[] {
  const result = matchSubgraph(pattern, graph, {
    maxMappings: BLOCK_MATCH_CAP,
    budgetMs: null,
    now: null,
    netCompatible,
  });
  // A block pattern is a few parts; running into the cap would mean a bug in a pattern.
  if (!result.complete) throw new Error(`block pattern search stopped early (${result.reason})`);
  return result.mappings;
}

/** Simulated two-pin parts of one of the kinds on a net, whose other end is elsewhere. */
export function twoPinPartsOn(
  graph: CircuitGraph,
  net: string,
  kinds: readonly string[],
): PartNode[] {
  return partsOnNet(graph, net).filter(
    (p) =>
      p.simulated &&
      kinds.includes(p.kind) &&
      otherNet(p, net) !== null &&
      otherNet(p, net) !== net,
  );
}

/** Simulated parts of one of the kinds joining exactly these two nets. */
export function partsAcross(
  graph: CircuitGraph,
  a: string,
  b: string,
  kinds: readonly string[],
): PartNode[] {
  if (a === b) return [];
  return graph.parts.filter((p) => p.simulated && kinds.includes(p.kind) && joins(p, a, b));
}
