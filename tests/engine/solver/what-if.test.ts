/**
 * What-if runs: another supply and a sweep of one part's value (the gate-feed suggestion is
 * checked in tests/reference/what-if-gate-feed.test.ts).
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, sweepPartValue } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { dropperIntoResistor } from "./reference-circuits.js";

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
});
