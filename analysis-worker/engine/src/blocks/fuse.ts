/**
 * Fuse: each fuse on the supply path, that is in a series step of a run from the line or the
 * neutral, between two mains nets of one side, or with a pin on a supply net. A fuse on a transformer's secondary or on the DC side
 * protects that part of the circuit, not the supply, and is not reported here.
 */
import type { PartNode } from "../graph/circuit-graph.js";
import type { BlockContext } from "./block-context.js";
import { makeBlock, type Block } from "./block-types.js";

/** Find the fuses on the supply path (one block per fuse). */
export function findFuses(ctx: BlockContext): Block[] {
  const runs = [...ctx.paths.chains, ...ctx.paths.branches];
  const inChains = new Set(runs.flatMap((c) => c.steps.flatMap((s) => s.parts)));
  const supply = new Set([...ctx.paths.lineNets, ...ctx.paths.neutralNets]);
  const { mainsLine, mainsNeutral } = ctx.paths;
  const onMains = (p: PartNode): boolean =>
    p.pins.every((e) => mainsLine.has(e.net)) || p.pins.every((e) => mainsNeutral.has(e.net));
  return ctx.graph.parts
    .filter(
      (p) =>
        p.kind === "fuse" &&
        (inChains.has(p) || onMains(p) || p.pins.some((e) => supply.has(e.net))),
    )
    .map((p) => makeBlock("fuse", [p]));
}
