/**
 * Tolerance bands and measured-versus-predicted: bands hold the nominal, repeat exactly, widen
 * with the tolerances; a measurement twice the prediction is flagged with the dropper first.
 */
import { describe, expect, it } from "vitest";
import type { Measurement, SolvedCircuit, TeardownRecord } from "@teardown/engine";
import {
  analyzeCircuit,
  assessRisks,
  mulberry32,
  riskBudget,
  solveCircuit,
  toleranceBands,
} from "@teardown/engine";
import { dropperHeater } from "../flags/flag-circuits.js";

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

  it("contain the nominal prediction, which matches a plain solve", () => {
    const b = band(rec);
    const s = solveCircuit(rec);
    if (!s.ok) throw new Error(s.error.message);
    expect(b.nominal).toBeCloseTo(s.value.figures.input.current_rms, 9);
    expect(b.low).toBeLessThan(b.nominal);
    expect(b.high).toBeGreaterThan(b.nominal);
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
    expect(f.evidence.explaining_part).toBe("C1");
    const factor = f.evidence.explaining_factor as number;
    expect(factor).toBeGreaterThan(1.8);
    expect(factor).toBeLessThan(2.6);
    // The nearest E6/E12 values of the explaining capacitance (IEC 60063, via nearestInSeries).
    const near = f.evidence.explaining_nearest as Array<{ series: string; value: number }>;
    expect(near.map((n) => n.series)).toEqual(["E6", "E12"]);
    expect(near[0]!.value).toBeCloseTo(2.2e-6, 12);
  });
});
