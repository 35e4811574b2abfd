/**
 * spacing-short: each measured board spacing against IEC 60664-1 (spacing-tables.ts).
 * - Working voltage: the RMS of V(a) − V(b) over the solved steady cycle, rounded up to the
 *   next row of Table F.4 (no interpolation, so the check never depends on the interpolation rule).
 * - Creepage: printed-wiring columns for board spacings where the table has them (pollution
 *   degree 1, or 2 with material group I-IIIa), the general columns otherwise; material group
 *   IIIa and pollution degree 2 unless the record says otherwise.
 * - Clearance: Table F.2 at the rated impulse of overvoltage category II for the rated supply
 *   (Table F.1), applied when either net conducts to the mains; if the recurring peak between the
 *   nets is higher than that impulse, the peak's row is used instead (a simplification).
 * - Reinforced (2× creepage, clearance one impulse step up) when one side conducts to the mains
 *   and the other is touchable (declared accessible or conducting to an accessible net).
 * - A routed slot: the creepage across a slot ≥ 1 mm wide is its air gap (60664-1 treats such a
 *   slot as air, MEMORY), so the effective creepage is taken as at least the clearance.
 */
import type { Spacing } from "../record/types.js";
import type { Flag } from "./flag-types.js";
import { MAINS_CAUTION, ev, evYes } from "./flag-types.js";
import type { RiskContext } from "./risk-context.js";
import type { Evidence } from "../record/gaps-and-assumptions.js";
import { cite } from "./citations.js";
import { sig3, voltageBetween } from "./risk-context.js";
import {
  clearanceRequired,
  creepageRequired,
  nextImpulseStep,
  ratedImpulseOvcII,
} from "./spacing-tables.js";

/** Factor on basic creepage for reinforced insulation (from memory for 60664-1; FOUND as a general rule). */
export const REINFORCED_CREEPAGE_FACTOR = 2;

/** The required distances for one spacing, with the numbers behind them. */
export interface SpacingRequirement {
  working_vrms_v: number;
  working_peak_v: number;
  insulation: "reinforced" | "basic" | "functional";
  creepage_effective_mm: number | null;
  creepage_required_mm: number;
  creepage_row_vrms_v: number;
  creepage_column: string;
  creepage_beyond_table: boolean;
  clearance_required_mm: number | null;
  impulse_v: number | null;
  clearance_row_impulse_v: number | null;
}

/** The required distances for one spacing, or null when a net is not in the solved circuit. */
export function spacingRequirement(ctx: RiskContext, s: Spacing): SpacingRequirement | null {
  const [a, b] = s.between;
  const v = voltageBetween(ctx, a, b);
  if (v === null) return null;
  const mc = ctx.mainsConnected;
  const tc = ctx.touchable;
  const reinforced =
    (mc.has(a) && tc.has(b) && !mc.has(b)) || (mc.has(b) && tc.has(a) && !mc.has(a));
  const creep = creepageRequired(v.rms_v, s.material_group, s.pollution_degree);
  const creepMm = creep.mm * (reinforced ? REINFORCED_CREEPAGE_FACTOR : 1);
  const mains = mc.has(a) || mc.has(b);
  let impulse: number | null = null;
  let clearMm: number | null = null;
  let clearRow: number | null = null;
  if (mains) {
    const base = Math.max(ratedImpulseOvcII(ctx.record.device.rated_supply.vrms), v.peak_v);
    impulse = reinforced ? nextImpulseStep(base) : base;
    const c = clearanceRequired(impulse, s.pollution_degree);
    clearMm = c.mm;
    clearRow = c.row_impulse_v;
  }
  const effectiveCreep =
    s.creepage_mm === null
      ? null
      : s.slot && s.clearance_mm !== null
        ? Math.max(s.creepage_mm, s.clearance_mm)
        : s.creepage_mm;
  return {
    working_vrms_v: v.rms_v,
    working_peak_v: v.peak_v,
    insulation: reinforced ? "reinforced" : mains ? "basic" : "functional",
    creepage_effective_mm: effectiveCreep,
    creepage_required_mm: creepMm,
    creepage_row_vrms_v: creep.row_vrms,
    creepage_column: creep.column,
    creepage_beyond_table: creep.beyond_table,
    clearance_required_mm: clearMm,
    impulse_v: impulse,
    clearance_row_impulse_v: clearRow,
  };
}

function spacingEvidence(s: Spacing, r: SpacingRequirement): Evidence[] {
  return [
    ev("working voltage (RMS)", r.working_vrms_v, "V"),
    ev("recurring peak voltage", r.working_peak_v, "V"),
    ev("insulation", r.insulation, ""),
    ev("material group", s.material_group, ""),
    ev("pollution degree", s.pollution_degree, ""),
    ev("creepage measured", s.creepage_mm, "mm"),
    ...(s.slot ? [ev("creepage counted across the slot", r.creepage_effective_mm, "mm")] : []),
    ev("creepage required", r.creepage_required_mm, "mm"),
    ev("creepage table row (RMS)", r.creepage_row_vrms_v, "V"),
    ev("creepage table column", r.creepage_column, ""),
    evYes("working voltage beyond the creepage table", r.creepage_beyond_table),
    ev("clearance measured", s.clearance_mm, "mm"),
    ev("clearance required", r.clearance_required_mm, "mm"),
    ev("rated impulse voltage", r.impulse_v, "V"),
    ev("clearance table row (impulse)", r.clearance_row_impulse_v, "V"),
  ];
}

/** One flag per spacing shorter than required. */
export function spacingFlags(ctx: RiskContext): Flag[] {
  const flags: Flag[] = [];
  for (const s of ctx.record.board.spacings) {
    const req = spacingRequirement(ctx, s);
    if (req === null) {
      ctx.notes.push(
        `spacing ${s.between.join("-")}: a net is not in the solved circuit, so the spacing was not checked`,
      );
      continue;
    }
    const creep = req.creepage_effective_mm;
    const creepReq = req.creepage_required_mm;
    const clear = s.clearance_mm;
    const clearReq = req.clearance_required_mm;
    const shortCreep = creep !== null && creep < creepReq;
    const shortClear = clear !== null && clearReq !== null && clear < clearReq;
    if (!shortCreep && !shortClear) continue;
    const what = [
      shortCreep ? `creepage ${sig3(creep!)} mm < ${sig3(creepReq)} mm` : null,
      shortClear ? `clearance ${sig3(clear!)} mm < ${sig3(clearReq!)} mm` : null,
    ].filter((x) => x !== null);
    const slotNote = s.slot
      ? " A routed slot is counted as air: the creepage across it is taken as at least the clearance."
      : "";
    flags.push({
      code: "spacing-short",
      severity: req.insulation === "reinforced" ? "danger" : "warning",
      parts: [],
      nets: [...s.between],
      message: `${s.between.join(" to ")} (${req.insulation} insulation, ${sig3(req.working_vrms_v)} V RMS working): ${what.join("; ")}.${slotNote}`,
      evidence: spacingEvidence(s, req),
      ...cite("iec-60664-1-spacing"),
      caution: MAINS_CAUTION,
    });
  }
  return flags;
}
