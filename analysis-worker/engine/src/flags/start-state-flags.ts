/**
 * start-dependent-state: the circuit's steady state depends on where it started. Two findings
 * share the code (common practice: a trigger stage with memory, a capacitor a firing leaves
 * charged or discharged, is judged both from a cold start and while running):
 * - at the analysed supply the cold start and the state kept while running differ (another
 *   firing pattern, another input power), so the figures shown hold for the cold start only;
 * - a trigger keeps firing as the supply sags well below the lowest supply it starts from cold
 *   at, or the other way round (hysteresis): after a dip it may not restart, or a board that
 *   works on the bench may not start on a low mains.
 */
import type { Flag } from "./flag-types.js";
import { ev } from "./flag-types.js";
import { cite } from "./citations.js";
import type { RiskContext } from "./risk-context.js";
import { sig3 } from "./risk-context.js";

/** Lowest supplies (cold, running) further apart than this fraction of the analysed supply are reported. */
export const START_SUPPLY_DIFFERENCE_FRACTION = 0.05;

const CAUTION =
  "Both states are estimates from a traced netlist: which one a real board settles in also depends on its parts' spread and on how the mains is switched on. Mains and the high voltages of such stages can kill; local codes and licensed practice decide.";

/** The start-dependent-state flags of an analysis. */
export function startStateFlags(ctx: RiskContext): Flag[] {
  const flags: Flag[] = [];
  const a = ctx.analysis;
  const supply = a.supply.vrms;
  const cold = a.steady_states?.find((s) => s.start === "cold");
  const running = a.steady_states?.find((s) => s.start === "running");
  if (cold && running) {
    const parts = running.triggers.map((t) => t.part);
    const rates = running.triggers
      .map((t) => {
        const c = cold.triggers.find((q) => q.part === t.part);
        return `${t.part} fires ${sig3(c?.firings_per_cycle ?? 0)} times per cycle from cold, ${sig3(t.firings_per_cycle)} while running`;
      })
      .join("; ");
    flags.push({
      code: "start-dependent-state",
      severity: "warning",
      parts,
      nets: [],
      message: `At ${sig3(supply)} V the circuit settles into another state when it has been running (come down from ${sig3(running.from_vrms ?? supply)} V) than from a cold start: ${rates}; input power ${sig3(cold.input.power)} W from cold, ${sig3(running.input.power)} W while running. The figures shown are the cold start's.`,
      evidence: [
        ev("supply voltage (RMS)", supply, "V"),
        ev("input power, cold start", cold.input.power, "W"),
        ev("input power, while running", running.input.power, "W"),
        ev("repeat, cold start (mains cycles)", cold.period_cycles, ""),
        ev("repeat, while running (mains cycles)", running.period_cycles, ""),
      ],
      ...cite("common-practice"),
      caution: CAUTION,
    });
  }
  for (const t of a.triggers) {
    const c = t.min_supply_cold_vrms ?? null;
    const r = t.min_supply_vrms;
    if (c === null || r === null) continue;
    if (Math.abs(c - r) <= START_SUPPLY_DIFFERENCE_FRACTION * supply) continue;
    const part = ctx.record.parts.find((p) => p.ref === t.part);
    flags.push({
      code: "start-dependent-state",
      severity: "info",
      parts: [t.part],
      nets: part ? Object.values(part.pins) : [],
      message:
        c > r
          ? `${t.part} keeps firing down to ${sig3(r)} V once running but starts from cold only from ${sig3(c)} V: after a dip below ${sig3(c)} V it may not restart.`
          : `${t.part} starts from cold from ${sig3(c)} V but stops firing below ${sig3(r)} V as the supply sags while running.`,
      evidence: [
        ev("supply voltage (RMS)", supply, "V"),
        ev("lowest supply, from cold (RMS)", c, "V"),
        ev("lowest supply, while running (RMS)", r, "V"),
      ],
      ...cite("common-practice"),
      caution: CAUTION,
    });
  }
  return flags;
}
