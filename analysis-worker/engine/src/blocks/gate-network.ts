/**
 * The network that drives a thyristor's or triac's gate, shared by the two trigger finders. It
 * looks at the gate net itself and at each net one series element away from it (a resistor, a
 * diode, a zener, or a two-pin part of a kind the engine does not know, such as a diac), and
 * accepts either
 * - a divider: two resistors from that node to two different nets, or
 * - an RC network: a resistor to one net and a capacitor to another,
 * never counting the series element itself. A lone gate resistor is neither.
 */
import { netOfPin, otherNet, partsOnNet, type PartNode } from "../graph/circuit-graph.js";
import type { BlockContext } from "./block-context.js";
import { twoPinPartsOn } from "./block-pattern.js";

const SERIES_GATE_KINDS: ReadonlySet<string> = new Set(["resistor", "diode", "zener"]);

/** The gate device's gate and reference pins, by kind. */
const GATE_PINS: Record<"thyristor" | "triac", { gate: string; reference: string }> = {
  thyristor: { gate: "gate", reference: "cathode" },
  triac: { gate: "gate", reference: "mt1" },
};

/** The parts of the network driving this device's gate (without the device), or null. */
export function gateNetwork(ctx: BlockContext, device: PartNode): PartNode[] | null {
  if (device.kind !== "thyristor" && device.kind !== "triac") return null;
  const pins = GATE_PINS[device.kind];
  const gate = netOfPin(device, pins.gate);
  const reference = netOfPin(device, pins.reference);
  if (gate === null || reference === null || gate === reference) return null;
  const parts = new Set<PartNode>();
  const nodes: Array<{ net: string; series: PartNode | null }> = [{ net: gate, series: null }];
  for (const p of partsOnNet(ctx.graph, gate)) {
    if (p === device || p.pins.length !== 2 || !(SERIES_GATE_KINDS.has(p.kind) || !p.known))
      continue;
    const far = otherNet(p, gate);
    if (far !== null && far !== gate && far !== reference) nodes.push({ net: far, series: p });
  }
  for (const { net, series } of nodes) {
    const resistors = twoPinPartsOn(ctx.graph, net, ["resistor"]).filter((p) => p !== series);
    const capacitors = twoPinPartsOn(ctx.graph, net, ["capacitor"]).filter((p) => p !== series);
    const rFar = new Set(resistors.map((r) => otherNet(r, net)));
    const cFar = new Set(capacitors.map((c) => otherNet(c, net)));
    const divider = rFar.size >= 2;
    const rc = [...rFar].some((a) => [...cFar].some((b) => a !== b));
    if (!divider && !rc) continue;
    for (const p of [...resistors, ...capacitors]) parts.add(p);
    if (series !== null) parts.add(series);
  }
  return parts.size > 0 ? [...parts] : null;
}
