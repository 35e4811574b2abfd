/**
 * Capacitor discharge after unplugging. Published sources: IEC 60335-1:2010 (Ed. 5), clause 22.5
 * (34 V between the plug pins 1 s after unplugging at the peak, above 0.1 µF; FOUND, a forum
 * quote of the test text) and IEC 60950-1:2005 (Ed. 2), clause 2.1.1.7 (τ ≤ 1 s for pluggable
 * equipment type A; FOUND, a forum quote of the clause). Expected values come from the
 * closed-form RC decay V(t) = V0·e^(−t/RC) (any circuits textbook), computed in the tests
 * (DERIVED); the engine's rules are judged by what they flag on both sides of each limit.
 */
import { describe, expect, it } from "vitest";
import {
  dischargeVerdicts,
  equivalentTimeConstant,
  maxBleederOhms,
  maxTimeConstantFor,
  rcDischargeVoltage,
} from "@teardown/engine";
import { assess, codes, evNum, xCapacitorInput } from "../engine/flags/flag-circuits.js";

const V0 = 230 * Math.SQRT2; // 325.269 V, the peak of 230 V RMS
/** The published pin limit (IEC 60335-1, 22.5): 34 V after 1 s. */
const LIMIT_V = 34;
/** The largest bleeder that meets it on 0.47 µF, from the closed form: R = 1 s / (C·ln(V0/34 V)). */
const R_MAX_047 = 1 / (0.47e-6 * Math.log(V0 / LIMIT_V));

describe("the published limits, judged by what the engine flags on each side", () => {
  it("passes a bleeder 5 % under the largest that meets 34 V at 1 s (IEC 60335-1 22.5) and flags one 5 % over", () => {
    // R_MAX_047 is 942.2 kΩ.
    const under = codes(assess(xCapacitorInput(0.95 * R_MAX_047)));
    expect(under).not.toContain("bleeder-slow");
    expect(under).not.toContain("bleeder-missing");
    const over = assess(xCapacitorInput(1.05 * R_MAX_047)).flags.find(
      (f) => f.code === "bleeder-slow",
    )!;
    // Closed form at 1.05·R_max: V0·e^(−ln(V0/34)/1.05) = 37.86 V.
    const expected = V0 * Math.exp(-Math.log(V0 / LIMIT_V) / 1.05);
    expect(evNum(over, "pin voltage after the delay")).toBeGreaterThan(LIMIT_V);
    expect(evNum(over, "pin voltage after the delay") / expected).toBeCloseTo(1, 2);
  });

  it("applies only above 0.1 µF (IEC 60335-1 22.5 note): 0.09 µF without a bleeder is silent, 0.12 µF is flagged", () => {
    const small = codes(assess(xCapacitorInput(null, 0.09e-6)));
    expect(small).not.toContain("bleeder-missing");
    expect(small).not.toContain("bleeder-slow");
    expect(codes(assess(xCapacitorInput(null, 0.12e-6)))).toContain("bleeder-missing");
  });

  it("judges τ against 1 s (IEC 60950-1 2.1.1.7): a τ of 1.2 s is over, 0.9 s is not", () => {
    expect(dischargeVerdicts(20, 1.2).exceeds_type_a_tau).toBe(true);
    expect(dischargeVerdicts(20, 0.9).exceeds_type_a_tau).toBe(false);
    expect(dischargeVerdicts(34.5, 0.4)).toEqual({
      exceeds_pin_limit: true,
      exceeds_type_a_tau: false,
    });
    expect(dischargeVerdicts(33.5, 0.4).exceeds_pin_limit).toBe(false);
  });
});

describe("the closed-form RC discharge (DERIVED vectors)", () => {
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
    expect(evNum(f, "pin voltage after the delay")).toBeGreaterThan(38.74 * 0.995);
    expect(evNum(f, "pin voltage after the delay")).toBeLessThan(38.74 * 1.005);
    expect(evNum(f, "pin voltage when unplugged")).toBeCloseTo(325.27, 1);
    expect(evNum(f, "capacitance at the plug pins")).toBeCloseTo(0.47e-6, 8);
  });
});
