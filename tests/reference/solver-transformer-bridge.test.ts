/**
 * A fused mains transformer into a bridge rectifier and reservoir capacitor settles within a
 * handful of cycles, and its figures match the textbook closed forms (from memory: any power
 * electronics or circuit theory textbook's chapters on coupled inductors and on the
 * capacitor-input rectifier):
 * - magnetising current I_m = V / |R + jωLp| (the secondary carries almost no load);
 * - open-circuit secondary peak V_s = (k / n)·V_Lp,pk for coupled inductors with Ls = Lp / n²
 *   (n = Np/Ns) and M = k·sqrt(Lp·Ls), V_Lp the voltage across the primary's inductance;
 * - bridge output V_dc ≈ V_s − 2·V_d − ΔV/2, with V_d a silicon rectifier's forward drop
 *   (0.6–0.9 V at tens of milliamps to an ampere: common practice) and ripple ΔV ≈ I / (2fC);
 * - no DC in the primary: over a periodic cycle ∮v dt = 0, so R·I_dc = 0.
 */
import { describe, expect, it } from "vitest";
import type { TeardownRecord } from "@teardown/engine";
import { PSS_MAX_CYCLES, solveCircuit } from "@teardown/engine";
import { part, record } from "../support/record-factory.js";

const MAINS = { L: { role: "line" as const }, N: { role: "neutral" as const } };

const LP = 10;
const RATIO = 20;
const K = 0.98;
const RP = 200;
const RS = 0.5;
const FUSE_OHMS = 0.05;
const C = 470e-6;
const R_LOAD = 1000;
const VRMS = 230;
const HZ = 50;

/** The fused supply, every value the closed forms use written out (no engine defaults). */
function supply(): TeardownRecord {
  return record(
    [
      part("F1", "fuse", ["L", "L1"], 0.1, { model: { r: FUSE_OHMS } }),
      part("T1", "transformer", { p1: "L1", p2: "N", s1: "S1", s2: "S2" }, null, {
        model: { lp: LP, ratio: RATIO, k: K, rp: RP, rs: RS },
      }),
      part("D1", "diode", { anode: "S1", cathode: "P" }),
      part("D2", "diode", { anode: "S2", cathode: "P" }),
      part("D3", "diode", { anode: "M", cathode: "S1" }),
      part("D4", "diode", { anode: "M", cathode: "S2" }),
      part("C1", "capacitor", ["P", "M"], C),
      part("R1", "resistor", ["P", "M"], R_LOAD),
    ],
    MAINS,
  );
}

function solved() {
  const r = solveCircuit(supply());
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

/** V(P) − V(M) at every recorded point of the steady cycle. */
function outputVolts(s: ReturnType<typeof solved>): number[] {
  const p = s.circuit.nodeNames.indexOf("P");
  const m = s.circuit.nodeNames.indexOf("M");
  return s.steady.run.samples.map((q) => q.x[p]! - q.x[m]!);
}

const w = 2 * Math.PI * HZ;
const rSeries = RP + FUSE_OHMS;
/** Magnetising current, RMS. */
const iMag = VRMS / Math.hypot(rSeries, w * LP);
/** Open-circuit secondary peak. */
const vsPeak = (K / RATIO) * VRMS * Math.SQRT2 * ((w * LP) / Math.hypot(rSeries, w * LP));

describe("a transformer, bridge and reservoir at 230 V 50 Hz", () => {
  it("reaches its periodic steady state in a handful of cycles", () => {
    const s = solved();
    expect(s.steady.converged).toBe(true);
    expect(s.steady.residual).toBeLessThanOrEqual(1);
    expect(s.steady.cycles).toBeLessThan(PSS_MAX_CYCLES / 10);
  });

  it("draws the magnetising current V/|R + jωLp| and no DC", () => {
    const s = solved();
    const input = s.figures.input.current_rms;
    // The reflected load current (about 1 mA) adds in quadrature: well inside 2 %.
    expect(Math.abs(input / iMag - 1)).toBeLessThan(0.02);
    expect(input).toBeGreaterThan(iMag * 0.995);
    expect(Math.abs(s.figures.parts.F1!.current_dc)).toBeLessThan(1e-3 * iMag);
  });

  it("gives a DC output of the secondary peak less two diode drops and half the ripple", () => {
    const s = solved();
    const v = outputVolts(s);
    const mean = v.reduce((a, b) => a + b, 0) / v.length;
    const iLoad = mean / R_LOAD;
    const ripple = iLoad / (2 * HZ * C);
    // Bounds from the diode drop's range; the point estimate takes 0.75 V.
    expect(mean).toBeGreaterThan(vsPeak - 2 * 0.9 - ripple / 2 - 0.1);
    expect(mean).toBeLessThan(vsPeak - 2 * 0.6 - ripple / 2);
    expect(Math.abs(mean / (vsPeak - 2 * 0.75 - ripple / 2) - 1)).toBeLessThan(0.03);
  });

  it("ripples by less than I/(2fC), since the capacitor recharges for part of each half", () => {
    const s = solved();
    const v = outputVolts(s);
    const mean = v.reduce((a, b) => a + b, 0) / v.length;
    const expected = mean / R_LOAD / (2 * HZ * C);
    const swing = Math.max(...v) - Math.min(...v);
    // I/(2fC) takes the discharge over the whole half cycle: an upper bound. The recharge
    // starts where |v_s| − 2V_d meets the sagged output (about 76° here) and lasts until the
    // charging current, held up by the leakage inductance, falls to the load current, a little
    // past the peak: well under 45°, so the discharge lasts at least 3/4 of the half cycle.
    expect(swing / expected).toBeGreaterThan(0.75);
    expect(swing / expected).toBeLessThan(1.0);
  });
});
