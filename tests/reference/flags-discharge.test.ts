/**
 * Capacitor discharge after unplugging, against reference-values.md §1: the closed-form RC decay
 * and its DERIVED test vectors, the limits of IEC 60335-1 22.5 and IEC 60950-1 2.1.1.7 (FOUND),
 * and the simulated unplugging against the closed form.
 */
import { describe, expect, it } from "vitest";
import {
  DISCHARGE_CAPACITANCE_THRESHOLD_F,
  PIN_VOLTAGE_DELAY_S,
  PIN_VOLTAGE_LIMIT_V,
  TYPE_A_MAX_TIME_CONSTANT_S,
  dischargeVerdicts,
  equivalentTimeConstant,
  maxBleederOhms,
  maxTimeConstantFor,
  rcDischargeVoltage,
} from "@teardown/engine";
import { assess } from "../engine/flags/flag-circuits.js";
import { xCapacitorInput } from "../engine/flags/flag-circuits.js";

const V0 = 230 * Math.SQRT2; // 325.269 V (reference-values.md §1, DERIVED)

describe("the discharge limits", () => {
  it("are 34 V at 1 s above 0.1 µF (IEC 60335-1 22.5, FOUND) and τ ≤ 1 s for type A (IEC 60950-1 2.1.1.7, FOUND)", () => {
    expect(PIN_VOLTAGE_LIMIT_V).toBe(34);
    expect(PIN_VOLTAGE_DELAY_S).toBe(1);
    expect(DISCHARGE_CAPACITANCE_THRESHOLD_F).toBe(0.1e-6);
    expect(TYPE_A_MAX_TIME_CONSTANT_S).toBe(1);
  });
});

describe("the closed-form RC discharge (reference-values.md §1, DERIVED vectors)", () => {
  it("takes 0.47 µF through 1 MΩ from 325.27 V to 38.74 V at 1 s: fails 34 V, passes τ ≤ 1 s", () => {
    const v = rcDischargeVoltage(V0, 1e6, 0.47e-6, 1);
    expect(v).toBeCloseTo(38.74, 2);
    expect(dischargeVerdicts(v, 0.47)).toEqual({
      exceeds_pin_limit: true,
      exceeds_type_a_tau: false,
    });
  });

  it("gives τ_max = 0.44281 s for 34 V at 1 s from 325.27 V", () => {
    expect(maxTimeConstantFor(V0, 34, 1)).toBeCloseTo(0.44281, 5);
  });

  it("gives the R_max column: 4.428 MΩ at 0.1 µF, 942.2 kΩ at 0.47 µF, 442.8 kΩ at 1 µF", () => {
    expect(maxBleederOhms(V0, 34, 1, 0.1e-6) / 1e6).toBeCloseTo(4.428, 3);
    expect(maxBleederOhms(V0, 34, 1, 0.47e-6) / 1e3).toBeCloseTo(942.2, 1);
    expect(maxBleederOhms(V0, 34, 1, 1e-6) / 1e3).toBeCloseTo(442.8, 1);
  });

  it("gives the 62368-1 ES1 row (60 V at 2 s): τ_max = 1.18322 s (ES1 level MEMORY, vector DERIVED)", () => {
    expect(maxTimeConstantFor(V0, 60, 2)).toBeCloseTo(1.18322, 5);
  });

  it("recovers RC as the equivalent time constant of an RC decay", () => {
    expect(equivalentTimeConstant(V0, rcDischargeVoltage(V0, 2.2e6, 0.33e-6, 1), 1)).toBeCloseTo(
      0.726,
      9,
    );
  });
});

describe("the simulated unplugging", () => {
  it("matches the closed form for an X capacitor with its bleeder: 0.47 µF, 1 MΩ, 38.74 V at 1 s (DERIVED)", () => {
    const f = assess(xCapacitorInput(1e6)).flags.find((x) => x.code === "bleeder-slow")!;
    // The open heater switch (1 GΩ) sits beside the bleeder: 1 MΩ ∥ 1.002 GΩ changes V(1 s) by < 0.2 %.
    expect(f.evidence.v_after_delay_v as number).toBeGreaterThan(38.74 * 0.995);
    expect(f.evidence.v_after_delay_v as number).toBeLessThan(38.74 * 1.005);
    expect(Math.abs(f.evidence.v_at_unplug_v as number)).toBeCloseTo(325.27, 1);
    expect(f.evidence.capacitance_at_pins_f as number).toBeCloseTo(0.47e-6, 8);
  });
});
