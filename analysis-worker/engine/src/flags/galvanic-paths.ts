/**
 * Galvanic (conducting) connections between nets: through resistors, fuses, inductors, closed
 * switches, diodes, LEDs, zeners, thyristors, triacs, resistive loads and each winding of a
 * transformer, but never from a transformer's primary to its secondary, and never through a
 * capacitor, a varistor below its clamping voltage, an open switch or a documentation-only part.
 * A kind the engine does not know is taken as conducting, the safe assumption for a shock path.
 */
import type { Part, TeardownRecord } from "../record/types.js";
import { kindInfo } from "../graph/kinds.js";

/** A conducting connection between two nets through one part, with its resistance (0 for semiconductors and links). */
export interface GalvanicEdge {
  ref: string;
  a: string;
  b: string;
  ohms: number;
}

/** The lowest-resistance conducting path between nets. */
export interface GalvanicPath {
  /** Alternating net, ref, net, ... from the start net to the target net. */
  steps: string[];
  nets: string[];
  parts: string[];
  /** Sum of the resistances along the path (resistors and resistive loads; semiconductors count 0). */
  ohms: number;
}

function pairs(nets: string[]): Array<[string, string]> {
  const out: Array<[string, string]> = [];
  for (let i = 1; i < nets.length; i++) if (nets[i] !== nets[0]) out.push([nets[0]!, nets[i]!]);
  return out;
}

/** The conducting pin pairs of one part. */
function partEdges(p: Part): GalvanicEdge[] {
  const pin = (r: string) => p.pins[r];
  const edge = (a: string | undefined, b: string | undefined, ohms: number): GalvanicEdge[] =>
    a !== undefined && b !== undefined && a !== b ? [{ ref: p.ref, a, b, ohms }] : [];
  const ends = Object.values(p.pins);
  switch (p.kind) {
    case "resistor":
      return edge(ends[0], ends[1], p.value ?? 0);
    case "fuse":
    case "inductor":
      return edge(ends[0], ends[1], p.model.r ?? 0);
    case "switch":
      return p.closed ? edge(ends[0], ends[1], 0) : [];
    case "load":
      return p.model.r === undefined && p.model.c !== undefined
        ? []
        : edge(ends[0], ends[1], p.model.r ?? 0);
    case "diode":
    case "zener":
    case "led":
      return edge(pin("anode"), pin("cathode"), 0);
    case "thyristor":
    case "triac":
      return pairs(ends).flatMap(([a, b]) => edge(a, b, 0));
    case "transformer":
      return [
        ...edge(pin("p1"), pin("p2"), p.model.rp ?? 0),
        ...edge(pin("s1"), pin("s2"), p.model.rs ?? 0),
      ];
    case "capacitor":
    case "varistor":
      return [];
    default: {
      const info = kindInfo(p.kind);
      if (info !== null && info.documentationOnly) return [];
      return pairs(ends).flatMap(([a, b]) => edge(a, b, 0));
    }
  }
}

/** Every conducting connection of a record. */
export function galvanicEdges(rec: TeardownRecord): GalvanicEdge[] {
  return rec.parts.flatMap(partEdges);
}

/** Nets reached from the start nets through conducting parts only. */
export function galvanicReach(
  edges: readonly GalvanicEdge[],
  start: Iterable<string>,
): Set<string> {
  const seen = new Set(start);
  const queue = [...seen];
  while (queue.length > 0) {
    const n = queue.pop()!;
    for (const e of edges) {
      const far = e.a === n ? e.b : e.b === n ? e.a : null;
      if (far !== null && !seen.has(far)) {
        seen.add(far);
        queue.push(far);
      }
    }
  }
  return seen;
}

/** Lowest-resistance conducting path (Dijkstra; ties broken by fewer steps) from `from` to any target net, or null. */
export function galvanicPath(
  edges: readonly GalvanicEdge[],
  from: string,
  targets: ReadonlySet<string>,
): GalvanicPath | null {
  const dist = new Map<string, { ohms: number; hops: number }>([[from, { ohms: 0, hops: 0 }]]);
  const prev = new Map<string, { net: string; ref: string }>();
  const done = new Set<string>();
  for (;;) {
    let cur: string | null = null;
    for (const [n, d] of dist) {
      if (done.has(n)) continue;
      const best = cur === null ? null : dist.get(cur)!;
      if (best === null || d.ohms < best.ohms || (d.ohms === best.ohms && d.hops < best.hops))
        cur = n;
    }
    if (cur === null) return null;
    if (targets.has(cur)) {
      const steps = [cur];
      for (let n = cur; prev.has(n); n = prev.get(n)!.net)
        steps.unshift(prev.get(n)!.net, prev.get(n)!.ref);
      return {
        steps,
        nets: steps.filter((_, i) => i % 2 === 0),
        parts: steps.filter((_, i) => i % 2 === 1),
        ohms: dist.get(cur)!.ohms,
      };
    }
    done.add(cur);
    const here = dist.get(cur)!;
    for (const e of edges) {
      const far = e.a === cur ? e.b : e.b === cur ? e.a : null;
      if (far === null || done.has(far)) continue;
      const cand = { ohms: here.ohms + e.ohms, hops: here.hops + 1 };
      const old = dist.get(far);
      if (
        old === undefined ||
        cand.ohms < old.ohms ||
        (cand.ohms === old.ohms && cand.hops < old.hops)
      ) {
        dist.set(far, cand);
        prev.set(far, { net: cur, ref: e.ref });
      }
    }
  }
}
