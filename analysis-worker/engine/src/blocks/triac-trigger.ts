/**
 * Triac trigger: a divider or an RC network driving a triac's gate, usually the phase-shift RC
 * of a dimmer (see gate-network.ts). The block is the triac and the network's parts.
 */
import type { BlockContext } from "./block-context.js";
import { makeBlock, type Block } from "./block-types.js";
import { gateNetwork } from "./gate-network.js";

/** Find the triacs whose gate is driven by a divider or an RC network. */
export function findTriacTriggers(ctx: BlockContext): Block[] {
  const blocks: Block[] = [];
  for (const t of ctx.graph.parts) {
    if (t.kind !== "triac") continue;
    const network = gateNetwork(ctx, t);
    if (network !== null) blocks.push(makeBlock("triac-trigger", [t, ...network]));
  }
  return blocks;
}
