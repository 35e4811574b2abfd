/**
 * Functional blocks of a circuit, recognised by subgraph matching on the typed graph with pin
 * roles and the net roles the record declares (line, neutral), never by refs or net names.
 * The finders run in dependency order: rectifiers first (their rails feed the smoothing and
 * regulator finders), droppers before bleeders and surge limiters, and reverse-protection
 * diodes before half-wave rectifiers (such a diode is never one).
 */
import type { TeardownRecord } from "../record/types.js";
import { blockContext } from "./block-context.js";
import { findBleeders } from "./bleeder.js";
import { BLOCK_KINDS, uniqueBlocks, type Block, type RectifierRail } from "./block-types.js";
import { bridgeBlocks, findBridgeRectifiers } from "./bridge-rectifier.js";
import { findCapacitiveDroppers } from "./capacitive-dropper.js";
import { findFuses } from "./fuse.js";
import { findHalfWaveRectifiers } from "./half-wave-rectifier.js";
import { findPulseTransformers } from "./pulse-transformer.js";
import { findReverseProtection } from "./reverse-protection.js";
import { findSmoothingCapacitors } from "./smoothing-capacitor.js";
import { findSurgeLimiters } from "./surge-limiter.js";
import { findThyristorTriggers } from "./thyristor-trigger.js";
import { findTriacTriggers } from "./triac-trigger.js";
import { findVoltageDividers } from "./voltage-divider.js";
import { findZenerShuntRegulators } from "./zener-shunt-regulator.js";

export type { Block, BlockKind } from "./block-types.js";
export { BLOCK_KINDS } from "./block-types.js";

/** Recognise the functional blocks of a record, sorted by kind (BLOCK_KINDS order), then parts. */
export function findBlocks(record: TeardownRecord): Block[] {
  const ctx = blockContext(record);
  const bridges = findBridgeRectifiers(ctx);
  const reverse = findReverseProtection(ctx);
  // a bridge's diodes and an LED's reverse diode rectify nothing on their own
  const notHalfWave = new Set([
    ...bridges.flatMap((b) => b.block.parts),
    ...reverse.map((r) => r.diode.ref),
  ]);
  const halfWaves = findHalfWaveRectifiers(ctx, notHalfWave);
  const rails: RectifierRail[] = [
    ...bridges.map((b) => b.rail),
    ...halfWaves.flatMap((h) => h.rails),
  ];
  const railNets = new Set(rails.flatMap((r) => [r.output, r.ret]));
  const rectifierInputs = new Set(rails.flatMap((r) => r.inputs));
  const droppers = findCapacitiveDroppers(ctx);
  const blocks = [
    ...findFuses(ctx),
    ...findSurgeLimiters(ctx, droppers, rectifierInputs),
    ...droppers.map((d) => d.block),
    ...findBleeders(ctx, droppers),
    ...bridgeBlocks(bridges),
    ...halfWaves.map((h) => h.block),
    ...reverse.map((r) => r.block),
    ...findSmoothingCapacitors(ctx, rails),
    ...findZenerShuntRegulators(ctx, rails, droppers),
    ...findVoltageDividers(ctx, railNets).map((d) => d.block),
    ...findThyristorTriggers(ctx),
    ...findTriacTriggers(ctx),
    ...findPulseTransformers(ctx),
  ];
  return uniqueBlocks(blocks).sort(compareBlocks);
}

/** Order of blocks: kind in BLOCK_KINDS order, then the joined part refs. */
export function compareBlocks(a: Block, b: Block): number {
  const byKind = BLOCK_KINDS.indexOf(a.kind) - BLOCK_KINDS.indexOf(b.kind);
  if (byKind !== 0) return byKind;
  const x = a.parts.join(",");
  const y = b.parts.join(",");
  return x < y ? -1 : x > y ? 1 : 0;
}
