/**
 * Features that survive subgraph embedding, so a GIN containment query (`features @> fragment's`)
 * returns every entry that can contain a fragment and, for fragments with any uncommon pair of
 * parts, few others. Two kinds of feature:
 * - a part kind (with polarity) counted: "at least n capacitors" is one feature per n, because a
 *   circuit holding the fragment holds at least as many parts of each kind;
 * - a link: two distinct parts with pins on one net, as (kind, pin role class) on each side,
 *   unordered. An embedding maps the fragment's net to one circuit net, so the link is there too.
 * Net roles are left out (a fragment may leave them out) and so are values.
 */
import { buildCircuitGraph, type PartNode } from "../graph/circuit-graph.js";
import type { TeardownRecord } from "../record/types.js";
import { fnv1a32 } from "./fnv-hash.js";

function kindText(p: PartNode): string {
  return p.kind === "capacitor" && p.polarised ? `${p.kind}+` : p.kind;
}

/** The containment features of a record (or a fragment), sorted and distinct. */
export function fragmentFeatures(record: TeardownRecord): number[] {
  const graph = buildCircuitGraph(record);
  const out = new Set<number>();
  const counts = new Map<string, number>();
  for (const p of graph.parts) {
    const k = kindText(p);
    const n = (counts.get(k) ?? 0) + 1;
    counts.set(k, n);
    out.add(fnv1a32(`count:${k}#${n}`));
  }
  for (const net of graph.nets) {
    const ends = net.pins.map((e) => ({
      part: e.part,
      text: `${kindText(graph.partByRef.get(e.part)!)}.${e.roleClass}`,
    }));
    for (let i = 0; i < ends.length; i++)
      for (let j = i + 1; j < ends.length; j++) {
        if (ends[i]!.part === ends[j]!.part) continue;
        const [x, y] = [ends[i]!.text, ends[j]!.text].sort();
        out.add(fnv1a32(`link:${x}|${y}`));
      }
  }
  return [...out].sort((a, b) => a - b);
}
