/**
 * Nets that changed between two paired boards. Nets are matched through the part pairing (the
 * nets the paired parts' pins place on each other), never by name, so renamed nets are not a
 * change. A matched net changed when a pin joined or left it (pins named by their part's ref on
 * their own board) or its role or touchability changed; a net with no counterpart is listed alone.
 */
import type { CircuitGraph, NetNode } from "../graph/circuit-graph.js";
import type { TeardownRecord } from "../record/types.js";
import type { PartPairing } from "./part-pairs.js";

/** One net that changed; a null side means the net has no counterpart there. */
export interface NetChange {
  a: string | null;
  b: string | null;
  /** Pins on the A net whose counterparts are not on the B net (`REF.role`, A's refs). */
  onlyA: string[];
  /** Pins on the B net whose counterparts are not on the A net (`REF.role`, B's refs). */
  onlyB: string[];
  /** Other changes, in plain words (role, touchability). */
  changes: string[];
}

/** The nets that changed, A's nets first (by name), then B's nets with no counterpart. */
export function netChanges(
  a: TeardownRecord,
  b: TeardownRecord,
  pairing: PartPairing,
): NetChange[] {
  const { a: ga, b: gb } = pairing.graphs;
  const partnerOfA = new Map(pairing.pairs.map((p) => [p.a, p.b]));
  const out: NetChange[] = [];
  for (const net of sortedNets(ga)) {
    if (net.pins.length === 0 && !(net.name in a.nets)) continue;
    const other = pairing.netForward.get(net.name);
    const bNet = other === undefined ? undefined : gb.netByName.get(other);
    if (bNet === undefined) {
      out.push({ a: net.name, b: null, onlyA: pinNames(net), onlyB: [], changes: [] });
      continue;
    }
    // Pins as "partner ref on the other board + role class", so a pin matches its counterpart.
    const seenFromA = net.pins.map((e) => key(partnerOfA.get(e.part), e.roleClass));
    const seenFromB = bNet.pins.map((e) => key(e.part, e.roleClass));
    const onlyA = net.pins
      .filter((e) => !takeOne(seenFromB, key(partnerOfA.get(e.part), e.roleClass)))
      .map(pinName);
    const onlyB = bNet.pins
      .filter((e) => !takeOne(seenFromA, key(e.part, e.roleClass)))
      .map(pinName);
    const changes: string[] = [];
    if (net.role !== bNet.role) changes.push(`role ${net.role ?? "none"} → ${bNet.role ?? "none"}`);
    if (net.accessible !== bNet.accessible)
      changes.push(bNet.accessible ? "now touchable" : "no longer touchable");
    if (onlyA.length + onlyB.length + changes.length > 0)
      out.push({ a: net.name, b: bNet.name, onlyA, onlyB, changes });
  }
  for (const net of sortedNets(gb)) {
    if (net.pins.length === 0 && !(net.name in b.nets)) continue;
    if (!pairing.netBackward.has(net.name))
      out.push({ a: null, b: net.name, onlyA: [], onlyB: pinNames(net), changes: [] });
  }
  return out;
}

function key(ref: string | undefined, roleClass: string): string {
  return ref === undefined ? "\u0000unpaired" : `${ref}\u0000${roleClass}`;
}

/** Remove one occurrence of k from the list; false when there is none. */
function takeOne(list: string[], k: string): boolean {
  const at = list.indexOf(k);
  if (at < 0) return false;
  list.splice(at, 1);
  return true;
}

function pinName(e: { part: string; role: string }): string {
  return `${e.part}.${e.role}`;
}

function pinNames(net: NetNode): string[] {
  return net.pins.map(pinName).sort();
}

function sortedNets(g: CircuitGraph): NetNode[] {
  return [...g.nets].sort((p, q) => (p.name < q.name ? -1 : p.name > q.name ? 1 : 0));
}
