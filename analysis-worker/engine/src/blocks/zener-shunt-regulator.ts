/**
 * Zener shunt regulator: a zener across a rail that is fed through a series impedance, so the
 * zener can take the surplus current. Two shapes:
 * - the zener straight across a rail that already has its series impedance: a dropper's output
 *   (the dropper's far end and the other side of the supply), or the DC output of a rectifier
 *   whose input comes through a dropper or a series resistor; the block is the zener;
 * - the zener fed from any rail (the supply, a rectifier output, a dropper output) through its
 *   own series resistor, across to the rail's return; the block is the zener and the resistor.
 * A zener in series with a gate, or straight across the mains, is not a shunt regulator.
 */
import { netsOfPart } from "../graph/circuit-graph.js";
import type { BlockContext } from "./block-context.js";
import { twoPinPartsOn } from "./block-pattern.js";
import {
  makeBlock,
  pairKey,
  type Block,
  type DropperFound,
  type RectifierRail,
} from "./block-types.js";

/** Find zener shunt regulators given the rectifier rails and droppers already found. */
export function findZenerShuntRegulators(
  ctx: BlockContext,
  rails: readonly RectifierRail[],
  droppers: readonly DropperFound[],
): Block[] {
  const fed = railPairs(ctx, rails, droppers);
  const blocks: Block[] = [];
  for (const z of ctx.graph.parts) {
    if (z.kind !== "zener" || !z.simulated) continue;
    const nets = netsOfPart(z);
    if (nets.length !== 2) continue;
    const [x, y] = nets as [string, string];
    if (fed.get(pairKey(x, y)) === true) {
      blocks.push(makeBlock("zener-shunt-regulator", [z]));
      continue;
    }
    for (const [f, r] of [
      [x, y],
      [y, x],
    ] as const) {
      const feeders = twoPinPartsOn(ctx.graph, f, ["resistor"]).filter((res) => {
        const w = res.pins.find((e) => e.net !== f)!.net;
        return w !== r && fed.has(pairKey(w, r));
      });
      if (feeders.length > 0) {
        blocks.push(makeBlock("zener-shunt-regulator", [z, ...feeders]));
        break;
      }
    }
  }
  return blocks;
}

/**
 * Net pairs a zener might regulate, each marked true when the pair already has a series
 * impedance in front of it (a dropper, or a resistor before the rectifier).
 */
function railPairs(
  ctx: BlockContext,
  rails: readonly RectifierRail[],
  droppers: readonly DropperFound[],
): Map<string, boolean> {
  const pairs = new Map<string, boolean>();
  const mark = (a: string, b: string, fed: boolean): void => {
    if (a !== b) pairs.set(pairKey(a, b), (pairs.get(pairKey(a, b)) ?? false) || fed);
  };
  const { mainsLine, mainsNeutral } = ctx.paths;
  for (const l of mainsLine) for (const n of mainsNeutral) mark(l, n, false);
  const impededEnds = new Set(
    [...ctx.paths.chains, ...ctx.paths.branches]
      .filter((c) =>
        c.steps.some((s) => s.parts.some((p) => p.kind === "capacitor" || p.kind === "resistor")),
      )
      .map((c) => c.end),
  );
  for (const d of droppers) {
    const otherSide = d.chain.side === "line" ? mainsNeutral : mainsLine;
    for (const n of otherSide) mark(d.chain.end, n, true);
  }
  for (const rail of rails)
    mark(
      rail.output,
      rail.ret,
      rail.inputs.some((i) => impededEnds.has(i)),
    );
  return pairs;
}
