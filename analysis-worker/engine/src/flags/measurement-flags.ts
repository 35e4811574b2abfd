/**
 * measurement-mismatch: a measurement outside its predicted band, with the hint of which traced
 * value would explain it (figures/measurement-hints.ts).
 */
import type { MeasurementKind, Part, TeardownRecord } from "../record/types.js";
import { kindInfo } from "../graph/kinds.js";
import { partValueOf } from "../solver/variants/part-value.js";
import type { Budget } from "../solver/transient.js";
import type { MeasurementCheck } from "../figures/measurement-comparisons.js";
import { mismatchHint } from "../figures/measurement-hints.js";
import type { Flag } from "./flag-types.js";
import { sig3 } from "./risk-context.js";
import { cite } from "./citations.js";
import { ev } from "./flag-types.js";

/** Parts listed in a hint's ranking at most. */
const MAX_RANKED_PARTS = 5;

/** The unit a measurement kind is read in. */
function measurementUnit(what: MeasurementKind): string {
  if (what === "input.current_rms" || what === "part.current_rms") return "A";
  if (what === "input.power" || what === "part.power") return "W";
  if (what === "input.apparent_power") return "VA";
  if (what === "input.power_factor") return "";
  return "V";
}

/** The unit of the value a hint varies: a load's resistance or capacitance, else the kind's unit. */
function partUnit(p: Part | undefined): string {
  if (p === undefined) return "";
  const slot = partValueOf(p)?.slot;
  if (slot === "model.r") return "Ω";
  if (slot === "model.c") return "F";
  return kindInfo(p.kind)?.unit ?? "";
}

/** One warning per disagreeing measurement. */
export function measurementFlags(
  rec: TeardownRecord,
  checks: readonly MeasurementCheck[],
  budget: Budget,
): Flag[] {
  const flags: Flag[] = [];
  for (const chk of checks) {
    const c = chk.comparison;
    if (c.verdict === "agrees") continue;
    const m = rec.measurements[c.measurement]!;
    const hint = mismatchHint(rec, chk.supply, chk.nominal, chk.figure, c.measured, budget);
    const ex = hint.explaining;
    const part = ex ? rec.parts.find((p) => p.ref === ex.part) : undefined;
    const near = ex
      ? Object.entries(ex.nearest)
          .filter(([, v]) => v !== null)
          .map(([s, v]) => `${s} ${sig3(v!)}`)
      : [];
    const misread =
      ex && part
        ? ` ${ex.part} at ${sig3(ex.explaining_value)} (×${sig3(ex.factor)} its traced ${sig3(ex.nominal_value)}) would explain it${near.length ? `; nearest ${near.join(", ")}: misread?` : "."}`
        : "";
    const unit = measurementUnit(c.what);
    const where = m.between ? ` between ${m.between.join(" and ")}` : m.part ? ` of ${m.part}` : "";
    flags.push({
      code: "measurement-mismatch",
      severity: "warning",
      parts: hint.ranking.slice(0, MAX_RANKED_PARTS).map((r) => r.part),
      nets: m.between ? [...m.between] : [],
      message: `Measured ${c.what}${where} ${sig3(c.measured)} lies outside the predicted ${sig3(c.low)}..${sig3(c.high)} (nominal ${sig3(c.predicted)}).${misread}`,
      evidence: [
        ev("measurement number", c.measurement + 1, ""),
        ev("measured", c.measured, unit),
        ev("predicted (nominal values)", c.predicted, unit),
        ev("low end of the tolerance band", chk.band.low, unit),
        ev("high end of the tolerance band", chk.band.high, unit),
        ev("measurement uncertainty", chk.band.uncertainty, unit),
        ev("low end with the meter uncertainty", c.low, unit),
        ev("high end with the meter uncertainty", c.high, unit),
        ev("tolerance samples solved", chk.band.samples, ""),
        ev("supply voltage (RMS)", chk.supply.vrms, "V"),
        ev("supply frequency", chk.supply.hz, "Hz"),
        ...hint.ranking
          .slice(0, MAX_RANKED_PARTS)
          .map((r) => ev(`relative sensitivity to ${r.part}`, r.sensitivity, "")),
        ...(ex
          ? [
              ev(`value of ${ex.part} that would explain it`, ex.explaining_value, partUnit(part)),
              ev(`that value against the traced ${ex.part}`, ex.factor, "×"),
              ...Object.entries(ex.nearest).map(([series, value]) =>
                ev(`nearest ${series} value`, value, partUnit(part)),
              ),
            ]
          : []),
      ],
      ...cite("tolerance-analysis"),
      caution:
        "A disagreement says the traced netlist or a value may be wrong, or the meter; recheck the trace before trusting any figure of this record.",
    });
  }
  return flags;
}
