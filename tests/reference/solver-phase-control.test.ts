/**
 * RMS output of a full-wave phase-controlled rectifier with a resistive load against
 * Vs·sqrt(1 − α/π + sin 2α/(2π)) (reference-values.md §6b, formula FOUND, vectors DERIVED),
 * at three firing angles set by the gate divider.
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit } from "@teardown/engine";
import { phaseControlled } from "../engine/solver/reference-circuits.js";

const fullWaveRms = (vs: number, alpha: number) =>
  vs * Math.sqrt(Math.max(0, 1 - alpha / Math.PI + Math.sin(2 * alpha) / (2 * Math.PI)));

/** Upper divider resistor for a wanted angle, from the divider's Thevenin equivalent (diode drops ignored). */
const raFor = (deg: number, rb = 1000, vgt = 0.6, igt = 200e-6) =>
  (230 * Math.SQRT2 * Math.sin((deg * Math.PI) / 180) - vgt) / (vgt / rb + igt);

describe("full-wave phase-controlled rectifier, resistive load", () => {
  it("uses a formula that matches the DERIVED vectors of reference-values.md §6b", () => {
    // Source: reference-values.md §6b table (DERIVED): 230 V at 30°, 45°, 60°.
    expect(fullWaveRms(230, Math.PI / 6)).toBeCloseTo(226.66, 2);
    expect(fullWaveRms(230, Math.PI / 4)).toBeCloseTo(219.304, 2);
    expect(fullWaveRms(230, Math.PI / 3)).toBeCloseTo(206.296, 2);
  });

  for (const target of [30, 45, 60]) {
    it(`gives the formula's RMS load voltage within 2% when fired near ${target}°`, () => {
      const rl = 10_000;
      const r = analyzeCircuit(phaseControlled(raFor(target), 1000, rl), { minSupply: false });
      if (!r.ok) throw new Error(r.error.message);
      const trig = r.value.triggers.find((t) => t.part === "Q1")!;
      expect(trig.fires).toBe(true);
      expect(Math.abs(trig.angle_deg! - target)).toBeLessThan(2);
      const alpha = (trig.angle_deg! * Math.PI) / 180;
      const vLoad = r.value.parts.RL!.current_rms * rl;
      // Source: reference-values.md §6b formula (FOUND), evaluated at the solver's own firing angle.
      expect(Math.abs(vLoad / fullWaveRms(230, alpha) - 1)).toBeLessThan(0.02);
    });
  }
});
