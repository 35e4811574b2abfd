/**
 * The topology fingerprint stored for similarity search: every Weisfeiler-Lehman label of every
 * node over the initial labelling and WL_ITERATIONS rounds, as a sorted set of 32-bit signed
 * integers. Only kinds, pin role classes and net roles enter it: refs, net names, part order and
 * values do not, so a later batch with other values stays as close as its structure says (values
 * are a separate, smaller set that only orders equals, see valueFeatures). Swapping a
 * resistor's two ends changes nothing, because symmetric kinds' pins share one role class.
 */
import { buildCircuitGraph } from "../graph/circuit-graph.js";
import type { TeardownRecord } from "../record/types.js";
import { WL_ITERATIONS, wlLabels } from "./wl-labels.js";

/**
 * The version of the stored feature definitions (fingerprint, value features, similarity bands,
 * fragment features). Rows written under another version are recomputed at worker start.
 */
export const FINGERPRINT_VERSION = 2;

/** The Weisfeiler-Lehman feature set of a record, values left out: unique labels, sorted. */
export function fingerprint(record: TeardownRecord): number[] {
  const labels = wlLabels(buildCircuitGraph(record), {
    iterations: WL_ITERATIONS,
    useValues: false,
  });
  const all = new Set<number>();
  for (const row of [...labels.parts, ...labels.nets]) for (const l of row) all.add(l);
  return sortedInts(all);
}

/** Rounds of relabelling in the value features: a part's value decade and its nets' roles. */
const VALUE_FEATURE_ROUNDS = 1;

/**
 * Value features: each part's label with its value decade, alone and after one round (so a
 * decade is tied to where the part sits). Used only to order entries whose topology scores tie.
 */
export function valueFeatures(record: TeardownRecord): number[] {
  const labels = wlLabels(buildCircuitGraph(record), {
    iterations: VALUE_FEATURE_ROUNDS,
    useValues: true,
  });
  const all = new Set<number>();
  for (const row of labels.parts) for (const l of row) all.add(l);
  return sortedInts(all);
}

function sortedInts(set: Set<number>): number[] {
  return [...set].sort((a, b) => a - b);
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
