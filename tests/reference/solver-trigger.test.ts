/**
 * A thyristor fired by a resistive divider from rectified mains: the gate current reaches igt
 * when k·v_P − igt·(Ra‖Rb) = vgt, i.e. at α = asin(Vth/(k·Vpk)) with Vth = vgt + igt·(Ra‖Rb)
 * (closed form, Thevenin equivalent of the divider); the lowest supply that still fires is
 * Vth/(k·√2). The bridge's two diode drops at the divider current are added where stated.
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, THERMAL_VOLTAGE_V } from "@teardown/engine";
import { phaseControlled } from "../engine/solver/reference-circuits.js";

const diode = { is: 5e-9, n: 1.9, rs: 0.05 };
const ra = 100_000;
const rb = 1000;
const vgt = 0.6;
const igt = 200e-6;
const k = rb / (ra + rb);
const vth = vgt + igt * ((ra * rb) / (ra + rb));
const vAtFiring = vth / k;
const iDivider = (vAtFiring - vgt) / ra;
// Source: Shockley diode law with the record's own model (closed form).
const vDiode =
  diode.n * THERMAL_VOLTAGE_V * Math.log(iDivider / diode.is + 1) + iDivider * diode.rs;
const vpk = 230 * Math.SQRT2;

describe("thyristor fired by a resistive divider from rectified mains", () => {
  const result = analyzeCircuit(phaseControlled(ra, rb, 10_000, diode));
  if (!result.ok) throw new Error(result.error.message);
  const trig = result.value.triggers.find((t) => t.part === "Q1")!;

  it("fires at asin(Vth/(k·Vpk)) within 1°", () => {
    // Source: closed form (divider Thevenin equivalent), diode drops ignored as in the formula.
    expect(Math.abs(trig.angle_deg! - (Math.asin(vth / (k * vpk)) * 180) / Math.PI)).toBeLessThan(
      1,
    );
  });

  it("fires within 0.05° of the same closed form once the two bridge diode drops are added", () => {
    // Source: closed form plus the Shockley drop of two bridge diodes at the divider current.
    expect(
      Math.abs(trig.angle_deg! - (Math.asin((vAtFiring + 2 * vDiode) / vpk) * 180) / Math.PI),
    ).toBeLessThan(0.05);
  });

  it("fires in the negative half-cycle at the same angle (a bridge rectifies both halves)", () => {
    // Source: closed form, the bridge output is |v|.
    expect(Math.abs(trig.angle_negative_deg! - trig.angle_deg!)).toBeLessThan(0.05);
  });

  it("still fires down to Vth/(k·√2) plus the diode drops, within 1%", () => {
    // Source: closed form, the firing condition reached at the peak of the supply.
    const expected = (vAtFiring + 2 * vDiode) / Math.SQRT2;
    expect(Math.abs(trig.min_supply_vrms! / expected - 1)).toBeLessThan(0.01);
  });
});
