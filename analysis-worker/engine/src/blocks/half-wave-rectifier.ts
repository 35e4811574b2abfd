/**
 * Half-wave rectifier: a diode (or a string of diodes in series, all the same way round) that
 * takes its input from the supply path or a mains transformer's secondary and feeds a net off
 * the supply path that carries something besides diodes (a capacitor, a load, a resistor). A
 * diode of a bridge is not one, nor is a diode with both ends on the supply path (a clamp).
 */
import { netOfPin, partsOnNet, type PartNode } from "../graph/circuit-graph.js";
import { isSourceNet, type BlockContext } from "./block-context.js";
import { makeBlock, type Block, type RectifierRail } from "./block-types.js";

/** A half-wave rectifier found in the circuit, with its DC rails (one per return net). */
export interface HalfWaveFound {
  block: Block;
  rails: RectifierRail[];
}

const ORIENTATIONS = [
  ["anode", "cathode"],
  ["cathode", "anode"],
] as const;

/** Find half-wave rectifiers among the diodes that are not in a bridge. */
export function findHalfWaveRectifiers(
  ctx: BlockContext,
  bridgeDiodes: ReadonlySet<string>,
): HalfWaveFound[] {
  const found: HalfWaveFound[] = [];
  const free = ctx.graph.parts.filter((p) => p.kind === "diode" && !bridgeDiodes.has(p.ref));
  for (const diode of free) {
    for (const [inRole, outRole] of ORIENTATIONS) {
      const input = netOfPin(diode, inRole);
      const first = netOfPin(diode, outRole);
      if (input === null || first === null || input === first || !isSourceNet(ctx, input)) continue;
      const string = [diode];
      let output = first;
      // Follow a series string: the output net holds only this diode and the next one, which
      // points the same way.
      for (;;) {
        const onNet = partsOnNet(ctx.graph, output).filter((p) => p.simulated);
        const next = onNet.find(
          (p) =>
            !string.includes(p) &&
            p.kind === "diode" &&
            !bridgeDiodes.has(p.ref) &&
            netOfPin(p, inRole) === output,
        );
        if (onNet.length !== 2 || next === undefined) break;
        const after = netOfPin(next, outRole);
        if (after === null || after === output) break;
        string.push(next);
        output = after;
      }
      if (ctx.pathNets.has(output) || isSourceNet(ctx, output)) continue;
      if (!feedsSomething(ctx, output, string)) continue;
      const returns = ctx.sources.filter((s) => s.nets.has(input)).flatMap((s) => [...s.returns]);
      const rails = [...new Set(returns)].sort().map((ret) => ({ output, ret, inputs: [input] }));
      found.push({ block: makeBlock("half-wave-rectifier", string), rails });
    }
  }
  return found;
}

/** The output net carries a simulated part other than the diode string and other diodes. */
function feedsSomething(ctx: BlockContext, net: string, string: readonly PartNode[]): boolean {
  return partsOnNet(ctx.graph, net).some(
    (p) => p.simulated && !string.includes(p) && p.kind !== "diode",
  );
}
