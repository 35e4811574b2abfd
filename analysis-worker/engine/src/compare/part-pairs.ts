/**
 * Which part of board A is which part of board B, with a confidence per pair and the values
 * side by side. The pairing itself is the topology comparison (structure first, then equal
 * value, then kind), then settled among interchangeable parts (see settleInterchangeable).
 * Nothing here reads a ref or the order of the part list, so renaming and reordering a board
 * changes nothing but the names.
 */
import { buildCircuitGraph, type CircuitGraph, type PartNode } from "../graph/circuit-graph.js";
import { kindInfo } from "../graph/kinds.js";
import { compareTopology, netRoles, type PartPair } from "../fingerprint/compare-topology.js";
import { correspondingNets, type PairingState } from "../fingerprint/pair-by-neighbours.js";
import type { Part, TeardownRecord } from "../record/types.js";
import { formatValue } from "../values/format-value.js";

/** How a pair was found: the structure, an equal value, or the kind alone. */
export type PairedBy = PartPair["by"];

/** One matched pair, as the comparison lists it. */
export interface ComparedPair {
  a: string;
  b: string;
  kind: string;
  /** Value, tolerance, model parameters and ratings as text; null when the part states none. */
  values: { a: string | null; b: string | null };
  /** True when the value, tolerance, a model parameter or a rating differs. */
  differs: boolean;
  /** 0..1: how sure the pairing is (see `pairConfidence`). */
  confidence: number;
  by: PairedBy;
  marking: { a: string | null; b: string | null };
}

/** The pairing of two boards with the nets that correspond under it. */
export interface PartPairing {
  pairs: ComparedPair[];
  onlyA: string[];
  onlyB: string[];
  /** Net of A -> net of B, for nets the pairs place on each other. */
  netForward: Map<string, string>;
  netBackward: Map<string, string>;
  graphs: { a: CircuitGraph; b: CircuitGraph };
}

/** Confidence of a pair found by structure, equal value, or kind alone, before its pins count. */
const BASE_CONFIDENCE: Readonly<Record<PairedBy, number>> = {
  structure: 1,
  value: 0.6,
  kind: 0.4,
};
/** Share of a pair's confidence that rests on its pins landing on corresponding nets. */
const PIN_SHARE_OF_CONFIDENCE = 0.5;
/** Two numbers closer than this, relative to the larger, are equal. */
const EQUAL_RELATIVE = 1e-9;

/**
 * Confidence of one pair: the base for how it was found, scaled by the share of its pins that
 * land on corresponding nets: base × (1 − s + s × pinsOnCorrespondingNets / pins), s = 0.5.
 * An unchanged part among unchanged neighbours scores 1.
 */
export function pairConfidence(by: PairedBy, agreeingPins: number, pins: number): number {
  const share = pins === 0 ? 1 : agreeingPins / pins;
  const c = BASE_CONFIDENCE[by] * (1 - PIN_SHARE_OF_CONFIDENCE + PIN_SHARE_OF_CONFIDENCE * share);
  return Math.round(c * 100) / 100;
}

/** Pair the parts of two boards by structure and describe each pair. */
export function pairParts(a: TeardownRecord, b: TeardownRecord): PartPairing {
  const ga = buildCircuitGraph(a);
  const gb = buildCircuitGraph(b);
  const topo = compareTopology(a, b);
  const pairs: Raw[] = topo.pairs.map((p) => ({
    x: ga.partByRef.get(p.a)!,
    y: gb.partByRef.get(p.b)!,
    by: p.by,
  }));
  settleInterchangeable(ga, gb, pairs);

  const { forward, backward } = netsUnder(pairs, netRoles(ga, gb));
  const partA = new Map(a.parts.map((p) => [p.ref, p]));
  const partB = new Map(b.parts.map((p) => [p.ref, p]));
  const pairedA = new Set(pairs.map((p) => p.x));
  const pairedB = new Set(pairs.map((p) => p.y));
  const described = pairs
    .map(({ x, y, by }): ComparedPair => {
      const pa = partA.get(x.ref)!;
      const pb = partB.get(y.ref)!;
      return {
        a: x.ref,
        b: y.ref,
        kind: x.kind,
        values: { a: valuesText(pa), b: valuesText(pb) },
        differs: !sameValues(pa, pb),
        confidence: pairConfidence(by, agreeingPins(x, y, forward), x.pins.length),
        by,
        marking: { a: pa.marking, b: pb.marking },
      };
    })
    .sort((p, q) => cmp(p.a, q.a));
  return {
    pairs: described,
    onlyA: ga.parts
      .filter((p) => !pairedA.has(p))
      .map((p) => p.ref)
      .sort(cmp),
    onlyB: gb.parts
      .filter((p) => !pairedB.has(p))
      .map((p) => p.ref)
      .sort(cmp),
    netForward: forward,
    netBackward: backward,
    graphs: { a: ga, b: gb },
  };
}

interface Raw {
  x: PartNode;
  y: PartNode;
  by: PairedBy;
}

/** Nets that correspond under a list of pairs (mutual best votes of the pairs' pins). */
function netsUnder(
  pairs: readonly Raw[],
  netRole: (side: "a" | "b", net: string) => string | null,
): {
  forward: Map<string, string>;
  backward: Map<string, string>;
} {
  const state: PairingState = {
    pairs: new Map(pairs.map((p) => [p.x, { other: p.y, by: p.by }])),
    pairedB: new Set(pairs.map((p) => p.y)),
    add: () => undefined,
    netRole,
  };
  return correspondingNets(state);
}

/**
 * Pins of x on nets that correspond to the nets of y's pins of the same role class: per class,
 * the size of the multiset intersection, which is the best pin-to-pin assignment there is.
 */
export function agreeingPins(x: PartNode, y: PartNode, forward: Map<string, string>): number {
  let count = 0;
  for (const cls of new Set(x.pins.map((e) => e.roleClass))) {
    const theirs = y.pins.filter((e) => e.roleClass === cls).map((e) => e.net);
    for (const e of x.pins.filter((p) => p.roleClass === cls)) {
      const mapped = forward.get(e.net);
      const at = mapped === undefined ? -1 : theirs.indexOf(mapped);
      if (at >= 0) {
        theirs.splice(at, 1);
        count++;
      }
    }
  }
  return count;
}

/**
 * Where two interchangeable parts (same kind, value and pins) could both be the partner of one
 * part, keep the one that sits better: more pins on corresponding nets (counted without the pair
 * itself), and on a tie the one whose agreeing pins come earlier in the kind's pin order (the
 * anode before the cathode). Identical LEDs in one string with one taken out are the case: the
 * structure cannot say which one went, and this rule says it was the one further down the
 * string. It reads no refs and no list order, so a renamed or reordered board pairs the same.
 */
function settleInterchangeable(ga: CircuitGraph, gb: CircuitGraph, pairs: Raw[]): void {
  // Each swap strictly improves one pair's standing; the bound only guards against a cycle.
  for (let round = 0; round < ga.parts.length + gb.parts.length; round++) {
    const pairedA = new Set(pairs.map((p) => p.x));
    const pairedB = new Set(pairs.map((p) => p.y));
    let swapped = false;
    for (let i = 0; i < pairs.length && !swapped; i++) {
      const { x, y, by } = pairs[i]!;
      const others = pairs.filter((_, k) => k !== i);
      const { forward, backward } = netsUnder(others, netRoles(ga, gb));
      const here = standing(x, y, forward);
      const u = ga.parts
        .filter((q) => !pairedA.has(q) && interchangeable(q, x))
        .find((q) => better(standing(q, y, forward), here));
      if (u !== undefined) {
        pairs[i] = { x: u, y, by };
        swapped = true;
        continue;
      }
      const hereB = standing(y, x, backward);
      const v = gb.parts
        .filter((q) => !pairedB.has(q) && interchangeable(q, y))
        .find((q) => better(standing(q, x, backward), hereB));
      if (v !== undefined) {
        pairs[i] = { x, y: v, by };
        swapped = true;
      }
    }
    if (!swapped) return;
  }
}

/** Positions (in `y`'s pin order) of the pins where x lands on corresponding nets. */
function standing(x: PartNode, y: PartNode, forward: Map<string, string>): number[] {
  const hit: number[] = [];
  for (const cls of new Set(x.pins.map((e) => e.roleClass))) {
    const theirs = y.pins
      .map((e, at) => ({ net: e.net, at }))
      .filter((_, at) => y.pins[at]!.roleClass === cls);
    for (const e of x.pins.filter((p) => p.roleClass === cls)) {
      const mapped = forward.get(e.net);
      const k = mapped === undefined ? -1 : theirs.findIndex((t) => t.net === mapped);
      if (k >= 0) {
        // A symmetric part's ends are one class: its hits count at the class's first position.
        hit.push(y.pins.findIndex((p) => p.roleClass === cls));
        theirs.splice(k, 1);
      }
    }
  }
  return hit.sort((p, q) => p - q);
}

/** More pins agreeing, or as many with earlier positions. */
function better(p: number[], q: number[]): boolean {
  if (p.length !== q.length) return p.length > q.length;
  for (let i = 0; i < p.length; i++) if (p[i] !== q[i]) return p[i]! < q[i]!;
  return false;
}

function interchangeable(p: PartNode, q: PartNode): boolean {
  return (
    p.kind === q.kind &&
    p.polarised === q.polarised &&
    p.pins.length === q.pins.length &&
    (p.value === null ? q.value === null : q.value !== null && sameNumber(p.value, q.value))
  );
}

/** True when value, tolerance, model parameters and ratings all agree. */
export function sameValues(a: Part, b: Part): boolean {
  const num = (x: number | null | undefined, y: number | null | undefined): boolean =>
    x === null || x === undefined
      ? y === null || y === undefined
      : y !== null && y !== undefined && sameNumber(x, y);
  const sameRecord = (x: Record<string, unknown>, y: Record<string, unknown>): boolean => {
    const keys = new Set([...Object.keys(x), ...Object.keys(y)]);
    return [...keys].every((k) => {
      const p = x[k];
      const q = y[k];
      if (typeof p === "number" || typeof q === "number")
        return num(p as number | undefined, q as number | undefined);
      return p === q;
    });
  };
  return (
    num(a.value, b.value) &&
    num(a.tolerance, b.tolerance) &&
    sameRecord(a.model, b.model) &&
    sameRecord(a.rating as Record<string, unknown>, b.rating as Record<string, unknown>)
  );
}

/** Units of the rating fields, for the values text. */
const RATING_UNITS: Readonly<Record<string, string>> = {
  volts: "V",
  amps: "A",
  watts: "W",
  surge_amps: "A surge",
};

/** The part's value, tolerance, model parameters and ratings as one short line. */
export function valuesText(p: Part): string | null {
  const bits: string[] = [];
  if (p.value !== null) bits.push(formatValue(p.value, kindInfo(p.kind)?.unit ?? null));
  if (p.tolerance !== null) bits.push(`±${Number((p.tolerance * 100).toPrecision(3))}%`);
  for (const [k, v] of Object.entries(p.model).sort(([x], [y]) => cmp(x, y)))
    bits.push(`${k} ${formatValue(v)}`);
  const rating = Object.entries(p.rating)
    .filter(([, v]) => v !== undefined)
    .sort(([x], [y]) => cmp(x, y))
    .map(([k, v]) =>
      typeof v === "number" ? `${formatValue(v)}${RATING_UNITS[k] ?? ` ${k}`}` : String(v),
    );
  if (rating.length > 0) bits.push(`rated ${rating.join(" ")}`);
  return bits.length === 0 ? null : bits.join(", ");
}

function sameNumber(x: number, y: number): boolean {
  return Math.abs(x - y) <= EQUAL_RELATIVE * Math.max(Math.abs(x), Math.abs(y));
}

function cmp(x: string, y: string): number {
  return x < y ? -1 : x > y ? 1 : 0;
}
