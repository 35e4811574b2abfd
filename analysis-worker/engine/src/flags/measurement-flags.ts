/**
 * measurement-mismatch: a measurement outside its predicted band, with the hint of which traced
 * value would explain it (figures/measurement-hints.ts).
 */
import type { MeasurementKind, Part, TeardownRecord } from "../record/types.js";
import type { RiskVariants } from "../figures/risk-variants.js";
import { valueUnitOf } from "../figures/measurement-hints.js";
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

/** The unit of the value a hint varies ("" when the part is not in the record). */
function partUnit(p: Part | undefined): string {
  return p === undefined ? "" : valueUnitOf(p);
}

/** One warning per disagreeing measurement, with the hint solved for it before the checks. */
export function measurementFlags(rec: TeardownRecord, variants: RiskVariants): Flag[] {
  const flags: Flag[] = [];
  for (const [k, chk] of variants.checks.entries()) {
    const c = chk.comparison;
    const hint = variants.hints.get(k);
    if (c.verdict === "agrees" || hint === undefined) continue;
    const m = rec.measurements[c.measurement]!;
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
