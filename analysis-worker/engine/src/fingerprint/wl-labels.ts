/**
 * Weisfeiler-Lehman relabelling (Shervashidze et al., "Weisfeiler-Lehman graph kernels", JMLR
 * 2011) over the typed bipartite circuit graph. Each round, a node's new label is the hash of
 * its old label and the sorted multiset of (pin role class, neighbour's old label) over its
 * pins, so part nodes see their nets and net nodes see the parts on them. Labels are 32-bit
 * signed FNV-1a hashes and depend only on kinds, value decades, pin role classes and net roles.
 */
import type { CircuitGraph, NetNode, PartNode } from "../graph/circuit-graph.js";
import { kindInfo } from "../graph/kinds.js";
import { fnv1a32 } from "./fnv-hash.js";

/** The number of relabelling rounds of the fingerprint. */
export const WL_ITERATIONS = 3;

/** Labels of every node after each round (index 0 is the initial labelling). */
export interface WlLabels {
  /** parts[i][k]: label of graph.parts[i] after k rounds. */
  parts: number[][];
  /** nets[j][k]: label of graph.nets[j] after k rounds. */
  nets: number[][];
}

/** How the initial labels are made; compareTopology varies these. */
export interface WlOptions {
  iterations: number;
  /** Put the value's decade into a part's first label (kinds that carry a value only). */
  useValues: boolean;
  /** Extra text for a part's first label (compareTopology's anchors); none by default. */
  partSeed?: (part: PartNode) => string;
}

/** The initial label text of a part: kind, polarity, and the decade of its value. */
export function partLabelText(part: PartNode, useValues: boolean): string {
  const polarity = part.kind === "capacitor" && part.polarised ? "+" : "";
  const info = kindInfo(part.kind);
  const hasValue =
    info !== null &&
    info.unit !== null &&
    part.value !== null &&
    part.value > 0 &&
    Number.isFinite(part.value);
  const decade = useValues && hasValue ? `@${Math.floor(Math.log10(part.value!))}` : "";
  return `part:${part.kind}${polarity}${decade}`;
}

/** The initial label text of a net: its role as line, neutral or other (never its name). */
export function netLabelText(net: NetNode): string {
  const role = net.role === "line" || net.role === "neutral" ? net.role : "other";
  return `net:${role}`;
}

/** Run the relabelling and return every node's label after each round. */
export function wlLabels(graph: CircuitGraph, options: WlOptions): WlLabels {
  const netIndex = new Map(graph.nets.map((n, j) => [n.name, j]));
  let partLabels = graph.parts.map((p) =>
    fnv1a32(partLabelText(p, options.useValues) + (options.partSeed?.(p) ?? "")),
  );
  let netLabels = graph.nets.map((n) => fnv1a32(netLabelText(n)));
  const parts = partLabels.map((l) => [l]);
  const nets = netLabels.map((l) => [l]);
  // Pins as index pairs, so each round is one pass over the edges. Duplicate refs stay apart
  // because each part node keeps its own pin list.
  const partPins = graph.parts.map((p) =>
    p.pins.map((e) => ({ cls: e.roleClass, net: netIndex.get(e.net)! })),
  );
  const netPins: Array<Array<{ cls: string; part: number }>> = graph.nets.map(() => []);
  partPins.forEach((pins, i) => pins.forEach((e) => netPins[e.net]!.push({ cls: e.cls, part: i })));

  for (let k = 1; k <= options.iterations; k++) {
    const nextParts = partPins.map((pins, i) =>
      relabel(
        k,
        partLabels[i]!,
        pins.map((e) => `${e.cls}=${netLabels[e.net]}`),
      ),
    );
    const nextNets = netPins.map((pins, j) =>
      relabel(
        k,
        netLabels[j]!,
        pins.map((e) => `${e.cls}=${partLabels[e.part]}`),
      ),
    );
    partLabels = nextParts;
    netLabels = nextNets;
    partLabels.forEach((l, i) => parts[i]!.push(l));
    netLabels.forEach((l, j) => nets[j]!.push(l));
  }
  return { parts, nets };
}

/** The compressed label of one node: its own label and the sorted multiset of its neighbours'. */
function relabel(round: number, own: number, neighbours: string[]): number {
  return fnv1a32(`wl${round}|${own}|${neighbours.sort().join(";")}`);
}
