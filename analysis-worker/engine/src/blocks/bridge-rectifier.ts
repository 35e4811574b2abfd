/**
 * Bridge rectifier: four diodes on four distinct nets. Each of the two AC nets has one anode and
 * one cathode, the positive output joins two cathodes and the negative output two anodes. Two
 * diodes in series, or a bridge with one diode turned round, do not fit the pattern.
 */
import { makeBlock, uniqueBlocks, type Block, type RectifierRail } from "./block-types.js";
import type { BlockContext } from "./block-context.js";
import { matchPattern, patternGraph } from "./block-pattern.js";

const BRIDGE_PATTERN = patternGraph([
  { name: "up1", kind: "diode", pins: { anode: "ac1", cathode: "pos" } },
  { name: "up2", kind: "diode", pins: { anode: "ac2", cathode: "pos" } },
  { name: "down1", kind: "diode", pins: { anode: "neg", cathode: "ac1" } },
  { name: "down2", kind: "diode", pins: { anode: "neg", cathode: "ac2" } },
]);

/** A bridge found in the circuit, with its DC rail. */
export interface BridgeFound {
  block: Block;
  rail: RectifierRail;
}

/** Find every bridge rectifier (each set of four diodes once, whatever its symmetries). */
export function findBridgeRectifiers(ctx: BlockContext): BridgeFound[] {
  const found: BridgeFound[] = [];
  const seen = new Set<string>();
  for (const m of matchPattern(BRIDGE_PATTERN, ctx.graph)) {
    const parts = ["up1", "up2", "down1", "down2"].map((n) =>
      ctx.graph.partByRef.get(m.parts[n]!)!,
    );
    const block = makeBlock("bridge-rectifier", parts);
    const key = block.parts.join(",");
    if (seen.has(key)) continue;
    seen.add(key);
    const inputs = [m.nets["ac1"]!, m.nets["ac2"]!].sort();
    found.push({ block, rail: { output: m.nets["pos"]!, ret: m.nets["neg"]!, inputs } });
  }
  return found;
}

/** The blocks of a list of bridges. */
export function bridgeBlocks(bridges: readonly BridgeFound[]): Block[] {
  return uniqueBlocks(bridges.map((b) => b.block));
}
