/**
 * Bleeder: a resistor directly across a capacitor that the plug pins see after unplugging, so
 * that it discharges: a dropper capacitor, or a capacitor across the supply (an X capacitor).
 * A resistor across the supply with no capacitor beside it is just a load. A resistor across a
 * smoothing capacitor behind the rectifier is not counted: it discharges the DC side, which the
 * plug pins do not see, and it is usually the load or a divider (our choice; see the report).
 */
import { netsOfPart } from "../graph/circuit-graph.js";
import type { BlockContext } from "./block-context.js";
import { partsAcross } from "./block-pattern.js";
import { makeBlock, type Block, type DropperFound } from "./block-types.js";

/** Find bleeder resistors; each block is the resistor with the capacitors it discharges. */
export function findBleeders(ctx: BlockContext, droppers: readonly DropperFound[]): Block[] {
  const dropperCaps = new Set(droppers.flatMap((d) => d.capacitors));
  const { mainsLine, mainsNeutral } = ctx.paths;
  const acrossSupply = (a: string, b: string): boolean =>
    (mainsLine.has(a) && mainsNeutral.has(b)) || (mainsLine.has(b) && mainsNeutral.has(a));
  const blocks: Block[] = [];
  for (const r of ctx.graph.parts) {
    if (r.kind !== "resistor" || !r.simulated) continue;
    const nets = netsOfPart(r);
    if (nets.length !== 2) continue;
    const [a, b] = nets as [string, string];
    const caps = partsAcross(ctx.graph, a, b, ["capacitor"]).filter(
      (c) => dropperCaps.has(c) || acrossSupply(a, b),
    );
    if (caps.length > 0) blocks.push(makeBlock("bleeder", [r, ...caps]));
  }
  return blocks;
}
