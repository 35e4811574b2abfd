/**
 * RMS output of a full-wave phase-controlled rectifier with a resistive load against
 * Vs·sqrt(1 − α/π + sin 2α/(2π)), at three firing angles set by the gate divider.
 * Source: the RMS output of a single-phase full-wave controlled rectifier with a resistive load,
 * Mohan, Undeland & Robbins, "Power Electronics: Converters, Applications, and Design"
 * (line-frequency phase-controlled rectifiers; from memory). The formula is also checked here
 * against a brute-force integral of the chopped sine, so a typo in it cannot pass unseen.
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
  it("writes the formula as the brute-force RMS of a sine chopped at α", () => {
    // Independent check of the helper: midpoint-rule integral of sin² over [α, π], 10⁵ points.
    for (const deg of [30, 45, 60]) {
      const alpha = (deg * Math.PI) / 180;
      const n = 100_000;
      let sum = 0;
      for (let k = 0; k < n; k++) sum += Math.sin(alpha + ((k + 0.5) * (Math.PI - alpha)) / n) ** 2;
      const bruteRms = 230 * Math.SQRT2 * Math.sqrt(((Math.PI - alpha) / n) * (sum / Math.PI));
      expect(fullWaveRms(230, alpha) / bruteRms).toBeCloseTo(1, 8);
    }
  });

  for (const target of [30, 45, 60]) {
    it(`gives the formula's RMS load voltage within 2% when fired near ${target}°`, () => {
      const rl = 10_000;
      const r = analyzeCircuit(phaseControlled(raFor(target), 1000, rl), { minSupply: false });
      if (!r.ok) throw new Error(r.error.message);
      const trig = r.value.triggers.find((t) => t.part === "Q1")!;
      expect(trig.fires).toBe(true);
      expect(Math.abs(trig.angle_deg! - target)).toBeLessThan(2);
      // The divider was sized for the target angle (closed form above), so the formula is
      // evaluated there, not at the angle the solver found; two diode drops and the thyristor's
      // on-state voltage (about 3 V of 325 V) are inside the 2%.
      const alpha = (target * Math.PI) / 180;
      const vLoad = r.value.parts.RL!.current_rms * rl;
      // Source: Mohan, Undeland & Robbins (see the header), from memory.
      expect(Math.abs(vLoad / fullWaveRms(230, alpha) - 1)).toBeLessThan(0.02);
    });
  }
});
