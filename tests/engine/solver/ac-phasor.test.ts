/**
 * The phasor solution of a linear circuit equals the transient's periodic steady state, and
 * nonlinear parts are linearised as open (their off-state resistance).
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, solveAcPhasor } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";

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
    const ac = solveAcPhasor(rec);
    const tr = analyzeCircuit(rec, { minSupply: false });
    if (!ac.ok || !tr.ok) throw new Error("solve failed");
    for (const net of ["A", "B", "S"]) {
      // Source: for a linear circuit the periodic steady state is the phasor solution (superposition).
      expect(Math.abs(tr.value.nets[net]!.rms / ac.value.nets[net]!.rms - 1)).toBeLessThan(2e-3);
    }
    expect(Math.abs(tr.value.input.current_rms / ac.value.input_current.rms - 1)).toBeLessThan(
      2e-3,
    );
    expect(Math.abs(tr.value.linear.input_current.rms - ac.value.input_current.rms)).toBeLessThan(
      1e-12,
    );
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
