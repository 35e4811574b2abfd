/**
 * Voltage divider: two resistors in series whose midpoint feeds something that draws on it: a
 * thyristor or triac gate, a zener, an LED, a load, or a part of a kind the engine does not
 * know (a transistor's base, an IC pin). The midpoint holds exactly those two resistors, their
 * far ends are two different nets, and it is not a supply net or a rectifier output. Two
 * resistors in series with nothing at their midpoint are just a resistor chain, and a resistor
 * whose far end meets only capacitors is an RC leg (a snubber, a phase-shift network), which
 * carries no DC and divides nothing.
 */
import { otherNet, partsOnNet, type PartNode, type PinEdge } from "../graph/circuit-graph.js";
import type { BlockContext } from "./block-context.js";
import { twoPinPartsOn } from "./block-pattern.js";
import { makeBlock, type Block } from "./block-types.js";

/** Kinds whose every pin counts as drawing on a divider's midpoint. */
const FED_KINDS: ReadonlySet<string> = new Set(["zener", "led", "load"]);
/** Kinds whose gate pin counts. */
const GATED_KINDS: ReadonlySet<string> = new Set(["thyristor", "triac"]);

/** A divider and its midpoint net. */
export interface DividerFound {
  block: Block;
  midpoint: string;
  resistors: [PartNode, PartNode];
}

/** Find voltage dividers; `railNets` are rectifier outputs and returns, never a midpoint. */
export function findVoltageDividers(
  ctx: BlockContext,
  railNets: ReadonlySet<string>,
): DividerFound[] {
  const found: DividerFound[] = [];
  for (const net of ctx.graph.nets) {
    const m = net.name;
    if (ctx.pathNets.has(m) || railNets.has(m)) continue;
    const resistors = twoPinPartsOn(ctx.graph, m, ["resistor"]).filter((r) => !rcLeg(ctx, r, m));
    if (resistors.length !== 2) continue;
    const [r1, r2] = resistors as [PartNode, PartNode];
    if (otherNet(r1, m) === otherNet(r2, m)) continue; // in parallel, not in series
    const fed = net.pins.some((e) => drawsOn(ctx, e));
    if (fed)
      found.push({
        block: makeBlock("voltage-divider", [r1, r2]),
        midpoint: m,
        resistors: [r1, r2],
      });
  }
  return found;
}

/** True when a pin on a midpoint draws on it (see FED_KINDS and GATED_KINDS). */
function drawsOn(ctx: BlockContext, edge: PinEdge): boolean {
  const part = ctx.graph.partByRef.get(edge.part);
  if (part === undefined) return false;
  if (!part.known) return true;
  if (FED_KINDS.has(part.kind)) return true;
  return GATED_KINDS.has(part.kind) && edge.role === "gate";
}

/** True when the resistor's far end from `m` holds nothing but it and capacitors. */
function rcLeg(ctx: BlockContext, r: PartNode, m: string): boolean {
  const far = otherNet(r, m);
  if (far === null) return false;
  const others = partsOnNet(ctx.graph, far).filter((p) => p !== r && p.simulated);
  return others.length > 0 && others.every((p) => p.kind === "capacitor");
}
