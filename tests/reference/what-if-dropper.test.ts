/**
 * A what-if of a capacitive dropper into a resistor, at 120 V / 60 Hz and with its capacitor
 * changed, against the phasor closed form of the series RC: I = V / |R + 1/(jωC)|, the power
 * I²R, and the current leading the voltage by atan(1/(ωRC)).
 * Source: series RC impedance, any circuit-theory text (closed form).
 */
import { describe, expect, it } from "vitest";
import { analyzeWhatIf } from "@teardown/engine";
import { dropperIntoResistor } from "../engine/solver/reference-circuits.js";

const current = (vrms: number, hz: number, c: number, r: number) =>
  vrms / Math.hypot(r, 1 / (2 * Math.PI * hz * c));

describe("what-if of a capacitive dropper", () => {
  it("draws the closed-form current at 120 V / 60 Hz", async () => {
    const out = await analyzeWhatIf(dropperIntoResistor(330e-9, 1000), {
      supply: { vrms: 120, hz: 60 },
    });
    if (!out.ok || out.result.status === "not-solved") throw new Error(JSON.stringify(out));
    expect(out.result.supply).toEqual({ vrms: 120, hz: 60 });
    // Source: closed form (series RC impedance).
    const expected = current(120, 60, 330e-9, 1000);
    expect(Math.abs(out.result.input.current_rms! / expected - 1)).toBeLessThan(0.02);
    expect(Math.abs(out.result.linear.input_current.rms! / expected - 1)).toBeLessThan(0.02);
  });

  it("draws the closed-form current, power and phase at 120 V / 60 Hz with the capacitor changed to 470 nF", async () => {
    const out = await analyzeWhatIf(dropperIntoResistor(330e-9, 1000), {
      supply: { vrms: 120, hz: 60 },
      changes: [{ part: "C1", value: "470n" }],
    });
    if (!out.ok || out.result.status === "not-solved") throw new Error(JSON.stringify(out));
    const i = current(120, 60, 470e-9, 1000);
    // Source: closed form (series RC impedance), I²R and atan(1/(ωRC)).
    expect(Math.abs(out.result.input.current_rms! / i - 1)).toBeLessThan(0.02);
    expect(Math.abs(out.result.parts.R1!.power! / (i * i * 1000) - 1)).toBeLessThan(0.02);
    const lead = (Math.atan(1 / (2 * Math.PI * 60 * 1000 * 470e-9)) * 180) / Math.PI;
    expect(Math.abs(out.result.linear.input_current.phase_deg! - lead)).toBeLessThan(0.02 * lead);
    // The what-if really changed the part: the old value draws about 30% less.
    expect(
      Math.abs(out.result.input.current_rms! / current(120, 60, 330e-9, 1000) - 1),
    ).toBeGreaterThan(0.2);
  });
});
