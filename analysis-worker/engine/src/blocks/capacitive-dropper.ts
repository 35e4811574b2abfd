/**
 * Capacitive dropper: a capacitor in series with the supply path, so that the load current
 * flows through it, between a supply net (perhaps through fuses or resistors) and the rest of
 * the circuit. The block also takes the resistors in parallel with it (its bleeder) and the
 * series resistors of the same chain (its surge resistor). A capacitor straight across line and
 * neutral is a shunt, never a dropper, and a series RC whose far end reaches nothing but the
 * other side of the supply (a snubber) is not one either.
 */
import type { BlockContext } from "./block-context.js";
import { makeBlock, type DropperFound } from "./block-types.js";

/** Find capacitive droppers on the supply chains (one block per chain, either side). */
export function findCapacitiveDroppers(ctx: BlockContext): DropperFound[] {
  const found: DropperFound[] = [];
  for (const chain of ctx.paths.chains) {
    if (!chain.feedsCircuit) continue;
    const capSteps = chain.steps.filter((s) => s.parts.some((p) => p.kind === "capacitor"));
    if (capSteps.length === 0) continue;
    const capacitors = capSteps.flatMap((s) => s.parts.filter((p) => p.kind === "capacitor"));
    const bleeders = capSteps.flatMap((s) => s.parts.filter((p) => p.kind === "resistor"));
    const surge = chain.steps
      .filter((s) => s.parts.every((p) => p.kind === "resistor"))
      .flatMap((s) => s.parts);
    found.push({
      block: makeBlock("capacitive-dropper", [...capacitors, ...bleeders, ...surge]),
      chain,
      capacitors,
    });
  }
  return found;
}
