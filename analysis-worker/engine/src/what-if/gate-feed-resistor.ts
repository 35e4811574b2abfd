/**
 * The resistor that feeds a thyristor's or triac's gate from the supply side: the upper arm of a
 * gate divider, or the series resistor of an RC phase network. It is the part a practitioner
 * changes to make the gate fire earlier at a lower supply.
 *
 * From the gate, the network's node is the gate net itself or the net one series element away
 * (a gate resistor, a diode, a two-pin part of unknown kind such as a diac). On that node a
 * divider has one resistor to the device's reference terminal and one to somewhere else; an RC
 * network has a capacitor and a resistor to somewhere else. That resistor may be the first of a
 * chain (a pot, a trimmer and a fixed resistor in series): the chain is followed through nets
 * that join nothing but two resistors, and the resistor at its supply end is the answer, the one
 * that meets the supply side of the circuit.
 */
import {
  buildCircuitGraph,
  netOfPin,
  otherNet,
  partsOnNet,
  type CircuitGraph,
  type PartNode,
} from "../graph/circuit-graph.js";
import type { TeardownRecord } from "../record/types.js";

const SERIES_GATE_KINDS: ReadonlySet<string> = new Set(["resistor", "diode", "zener"]);

const REFERENCE_PIN: Record<string, string> = { thyristor: "cathode", triac: "mt1" };

function twoPin(graph: CircuitGraph, net: string, kind: string, except: PartNode | null) {
  return partsOnNet(graph, net).filter(
    (p) => p !== except && p.kind === kind && p.pins.length === 2 && otherNet(p, net) !== net,
  );
}

/** Follows a chain of series resistors from `start` (leaving `net`) to its far end. */
function supplyEnd(graph: CircuitGraph, start: PartNode, net: string): PartNode {
  let part = start;
  let at = otherNet(part, net)!;
  const seen = new Set<PartNode>([part]);
  for (;;) {
    const here = partsOnNet(graph, at);
    const node = graph.netByName.get(at);
    if (here.length !== 2 || (node?.role ?? null) !== null) return part;
    const next = here.find((p) => p !== part)!;
    if (next.kind !== "resistor" || next.pins.length !== 2 || seen.has(next)) return part;
    seen.add(next);
    const far = otherNet(next, at);
    if (far === null || far === at) return part;
    part = next;
    at = far;
  }
}

/** The ref of the resistor feeding this device's gate from the supply side, or null when there is none. */
export function gateFeedResistor(record: TeardownRecord, deviceRef: string): string | null {
  const graph = buildCircuitGraph(record);
  const device = graph.partByRef.get(deviceRef);
  if (device === undefined || !(device.kind in REFERENCE_PIN)) return null;
  const gate = netOfPin(device, "gate");
  const reference = netOfPin(device, REFERENCE_PIN[device.kind]!);
  if (gate === null || reference === null || gate === reference) return null;
  const nodes: Array<{ net: string; series: PartNode | null }> = [{ net: gate, series: null }];
  for (const p of partsOnNet(graph, gate)) {
    if (p === device || p.pins.length !== 2 || !(SERIES_GATE_KINDS.has(p.kind) || !p.known))
      continue;
    const far = otherNet(p, gate);
    if (far !== null && far !== gate && far !== reference) nodes.push({ net: far, series: p });
  }
  for (const { net, series } of nodes) {
    const resistors = twoPin(graph, net, "resistor", series);
    const upper = resistors.filter((r) => {
      const far = otherNet(r, net);
      return far !== reference && far !== gate;
    });
    if (upper.length !== 1) continue; // none, or two feeds: no single part to suggest
    const lowerArm = resistors.some((r) => otherNet(r, net) === reference);
    const capacitor = twoPin(graph, net, "capacitor", series).some(
      (c) => otherNet(c, net) !== otherNet(upper[0]!, net),
    );
    if (lowerArm || capacitor) return supplyEnd(graph, upper[0]!, net).ref;
  }
  return null;
}
