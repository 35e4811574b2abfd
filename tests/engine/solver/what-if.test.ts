/**
 * What-if runs: another supply, a sweep of one part's value, and the nearest E-series trigger
 * resistor for a wanted firing angle.
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, E_SERIES, suggestTriggerResistor, sweepPartValue } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { dropperIntoResistor, phaseControlled } from "./reference-circuits.js";

describe("what-if runs", () => {
  it("draws less current through a dropper at 120 V 60 Hz by the closed-form ratio", () => {
    const base = analyzeCircuit(dropperIntoResistor(), { minSupply: false });
    const us = analyzeCircuit(dropperIntoResistor(), {
      supply: { vrms: 120, hz: 60 },
      minSupply: false,
    });
    if (!base.ok || !us.ok) throw new Error("solve failed");
    const z = (hz: number) => Math.hypot(1000, 1 / (2 * Math.PI * hz * 330e-9));
    // Source: closed form, I = V/|Z(f)|.
    expect(us.value.input.current_rms / base.value.input.current_rms).toBeCloseTo(
      120 / z(60) / (230 / z(50)),
      4,
    );
  });

  it("sweeps the dropper capacitor and the current rises with it", () => {
    const sweep = sweepPartValue(dropperIntoResistor(), "C1", [100e-9, 220e-9, 470e-9], {
      minSupply: false,
    });
    if (!sweep.ok) throw new Error(sweep.error.message);
    const currents = sweep.value.map((p) => (p.result.ok ? p.result.value.input.current_rms : NaN));
    expect(currents[0]!).toBeLessThan(currents[1]!);
    expect(currents[1]!).toBeLessThan(currents[2]!);
    // Source: closed form at 470 nF.
    expect(currents[2]! / (230 / Math.hypot(1000, 1 / (2 * Math.PI * 50 * 470e-9)))).toBeCloseTo(
      1,
      3,
    );
  });

  it("sweeps a load's resistance (kept in its model) and the current follows V/R", () => {
    const heater = record([
      part("F1", "fuse", ["L", "A"], 2),
      part("HT1", "load", ["A", "N"], null, { model: { r: 500 } }),
    ]);
    const sweep = sweepPartValue(heater, "HT1", [250, 500, 1000], { minSupply: false });
    if (!sweep.ok) throw new Error(sweep.error.message);
    const currents = sweep.value.map((p) => (p.result.ok ? p.result.value.input.current_rms : NaN));
    // Source: Ohm's law, I = V / (R_load + R_fuse); the fuse is a small series resistance, so
    // the currents stand in the ratio of the loads within 1 %.
    expect(currents[0]! / (230 / 250)).toBeCloseTo(1, 1);
    expect(currents[1]! / (230 / 500)).toBeCloseTo(1, 1);
    expect(currents[2]! / (230 / 1000)).toBeCloseTo(1, 1);
    expect(currents[0]! / currents[2]!).toBeGreaterThan(3.9);
  });

  it("refuses to sweep a part with no value a sweep could change", () => {
    const lamp = record([part("HT1", "load", ["L", "N"]), part("R1", "resistor", ["L", "N"], 1e3)]);
    const sweep = sweepPartValue(lamp, "HT1", [100, 200], { minSupply: false });
    expect(sweep.ok).toBe(false);
    if (!sweep.ok) expect(sweep.error.message).toMatch(/HT1 has no value a sweep can change/);
  });

  it("refuses to sweep a part that is not in the record", () => {
    const sweep = sweepPartValue(dropperIntoResistor(), "C9", [1e-9]);
    expect(sweep.ok).toBe(false);
  });

  it("suggests an E24 upper divider resistor that fires near the wanted angle at 120 V", () => {
    const s = suggestTriggerResistor(phaseControlled(100_000), {
      thyristor: "Q1",
      resistor: "RA",
      wantedAngleDeg: 30,
      supply: { vrms: 120, hz: 60 },
      series: "E24",
    });
    if (!s.ok) throw new Error(s.error.message);
    const mantissa = s.value.suggested_ohms / 10 ** Math.floor(Math.log10(s.value.suggested_ohms));
    // Source: IEC 60063 E24 (the values module's table).
    expect(E_SERIES.E24.some((v) => Math.abs(v - mantissa) < 1e-9)).toBe(true);
    // Source: closed form for the continuous value, Ra = (Vpk·sin α − 2·Vd − vgt)/(vgt/Rb + igt), Vd ≈ 0.6 V.
    const expected = (120 * Math.SQRT2 * 0.5 - 1.2 - 0.6) / (0.6 / 1000 + 200e-6);
    expect(Math.abs(s.value.continuous_ohms / expected - 1)).toBeLessThan(0.02);
    // E24 steps are about 10%, so the rounded value fires within a few degrees of the wanted angle.
    expect(Math.abs(s.value.angle_deg! - 30)).toBeLessThan(3);
  });
});
