/**
 * Pulse transformer: a transformer whose primary is not across the supply path (that would be
 * a mains transformer) and is either switched by a thyristor or triac (a main terminal on a
 * primary net) or fed by a capacitor discharge (a capacitor in series with the primary). The
 * block is the transformer, its series capacitors and the switching devices, including those
 * whose main terminal sits on a series capacitor's far end (the capacitor-discharge igniter).
 */
import { netOfPin, otherNet, partsOnNet, type PartNode } from "../graph/circuit-graph.js";
import type { BlockContext } from "./block-context.js";
import { makeBlock, type Block } from "./block-types.js";

const MAIN_TERMINALS: Record<string, readonly string[]> = {
  thyristor: ["anode", "cathode"],
  triac: ["mt1", "mt2"],
};

/** Find pulse transformers. */
export function findPulseTransformers(ctx: BlockContext): Block[] {
  const blocks: Block[] = [];
  for (const t of ctx.graph.parts) {
    if (t.kind !== "transformer") continue;
    const p1 = netOfPin(t, "p1");
    const p2 = netOfPin(t, "p2");
    if (p1 === null || p2 === null || p1 === p2) continue;
    if (ctx.pathNets.has(p1) && ctx.pathNets.has(p2)) continue;
    const primary = [p1, p2];
    const seriesCaps: PartNode[] = [];
    const farEnds: string[] = [];
    // a primary net that is also the supply carries every other branch's capacitors too
    for (const net of primary.filter((n) => !ctx.pathNets.has(n)))
      for (const c of partsOnNet(ctx.graph, net)) {
        const far = c.kind === "capacitor" ? otherNet(c, net) : null;
        if (far !== null && !primary.includes(far)) {
          seriesCaps.push(c);
          farEnds.push(far);
        }
      }
    // a switch on a primary net that is also the supply (a triac elsewhere on the neutral)
    // switches its own branch, not this transformer
    const switched = new Set([...primary.filter((n) => !ctx.pathNets.has(n)), ...farEnds]);
    const switches = ctx.graph.parts.filter((q) =>
      (MAIN_TERMINALS[q.kind] ?? []).some((role) => switched.has(netOfPin(q, role) ?? "")),
    );
    if (seriesCaps.length === 0 && switches.length === 0) continue;
    blocks.push(makeBlock("pulse-transformer", [t, ...seriesCaps, ...switches]));
  }
  return blocks;
}
