/**
 * Thyristor trigger: a divider or an RC network driving a thyristor's gate (see gate-network.ts
 * for what counts). The block is the thyristor and the network's parts.
 */
import type { BlockContext } from "./block-context.js";
import { makeBlock, type Block } from "./block-types.js";
import { gateNetwork } from "./gate-network.js";

/** Find the thyristors whose gate is driven by a divider or an RC network. */
export function findThyristorTriggers(ctx: BlockContext): Block[] {
  const blocks: Block[] = [];
  for (const q of ctx.graph.parts) {
    if (q.kind !== "thyristor") continue;
    const network = gateNetwork(ctx, q);
    if (network !== null) blocks.push(makeBlock("thyristor-trigger", [q, ...network]));
  }
  return blocks;
}
