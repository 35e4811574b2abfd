/**
 * Surge limiter, two shapes (our reading of the record format, docs/teardown-record.md):
 * - a varistor across the supply: one end on a line-side mains net, the other on a neutral-side
 *   one (mains nets are those reached through fuses, switches and inductors only);
 * - a series resistor in the supply path that limits the inrush into a dropper capacitor or a
 *   rectifier: a resistor-only step of a chain that has a dropper capacitor further on, or whose
 *   end feeds a rectifier. An NTC thermistor is traced as a resistor and is found the same way.
 * A series resistor that only feeds an LED or a load is a current limiter, not a surge limiter.
 */
import type { BlockContext } from "./block-context.js";
import { makeBlock, type Block, type DropperFound } from "./block-types.js";

/** Find surge limiters (one block per varistor or resistor). */
export function findSurgeLimiters(
  ctx: BlockContext,
  droppers: readonly DropperFound[],
  rectifierInputs: ReadonlySet<string>,
): Block[] {
  const blocks: Block[] = [];
  const { mainsLine, mainsNeutral } = ctx.paths;
  for (const v of ctx.graph.parts) {
    if (v.kind !== "varistor" || !v.simulated || v.pins.length !== 2) continue;
    const [a, b] = v.pins.map((e) => e.net) as [string, string];
    if ((mainsLine.has(a) && mainsNeutral.has(b)) || (mainsLine.has(b) && mainsNeutral.has(a)))
      blocks.push(makeBlock("surge-limiter", [v]));
  }
  const dropperChains = new Set(droppers.map((d) => d.chain));
  for (const chain of [...ctx.paths.chains, ...ctx.paths.branches]) {
    const firstCap = chain.steps.findIndex((s) => s.parts.some((p) => p.kind === "capacitor"));
    const feedsRectifier = chain.feedsCircuit && rectifierInputs.has(chain.end);
    chain.steps.forEach((step, i) => {
      if (!step.parts.every((p) => p.kind === "resistor")) return;
      const beforeDropper = dropperChains.has(chain) && firstCap > i;
      if (beforeDropper || feedsRectifier)
        for (const r of step.parts) blocks.push(makeBlock("surge-limiter", [r]));
    });
  }
  return blocks;
}
