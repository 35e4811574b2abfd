/**
 * The topology fingerprint stored for similarity search: every Weisfeiler-Lehman label of every
 * node over the initial labelling and WL_ITERATIONS rounds, as a sorted set of 32-bit signed
 * integers. Refs, net names and part order do not enter it; swapping a resistor's two ends
 * changes nothing, because symmetric kinds' pins share one role class.
 */
import { buildCircuitGraph } from "../graph/circuit-graph.js";
import type { TeardownRecord } from "../record/types.js";
import { WL_ITERATIONS, wlLabels } from "./wl-labels.js";

/** The Weisfeiler-Lehman feature set of a record: unique labels, sorted ascending. */
export function fingerprint(record: TeardownRecord): number[] {
  const labels = wlLabels(buildCircuitGraph(record), {
    iterations: WL_ITERATIONS,
    useValues: true,
  });
  const all = new Set<number>();
  for (const row of [...labels.parts, ...labels.nets]) for (const l of row) all.add(l);
  return [...all].sort((a, b) => a - b);
}

/** Jaccard similarity of two fingerprints (|A∩B| / |A∪B|), 1 for two empty sets. */
export function fingerprintSimilarity(a: readonly number[], b: readonly number[]): number {
  const setA = new Set(a);
  const setB = new Set(b);
  let common = 0;
  for (const x of setA) if (setB.has(x)) common += 1;
  const union = setA.size + setB.size - common;
  return union === 0 ? 1 : common / union;
}
