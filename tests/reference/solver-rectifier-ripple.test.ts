/**
 * A full-wave bridge rectifier with a smoothing capacitor: the peak-to-peak ripple against the
 * textbook estimate ΔV ≈ I/(2fC) (capacitor supplies the load between the charging peaks).
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit } from "@teardown/engine";
import { smoothedRectifier } from "../engine/solver/reference-circuits.js";

function ripple(c: number, rl: number) {
  const r = analyzeCircuit(smoothedRectifier(c, rl), { minSupply: false });
  if (!r.ok) throw new Error(r.error.message);
  const p = r.value.waveforms.series["net.P"]!;
  const m = r.value.waveforms.series["net.M"]!;
  const v = p.map((x, k) => x - m[k]!);
  const load = (r.value.nets.P!.dc - r.value.nets.M!.dc) / rl;
  return {
    measured: Math.max(...v) - Math.min(...v),
    estimate: load / (2 * 50 * c),
    dc: r.value.nets.P!.dc - r.value.nets.M!.dc,
  };
}

describe("full-wave rectifier with a smoothing capacitor", () => {
  it("ripples by about I/(2fC) with 470 µF and 10 kΩ", () => {
    const { measured, estimate } = ripple(470e-6, 10_000);
    // Source: textbook estimate ΔV ≈ I/(2fC) for a full-wave rectifier (e.g. Horowitz & Hill, from memory);
    // it assumes a short charging pulse, so the load is light enough for a ripple of a few volts.
    expect(Math.abs(measured / estimate - 1)).toBeLessThan(0.1);
  });

  it("ripples by about I/(2fC) with 100 µF and 20 kΩ", () => {
    const { measured, estimate } = ripple(100e-6, 20_000);
    // Source: same textbook estimate, from memory.
    expect(Math.abs(measured / estimate - 1)).toBeLessThan(0.1);
  });

  it("ripples less than I/(2fC) once the charging pulses get wide (heavier load)", () => {
    const { measured, estimate } = ripple(470e-6, 2000);
    // Source: closed-form reasoning: the capacitor discharges for less than a half-period.
    expect(measured).toBeLessThan(estimate);
    expect(measured).toBeGreaterThan(0.7 * estimate);
  });

  it("holds the output a little below the supply peak (two diode drops and the ripple)", () => {
    const { dc } = ripple(470e-6, 2000);
    // Source: common practice: Vdc ≈ Vpk − 2·Vf − ΔV/2, with Vf about 1 V.
    expect(dc).toBeGreaterThan(230 * Math.SQRT2 - 10);
    expect(dc).toBeLessThan(230 * Math.SQRT2 - 1);
  });
});
