/**
 * The circuit as a typed bipartite graph: one node per part, one node per net, and one edge per
 * pin, labelled by the pin's role. Every later stage (checks, blocks, fingerprints, matching)
 * reads this graph instead of the record, so the rules about roles live in one place.
 */
import type { NetRole, TeardownRecord } from "../record/types.js";
import { kindInfo } from "./kinds.js";

/** One pin: the edge between a part node and a net node. */
export interface PinEdge {
  part: string;
  /** The role as written in the record (`anode`, `a`, `p2`, ...). */
  role: string;
  /**
   * The role up to the kind's symmetry: both ends of a resistor are `end`, every contact of a
   * connector is `contact`, otherwise the role itself. Matching and fingerprints use this.
   */
  roleClass: string;
  net: string;
}

/** A part node. */
export interface PartNode {
  ref: string;
  kind: string;
  value: number | null;
  polarised: boolean;
  /** The kind is in the pin table. */
  known: boolean;
  /** Takes part in the simulation: a known kind that is not documentation only. */
  simulated: boolean;
  /** True when the pins may be swapped (a resistor, a non-polarised capacitor). */
  symmetric: boolean;
  /** Pins in the record's order. */
  pins: PinEdge[];
  /** Position in the record's part list (kept so duplicates stay apart). */
  index: number;
}

/** A net node. */
export interface NetNode {
  name: string;
  role: NetRole | null;
  accessible: boolean;
  pins: PinEdge[];
}

/** The typed bipartite graph of one record. */
export interface CircuitGraph {
  parts: PartNode[];
  nets: NetNode[];
  /** First part with each ref (duplicates are reported by checkCircuit, not resolved here). */
  partByRef: Map<string, PartNode>;
  netByName: Map<string, NetNode>;
}

/** Role class of a pin: symmetric kinds collapse to `end`, variadic kinds to `contact`. */
export function pinRoleClass(kind: string, polarised: boolean, role: string): string {
  const info = kindInfo(kind);
  if (info === null) return role;
  if (info.variadic) return "contact";
  if (kind === "capacitor" && polarised) return role;
  return info.symmetric ? "end" : role;
}

/** Build the typed bipartite graph of a record (never throws on odd input). */
export function buildCircuitGraph(record: TeardownRecord): CircuitGraph {
  const netByName = new Map<string, NetNode>();
  const netOf = (name: string): NetNode => {
    let node = netByName.get(name);
    if (node === undefined) {
      const info = record.nets[name];
      node = { name, role: info?.role ?? null, accessible: info?.accessible ?? false, pins: [] };
      netByName.set(name, node);
    }
    return node;
  };
  // Nets named only in `nets` exist too (they may be floating or unused).
  for (const name of Object.keys(record.nets).sort()) netOf(name);

  const parts: PartNode[] = [];
  const partByRef = new Map<string, PartNode>();
  record.parts.forEach((p, index) => {
    const info = kindInfo(p.kind);
    const symmetric = info !== null && info.symmetric && !(p.kind === "capacitor" && p.polarised);
    const node: PartNode = {
      ref: p.ref,
      kind: p.kind,
      value: p.value,
      polarised: p.polarised,
      known: info !== null,
      simulated: info !== null && !info.documentationOnly,
      symmetric,
      pins: [],
      index,
    };
    for (const [role, net] of Object.entries(p.pins)) {
      const edge: PinEdge = {
        part: p.ref,
        role,
        roleClass: pinRoleClass(p.kind, p.polarised, role),
        net,
      };
      node.pins.push(edge);
      netOf(net).pins.push(edge);
    }
    parts.push(node);
    if (!partByRef.has(p.ref)) partByRef.set(p.ref, node);
  });
  const nets = [...netByName.values()].sort((a, b) =>
    a.name < b.name ? -1 : a.name > b.name ? 1 : 0,
  );
  return { parts, nets, partByRef, netByName };
}

/** The net on a part's pin of the given role, or null when the part has no such pin. */
export function netOfPin(part: PartNode, role: string): string | null {
  return part.pins.find((e) => e.role === role)?.net ?? null;
}

/** The distinct nets a part touches, in pin order. */
export function netsOfPart(part: PartNode): string[] {
  return [...new Set(part.pins.map((e) => e.net))];
}

/** The parts with at least one pin on a net (each part once, in record order). */
export function partsOnNet(graph: CircuitGraph, net: string): PartNode[] {
  const node = graph.netByName.get(net);
  if (node === undefined) return [];
  const seen = new Set<PartNode>();
  for (const edge of node.pins) {
    const p = partOfEdge(graph, edge);
    if (p !== null) seen.add(p);
  }
  return [...seen].sort((a, b) => a.index - b.index);
}

/** The part node an edge belongs to (edges keep the ref; duplicates resolve to the first). */
export function partOfEdge(graph: CircuitGraph, edge: PinEdge): PartNode | null {
  return graph.partByRef.get(edge.part) ?? null;
}

/** For a two-pin part: the net at its other end from `net`, or null if it is not on `net`. */
export function otherNet(part: PartNode, net: string): string | null {
  if (part.pins.length !== 2) return null;
  const [a, b] = part.pins as [PinEdge, PinEdge];
  if (a.net === net) return b.net;
  if (b.net === net) return a.net;
  return null;
}

/** True when a two-pin part joins exactly these two nets (in either order). */
export function joins(part: PartNode, netA: string, netB: string): boolean {
  if (part.pins.length !== 2) return false;
  const [a, b] = part.pins as [PinEdge, PinEdge];
  return (a.net === netA && b.net === netB) || (a.net === netB && b.net === netA);
}

/** Parts that share a net with the given part (excluding itself), in record order. */
export function neighbourParts(graph: CircuitGraph, part: PartNode): PartNode[] {
  const out = new Set<PartNode>();
  for (const net of netsOfPart(part))
    for (const p of partsOnNet(graph, net)) if (p !== part) out.add(p);
  return [...out].sort((a, b) => a.index - b.index);
}

/** Names of the nets whose declared role is one of `roles`, sorted. */
export function netsWithRole(graph: CircuitGraph, roles: readonly NetRole[]): string[] {
  return graph.nets.filter((n) => n.role !== null && roles.includes(n.role)).map((n) => n.name);
}
