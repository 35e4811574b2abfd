/**
 * Reverse protection: a diode straight across an LED the other way round (anode on the LED's
 * cathode, cathode on its anode). On AC it carries the half-cycle the LED would block, so the
 * LED never sees more reverse voltage than one diode drop. It rectifies nothing: the current it
 * passes goes straight back, so it is never also a half-wave rectifier.
 */
import { netOfPin, type PartNode } from "../graph/circuit-graph.js";
import type { BlockContext } from "./block-context.js";
import { makeBlock, type Block } from "./block-types.js";

/** A reverse-protection pair: the block and its diode. */
export interface ReverseProtectionFound {
  block: Block;
  diode: PartNode;
}

/** Find every diode in antiparallel with an LED (one block per diode and LED pair). */
export function findReverseProtection(ctx: BlockContext): ReverseProtectionFound[] {
  const found: ReverseProtectionFound[] = [];
  for (const led of ctx.graph.parts) {
    if (led.kind !== "led" || !led.simulated) continue;
    const a = netOfPin(led, "anode");
    const k = netOfPin(led, "cathode");
    if (a === null || k === null || a === k) continue;
    for (const d of ctx.graph.parts) {
      if (d.kind !== "diode" || !d.simulated) continue;
      if (netOfPin(d, "anode") === k && netOfPin(d, "cathode") === a)
        found.push({ block: makeBlock("reverse-protection", [d, led]), diode: d });
    }
  }
  return found;
}
