/**
 * Smoothing capacitor: a capacitor directly across a rectifier's DC output (a bridge's positive
 * and negative nets, or a half-wave rectifier's output and the net its current returns to).
 */
import type { BlockContext } from "./block-context.js";
import { partsAcross } from "./block-pattern.js";
import { makeBlock, uniqueBlocks, type Block, type RectifierRail } from "./block-types.js";

/** Find smoothing capacitors across the given rectifier rails (one block per capacitor). */
export function findSmoothingCapacitors(
  ctx: BlockContext,
  rails: readonly RectifierRail[],
): Block[] {
  const blocks = rails.flatMap((rail) =>
    partsAcross(ctx.graph, rail.output, rail.ret, ["capacitor"]).map((c) =>
      makeBlock("smoothing-capacitor", [c]),
    ),
  );
  return uniqueBlocks(blocks);
}
