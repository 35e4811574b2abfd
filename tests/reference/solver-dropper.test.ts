/**
 * A capacitive dropper into a resistor against its closed form, I = V / |R + 1/(jωC)|, in the
 * time domain (periodic steady state) and in phasors, at 230 V / 50 Hz and at 120 V / 60 Hz.
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, solveAcPhasor } from "@teardown/engine";
import { dropperIntoResistor } from "../engine/solver/reference-circuits.js";

const closedForm = (vrms: number, hz: number, c: number, r: number) =>
  vrms / Math.hypot(r, 1 / (2 * Math.PI * hz * c));

describe("capacitive dropper into a resistor", () => {
  it("draws V/|R + 1/(jωC)| in the time domain at 230 V 50 Hz", () => {
    const r = analyzeCircuit(dropperIntoResistor(330e-9, 1000), { minSupply: false });
    if (!r.ok) throw new Error(r.error.message);
    // Source: closed form (series RC impedance).
    const expected = closedForm(230, 50, 330e-9, 1000);
    expect(Math.abs(r.value.input.current_rms / expected - 1)).toBeLessThan(1e-3);
  });

  it("dissipates I²R in the resistor and gives the power factor R/|Z|", () => {
    const r = analyzeCircuit(dropperIntoResistor(330e-9, 1000), { minSupply: false });
    if (!r.ok) throw new Error(r.error.message);
    const i = closedForm(230, 50, 330e-9, 1000);
    const z = Math.hypot(1000, 1 / (2 * Math.PI * 50 * 330e-9));
    // Source: closed form.
    expect(Math.abs(r.value.parts.R1!.power / (i * i * 1000) - 1)).toBeLessThan(2e-3);
    expect(Math.abs(r.value.input.power_factor! / (1000 / z) - 1)).toBeLessThan(2e-3);
    expect(r.value.input.thd!).toBeLessThan(1e-3);
  });

  it("draws the closed-form current at 120 V 60 Hz as a what-if", () => {
    const r = analyzeCircuit(dropperIntoResistor(330e-9, 1000), {
      supply: { vrms: 120, hz: 60 },
      minSupply: false,
    });
    if (!r.ok) throw new Error(r.error.message);
    // Source: closed form.
    expect(
      Math.abs(r.value.input.current_rms / closedForm(120, 60, 330e-9, 1000) - 1),
    ).toBeLessThan(1e-3);
    expect(r.value.supply).toEqual({ vrms: 120, hz: 60 });
  });

  it("gives the same current in phasors, with the current leading the voltage by atan(1/(ωRC))", () => {
    const r = solveAcPhasor(dropperIntoResistor(330e-9, 1000));
    if (!r.ok) throw new Error(r.error.message);
    const w = 2 * Math.PI * 50;
    // Source: closed form.
    expect(
      Math.abs(r.value.input_current.rms / closedForm(230, 50, 330e-9, 1000) - 1),
    ).toBeLessThan(1e-6);
    expect(r.value.input_current.phase_deg).toBeCloseTo(
      (Math.atan(1 / (w * 1000 * 330e-9)) * 180) / Math.PI,
      4,
    );
    expect(r.value.nets.A!.rms).toBeCloseTo(closedForm(230, 50, 330e-9, 1000) * 1000, 6);
  });
});
