/**
 * Tolerance bands and measured-versus-predicted: a linear RC band against the closed-form series
 * RC current at its tolerance corners; bands repeat exactly and widen with the tolerances; a
 * measurement twice the prediction is flagged with the dropper first.
 */
import { describe, expect, it } from "vitest";
import type { Measurement, SolvedCircuit, TeardownRecord } from "@teardown/engine";
import {
  analyzeCircuit,
  assessRisks,
  mulberry32,
  riskBudget,
  toleranceBands,
} from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { dropperHeater, evNum } from "../flags/flag-circuits.js";

const SUPPLY = { vrms: 230, hz: 50 };
const current = (s: SolvedCircuit) => s.figures.input.current_rms;

function measured(value: number, uncertainty = 0.05): Measurement {
  return {
    what: "input.current_rms",
    value,
    between: null,
    part: null,
    supply: SUPPLY,
    instrument: null,
    uncertainty: { relative: uncertainty },
  };
}

function withTolerance(rec: TeardownRecord, t: number): TeardownRecord {
  return { ...rec, parts: rec.parts.map((p) => ({ ...p, tolerance: t })) };
}

function band(rec: TeardownRecord, seed = 3) {
  return toleranceBands(rec, SUPPLY, [current], {
    seed,
    samples: 12,
    budget: riskBudget(undefined, undefined),
  }).figures[0]!;
}

describe("the seeded generator", () => {
  it("repeats its sequence for a seed and stays in [0, 1)", () => {
    const a = mulberry32(42);
    const b = mulberry32(42);
    const xs = Array.from({ length: 100 }, () => a());
    expect(Array.from({ length: 100 }, () => b())).toEqual(xs);
    expect(xs.every((x) => x >= 0 && x < 1)).toBe(true);
    expect(new Set(xs).size).toBe(100);
  });
});

describe("tolerance bands", () => {
  const rec = dropperHeater({ fuse: true, cls: "X2", bleeder: 470e3 });

  it("hold the closed-form current of a linear RC dropper and stay inside its tolerance corners", () => {
    // 1 µF ±10 % in series with 1 kΩ ±5 % on 230 V / 50 Hz: I = V / √(R² + (1/ωC)²), the
    // textbook series-RC magnitude. It falls as R rises and as C falls, so the band's bounds are
    // reached at the corners (R high, C low) and (R low, C high): a brute-force-free oracle.
    const w = 2 * Math.PI * 50;
    const amps = (r: number, c: number) => 230 / Math.hypot(r, 1 / (w * c));
    const rc = record([
      part("C1", "capacitor", ["L", "A"], 1e-6, { tolerance: 0.1, rating: { class: "X2" } }),
      part("R1", "resistor", ["A", "N"], 1e3, { tolerance: 0.05 }),
    ]);
    const b = band(rc);
    expect(b.nominal / amps(1e3, 1e-6)).toBeCloseTo(1, 3);
    const lowest = amps(1.05e3, 0.9e-6);
    const highest = amps(0.95e3, 1.1e-6);
    expect(b.low).toBeGreaterThanOrEqual(lowest * (1 - 1e-3));
    expect(b.high).toBeLessThanOrEqual(highest * (1 + 1e-3));
    // Twelve uniform draws of C within ±10 % spread the band well past ±2 %.
    expect(b.low).toBeLessThan(0.98 * b.nominal);
    expect(b.high).toBeGreaterThan(1.02 * b.nominal);
  });

  it("list the tolerances they assumed by kind", () => {
    const r = toleranceBands(rec, SUPPLY, [current], {
      seed: 3,
      samples: 2,
      budget: riskBudget(undefined, undefined),
    });
    expect(r.assumptions).toContainEqual(
      expect.objectContaining({ part: "HT1", field: "tolerance", value: 0.1 }),
    );
    expect(r.assumptions.some((a) => a.part === "C1")).toBe(false); // C1 states ±10 %
  });

  it("are identical on two runs with the same seed", () => {
    expect(band(rec)).toEqual(band(rec));
  });

  it("widen when the tolerances widen", () => {
    const narrow = band(withTolerance(rec, 0.02));
    const wide = band(withTolerance(rec, 0.2));
    expect(wide.high - wide.low).toBeGreaterThan(2 * (narrow.high - narrow.low));
    // The dropper's current follows its capacitance: ±2 % on C1 gives at most about ±2 %.
    expect(narrow.high / narrow.nominal).toBeLessThan(1.03);
  });
});

describe("measured against predicted", () => {
  const base = dropperHeater({ fuse: true, cls: "X2", bleeder: 470e3 });
  const analysis = analyzeCircuit(base, {});
  if (!analysis.ok) throw new Error(analysis.error.message);
  const predicted = analysis.value.input.current_rms;

  it("agrees, with no flag, when the measurement is the prediction within its uncertainty", () => {
    const r = assessRisks({ ...base, measurements: [measured(predicted * 1.02)] }, analysis.value, {
      samples: 12,
      seed: 1,
    });
    expect(r.comparisons).toHaveLength(1);
    expect(r.comparisons[0]!.verdict).toBe("agrees");
    expect(r.comparisons[0]!.low).toBeLessThan(predicted);
    expect(r.flags.some((f) => f.code === "measurement-mismatch")).toBe(false);
  });

  it("flags a current twice the prediction and names the dropper capacitor at about twice its value", () => {
    const r = assessRisks({ ...base, measurements: [measured(2 * predicted)] }, analysis.value, {
      samples: 12,
      seed: 1,
    });
    expect(r.comparisons[0]!.verdict).toBe("disagrees");
    const f = r.flags.find((x) => x.code === "measurement-mismatch")!;
    expect(f.parts[0]).toBe("C1");
    const factor = evNum(f, "that value against the traced C1");
    expect(factor).toBeGreaterThan(1.8);
    expect(factor).toBeLessThan(2.6);
    expect(evNum(f, "value of C1 that would explain it")).toBeCloseTo(factor * 1e-6, 12);
    // The nearest E6 value of about 2.2 µF (IEC 60063:2015, E6 series: 1.0 1.5 2.2 3.3 4.7 6.8).
    expect(evNum(f, "nearest E6 value")).toBeCloseTo(2.2e-6, 12);
    expect(f.evidence.find((e) => e.label === "nearest E6 value")!.unit).toBe("F");
    expect(evNum(f, "measured")).toBeCloseTo(2 * predicted, 12);
  });
});
