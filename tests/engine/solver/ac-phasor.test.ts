/**
 * The phasor solution of a linear circuit and the transient's periodic steady state both equal
 * the hand-reduced impedance network, and nonlinear parts are linearised as open (their
 * off-state resistance).
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, solveAcPhasor } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";

/** Complex numbers as [re, im], enough for a hand-reduced network. */
type Cx = [number, number];
const add = (a: Cx, b: Cx): Cx => [a[0] + b[0], a[1] + b[1]];
const mul = (a: Cx, b: Cx): Cx => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const div = (a: Cx, b: Cx): Cx => {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
};
const par = (a: Cx, b: Cx): Cx => div(mul(a, b), add(a, b));
const abs = (a: Cx) => Math.hypot(a[0], a[1]);

describe("AC phasor view", () => {
  it("matches the transient steady state of a linear RLC network, net by net", () => {
    const rec = record([
      part("R1", "resistor", ["L", "A"], 470),
      part("C1", "capacitor", ["A", "B"], 1e-6),
      part("L1", "inductor", ["B", "N"], 2, { model: { r: 30 } }),
      part("R2", "resistor", ["A", "N"], 2200),
      part("T1", "transformer", { p1: "B", p2: "N", s1: "S", s2: "N" }, null, {
        model: { lp: 5, ratio: 10, k: 0.95, rp: 20, rs: 1 },
      }),
      part("R3", "resistor", ["S", "N"], 100),
    ]);
    // Source: closed form, series/parallel reduction with the coupled pair reflected into its
    // primary, Zp + (ωM)²/(Rs + jωLs + R3), with Ls = Lp/ratio² and M = k·sqrt(Lp·Ls).
    const w = 2 * Math.PI * 50;
    const ls = 5 / 100;
    const m = 0.95 * Math.sqrt(5 * ls);
    const zSec: Cx = [1 + 100, w * ls];
    const zT = add([20, w * 5], div([(w * m) ** 2, 0], zSec));
    const zB = par(zT, [30, w * 2]);
    const zBranch = add(div([1, 0], [0, w * 1e-6]), zB);
    const zA = par([2200, 0], zBranch);
    const iIn = div([230, 0], add([470, 0], zA));
    const vA = mul(iIn, zA);
    const vB = mul(div(vA, zBranch), zB);
    const iP = div(vB, zT);
    const vS = mul(div(mul([0, -w * m], iP), zSec), [100, 0]);
    const expected: Record<string, number> = { A: abs(vA), B: abs(vB), S: abs(vS) };
    const ac = solveAcPhasor(rec);
    const tr = analyzeCircuit(rec, { minSupply: false });
    if (!ac.ok || !tr.ok) throw new Error("solve failed");
    for (const net of ["A", "B", "S"]) {
      expect(Math.abs(ac.value.nets[net]!.rms / expected[net]! - 1), net).toBeLessThan(1e-6);
      expect(Math.abs(tr.value.nets[net]!.rms / expected[net]! - 1), net).toBeLessThan(2e-3);
    }
    expect(Math.abs(ac.value.input_current.rms / abs(iIn) - 1)).toBeLessThan(1e-6);
    expect(Math.abs(tr.value.input.current_rms / abs(iIn) - 1)).toBeLessThan(2e-3);
  });

  it("treats a diode as open in the linear view", () => {
    const rec = record([
      part("R1", "resistor", ["L", "A"], 1000),
      part("D1", "diode", { anode: "A", cathode: "N" }),
    ]);
    const ac = solveAcPhasor(rec);
    if (!ac.ok) throw new Error(ac.error.message);
    expect(ac.value.linearised).toEqual(["D1"]);
    // Source: closed form, 1 kΩ in series with 1 GΩ.
    expect(ac.value.nets.A!.rms).toBeCloseTo((230 * 1e9) / (1e9 + 1000 + 0.05), 3);
  });

  it("steps a transformer down by its turns ratio into a light load", () => {
    const rec = record([
      part("T1", "transformer", { p1: "L", p2: "N", s1: "S", s2: "Z" }, null, {
        model: { lp: 10, ratio: 20, k: 0.999, rp: 0.01, rs: 0.01 },
      }),
      part("R1", "resistor", ["S", "Z"], 1e6),
      part("R2", "resistor", ["Z", "N"], 1),
    ]);
    const ac = solveAcPhasor(rec);
    if (!ac.ok) throw new Error(ac.error.message);
    const vs =
      Math.hypot(
        ac.value.nets.S!.re - ac.value.nets.Z!.re,
        ac.value.nets.S!.im - ac.value.nets.Z!.im,
      ) / Math.SQRT2;
    // Source: closed form, an unloaded coupled pair gives k·sqrt(Ls/Lp)·Vp = 0.999 · 230 / 20.
    expect(vs / ((0.999 * 230) / 20)).toBeCloseTo(1, 3);
  });
});
