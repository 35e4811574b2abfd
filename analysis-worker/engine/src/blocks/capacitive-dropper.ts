/**
 * Capacitive dropper: a capacitor in series with the supply, so that the current of whatever it
 * feeds (a rectifier, an LED, a load of any kind) flows through it, rectifier or not. It is read
 * off the supply branches (supply-path.ts), so other branches on the same nets do not hide it.
 * The block takes the capacitors of the run, the resistors in parallel with them (the bleeder)
 * and the run's series resistors (its surge resistor).
 * What is not a dropper, and why:
 * - a capacitor straight across line and neutral: a shunt (an X capacitor);
 * - a series RC whose far end reaches nothing but the other side of the supply: a snubber or a
 *   damped X capacitor, whichever end the capacitor is on. The one exception is a capacitor
 *   bridged by a resistor (a bleeder) feeding a resistor to the other side: a bleeder marks a
 *   capacitor that passes load current, so the resistor is read as the load;
 * - a run whose far end goes back to its own side through a load, a semiconductor or a switch:
 *   it sits in parallel with that part (an RC snubber across a triac, a reservoir across a
 *   load), it does not feed it. A polarised capacitor is never in a run (it cannot pass AC);
 * - a capacitor of the RC network driving a thyristor's or triac's gate (gate-network.ts).
 */
import type { BlockContext } from "./block-context.js";
import { makeBlock, type DropperFound } from "./block-types.js";
import { gateNetwork } from "./gate-network.js";

/** Find capacitive droppers on the supply branches (one block per run). */
export function findCapacitiveDroppers(ctx: BlockContext): DropperFound[] {
  const gateParts = new Set(ctx.graph.parts.flatMap((p) => gateNetwork(ctx, p) ?? []));
  const found = new Map<string, DropperFound>();
  for (const run of ctx.paths.branches) {
    const capSteps = run.steps.filter((s) => s.parts.some((p) => p.kind === "capacitor"));
    if (capSteps.length === 0) continue;
    const capacitors = capSteps.flatMap((s) => s.parts.filter((p) => p.kind === "capacitor"));
    if (capacitors.some((c) => gateParts.has(c)) || run.returnsHome) continue;
    const bleeders = capSteps.flatMap((s) => s.parts.filter((p) => p.kind === "resistor"));
    const resistorLoad = bleeders.length > 0 && run.across.some((p) => p.kind === "resistor");
    if (!run.feedsCircuit && !resistorLoad) continue;
    const surge = run.steps
      .filter((s) => s.parts.every((p) => p.kind === "resistor"))
      .flatMap((s) => s.parts);
    const block = makeBlock("capacitive-dropper", [...capacitors, ...bleeders, ...surge]);
    const key = block.parts.join(",");
    if (!found.has(key)) found.set(key, { block, chain: run, capacitors });
  }
  return [...found.values()];
}
