/**
 * Harmonics of the line current of a triac phase controller with a resistive load against the
 * Fourier series of the chopped sine: i(θ) = Im·sin θ for α ≤ θ < π, zero before, and the same
 * with the sign turned in the negative half (half-wave symmetry, so odd harmonics only). For odd n,
 *   a1 = −sin²α/π,  b1 = ((π − α) + sin 2α / 2)/π,
 *   an = [−cos((1+n)θ)/(1+n) − cos((1−n)θ)/(1−n)] from α to π, over π,
 *   bn = [sin((1−n)θ)/(1−n) − sin((1+n)θ)/(1+n)] from α to π, over π,
 * and the nth harmonic's peak is Im·√(an² + bn²).
 * Source: the Fourier coefficients of a half-wave symmetric periodic function integrated in
 * closed form; the same series is given for the single-phase AC voltage controller with a
 * resistive load in Mohan, Undeland & Robbins, "Power Electronics: Converters, Applications,
 * and Design" (from memory). The formula is checked here against a brute-force integral first.
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit } from "@teardown/engine";
import { part, record } from "../support/record-factory.js";

const VPK = 230 * Math.SQRT2;
const RL = 100;

/** Peak of the nth harmonic over Im, from the closed form above. */
function choppedSineHarmonic(n: number, alpha: number): number {
  const P = Math.PI;
  let a: number;
  let b: number;
  if (n === 1) {
    a = -(Math.sin(alpha) ** 2) / P;
    b = (P - alpha + Math.sin(2 * alpha) / 2) / P;
  } else {
    const A = (t: number) => -Math.cos((1 + n) * t) / (1 + n) - Math.cos((1 - n) * t) / (1 - n);
    const B = (t: number) => Math.sin((1 - n) * t) / (1 - n) - Math.sin((1 + n) * t) / (1 + n);
    a = (A(P) - A(alpha)) / P;
    b = (B(P) - B(alpha)) / P;
  }
  return Math.hypot(a, b);
}

/** A triac and a 100 Ω load across the mains, fired by a divider from the triac's own voltage. */
function phaseControlledLoad(ra: number) {
  return record([
    part("RL", "resistor", ["L", "A"], RL),
    part("Q1", "triac", { mt1: "N", mt2: "A", gate: "G" }, null, {
      // a near-ideal on-state (0.05 V) so the chopped sine is what flows
      model: { vgt: 0.8, igt: 5e-3, ih: 10e-3, von: 0.05 },
    }),
    part("RA", "resistor", ["A", "G"], ra),
    part("RB", "resistor", ["G", "N"], 1000),
  ]);
}

describe("line-current harmonics of a phase-controlled resistive load", () => {
  it("writes the closed form as the brute-force Fourier integral of the chopped sine", () => {
    // Independent check of the helper: midpoint rule over one whole period, 2·10⁵ points.
    for (const deg of [40, 90, 130]) {
      const alpha = (deg * Math.PI) / 180;
      const m = 200_000;
      for (const n of [1, 3, 5, 7, 9]) {
        let a = 0;
        let b = 0;
        for (let k = 0; k < m; k++) {
          const t = ((k + 0.5) * 2 * Math.PI) / m;
          const inHalf = t % Math.PI;
          const f = inHalf >= alpha ? Math.sin(t) : 0;
          a += f * Math.cos(n * t);
          b += f * Math.sin(n * t);
        }
        const brute = (Math.hypot(a, b) * 2) / m;
        expect(choppedSineHarmonic(n, alpha) / brute).toBeCloseTo(1, 4);
      }
    }
  });

  // Upper divider resistors that fire near 28° and near 61° (Thevenin estimate, as in solver-trigger).
  for (const ra of [25_000, 48_000]) {
    it(`matches the series within 2% for harmonics 1, 3, 5, 7, 9 (RA = ${ra / 1000} kΩ)`, () => {
      const r = analyzeCircuit(phaseControlledLoad(ra), { minSupply: false });
      if (!r.ok) throw new Error(r.error.message);
      const trig = r.value.triggers.find((t) => t.part === "Q1")!;
      expect(trig.fires).toBe(true);
      // The series is evaluated at the angle the solver fired at (the positive and negative
      // halves agree for a symmetric trigger).
      expect(Math.abs(trig.angle_negative_deg! - trig.angle_deg!)).toBeLessThan(0.1);
      const alpha = (trig.angle_deg! * Math.PI) / 180;
      const harmonics = r.value.input.harmonics;
      for (const n of [1, 3, 5, 7, 9]) {
        const got = harmonics.find((h) => h.order === n)!.rms;
        // Source: the closed form in the header (Mohan, Undeland & Robbins, from memory).
        const expected = ((VPK / RL) * choppedSineHarmonic(n, alpha)) / Math.SQRT2;
        expect(Math.abs(got / expected - 1), `harmonic ${n}`).toBeLessThan(0.02);
      }
      // Even harmonics vanish by half-wave symmetry.
      const fundamental = harmonics[0]!.rms;
      for (const n of [2, 4, 6]) expect(harmonics[n - 1]!.rms / fundamental).toBeLessThan(0.005);
    });
  }
});
