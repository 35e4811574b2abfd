/**
 * measurement-mismatch: a measurement outside its predicted band, with the hint of which traced
 * value would explain it (figures/measurement-hints.ts).
 */
import type { TeardownRecord } from "../record/types.js";
import type { Budget } from "../solver/transient.js";
import type { MeasurementCheck } from "../figures/measurement-comparisons.js";
import { mismatchHint } from "../figures/measurement-hints.js";
import type { Flag } from "./flag-types.js";
import { sig3 } from "./risk-context.js";

/** Parts listed in a hint's ranking at most. */
const MAX_RANKED_PARTS = 5;

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
    const where = m.between ? ` between ${m.between.join(" and ")}` : m.part ? ` of ${m.part}` : "";
    flags.push({
      code: "measurement-mismatch",
      severity: "warning",
      parts: hint.ranking.slice(0, MAX_RANKED_PARTS).map((r) => r.part),
      nets: m.between ? [...m.between] : [],
      message: `Measured ${c.what}${where} ${sig3(c.measured)} lies outside the predicted ${sig3(c.low)}..${sig3(c.high)} (nominal ${sig3(c.predicted)}).${misread}`,
      evidence: {
        measurement: c.measurement,
        measured: c.measured,
        predicted: c.predicted,
        band_low: chk.band.low,
        band_high: chk.band.high,
        uncertainty: chk.band.uncertainty,
        low: c.low,
        high: c.high,
        samples: chk.band.samples,
        supply_vrms_v: chk.supply.vrms,
        supply_hz: chk.supply.hz,
        ranking: hint.ranking
          .slice(0, MAX_RANKED_PARTS)
          .map((r) => ({ part: r.part, sensitivity: r.sensitivity })),
        explaining_part: ex?.part ?? null,
        explaining_value: ex?.explaining_value ?? null,
        explaining_factor: ex?.factor ?? null,
        explaining_nearest: ex
          ? Object.entries(ex.nearest).map(([series, value]) => ({ series, value }))
          : [],
      },
      source:
        "tolerance band by seeded Monte Carlo over the parts' tolerances; sensitivity by finite differences: engine method",
      caution:
        "A disagreement says the traced netlist or a value may be wrong, or the meter; recheck the trace before trusting any figure of this record.",
    });
  }
  return flags;
}
