/**
 * Which nets are drawn as rails: the neutral and every rectifier's return along the bottom,
 * every rectifier's DC output along the top. The rectifiers are the engine's own block
 * finders' (bridge and half-wave), found by wiring and declared net roles, never by names.
 */
import { blockContext } from "../blocks/block-context.js";
import { findBridgeRectifiers } from "../blocks/bridge-rectifier.js";
import { findHalfWaveRectifiers } from "../blocks/half-wave-rectifier.js";
import { findReverseProtection } from "../blocks/reverse-protection.js";
import type { RectifierRail } from "../blocks/block-types.js";
import type { TeardownRecord } from "../record/types.js";

/** Rail nets, each list in a stable order (neutral first, then by name). */
export interface RailNets {
  bottom: string[];
  top: string[];
}

const byName = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/** The record's rail nets. */
export function railNets(record: TeardownRecord): RailNets {
  const role = (net: string): string | null => record.nets[net]?.role ?? null;
  const neutral = Object.keys(record.nets)
    .filter((n) => role(n) === "neutral")
    .sort(byName);
  const ctx = blockContext(record);
  const bridges = findBridgeRectifiers(ctx);
  // As block recognition does: a bridge's diodes and an LED's reverse diode are no half-wave.
  const notHalfWave = new Set([
    ...bridges.flatMap((b) => b.block.parts),
    ...findReverseProtection(ctx).map((r) => r.diode.ref),
  ]);
  const rails: RectifierRail[] = [
    ...bridges.map((b) => b.rail),
    ...findHalfWaveRectifiers(ctx, notHalfWave).flatMap((h) => h.rails),
  ];
  const mains = (n: string): boolean => role(n) === "line" || role(n) === "neutral";
  const returns = [...new Set(rails.map((r) => r.ret))].filter((n) => !mains(n)).sort(byName);
  const bottom = [...neutral, ...returns];
  const top = [...new Set(rails.map((r) => r.output))]
    .filter((n) => !mains(n) && !bottom.includes(n))
    .sort(byName);
  return { bottom, top };
}
