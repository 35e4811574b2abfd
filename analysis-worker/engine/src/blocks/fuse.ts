/**
 * Fuse: each fuse on the supply path, that is in a series step of a chain from the line or the
 * neutral, or with a pin on a supply net. A fuse on a transformer's secondary or on the DC side
 * protects that part of the circuit, not the supply, and is not reported here.
 */
import type { BlockContext } from "./block-context.js";
import { makeBlock, type Block } from "./block-types.js";

/** Find the fuses on the supply path (one block per fuse). */
export function findFuses(ctx: BlockContext): Block[] {
  const inChains = new Set(ctx.paths.chains.flatMap((c) => c.steps.flatMap((s) => s.parts)));
  const supply = new Set([...ctx.paths.lineNets, ...ctx.paths.neutralNets]);
  return ctx.graph.parts
    .filter((p) => p.kind === "fuse" && (inChains.has(p) || p.pins.some((e) => supply.has(e.net))))
    .map((p) => makeBlock("fuse", [p]));
}
