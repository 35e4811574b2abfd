/**
 * A triac lamp stage with an RC snubber across the triac, against closed forms: the snubber's
 * resistor and capacitor (in series) carry the same RMS current, the capacitor takes no mean
 * power, and the resistor dissipates what each firing dumps from the capacitor plus the small
 * charging current between firings. Also a bare capacitor across the triac, whose discharge
 * through the on-state resistance is a few nanoseconds long.
 *
 * Closed forms (circuit theory textbook results, e.g. Hayt & Kemmerly, "Engineering Circuit
 * Analysis", first-order RC circuits; from memory):
 * - a capacitor charged to V discharging through R into a fixed voltage Von dissipates
 *   C(V − Von)²/2 in the resistance, and ∫i² dt = C(V − Von)²/(2R);
 * - a capacitor following a sine of peak Vpk carries C·ω·Vpk·cos ωt.
 * The firing point follows from the gate model: the gate junction passes igt at vgt, so the
 * triac fires when its main terminal reaches vgt + RA·(igt + vgt/RB).
 * Phase control of a resistive load (any power electronics textbook, e.g. Mohan, Undeland &
 * Robbins, "Power Electronics", ac-ac phase control; from memory):
 * I_rms = (V/R)·sqrt(1 − α/π + sin 2α/(2π)).
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, solveCircuit, STORAGE_POWER_TOLERANCE } from "@teardown/engine";
import { part, record } from "../support/record-factory.js";

const VRMS = 230;
const VPK = VRMS * Math.SQRT2;
const W = 2 * Math.PI * 50;
const FIRINGS_PER_S = 100;
const LAMP = 529;
const C = 47e-9;
const RA = 47_000;
const RB = 1000;
const GATE = { vgt: 0.8, igt: 5e-3, ih: 10e-3, von: 1.2, ron: 0.1 };

function stage(rs: number | null) {
  const parts = [
    part("F1", "fuse", ["L", "L1"], 2, { model: { r: 0.05 } }),
    part("LAMP1", "load", ["L1", "A"], null, { model: { r: LAMP } }),
    part("Q1", "triac", { mt1: "N", mt2: "A", gate: "G" }, null, { model: GATE }),
    part("RA", "resistor", ["A", "G"], RA),
    part("RB", "resistor", ["G", "N"], RB),
  ];
  if (rs === null) parts.push(part("CS", "capacitor", ["A", "N"], C));
  else parts.push(part("RS", "resistor", ["A", "S"], rs), part("CS", "capacitor", ["S", "N"], C));
  return record(parts);
}

/** The closed-form firing: triac voltage, supply angle, capacitor voltage at the instant. */
function firing(rs: number) {
  const vFire = GATE.vgt + RA * (GATE.igt + GATE.vgt / RB);
  // The supply is higher by the lamp's drop: gate divider current plus the snubber's.
  let angle = Math.asin(vFire / VPK);
  for (let k = 0; k < 5; k++) {
    const iSnub = C * W * VPK * Math.cos(angle);
    angle = Math.asin((vFire + LAMP * (GATE.igt + GATE.vgt / RB + iSnub)) / VPK);
  }
  const vCap = vFire - rs * C * W * VPK * Math.cos(angle);
  return { angle, vCap };
}

/** Closed-form snubber: mean i² and the resistor's mean power. */
function snubber(rs: number) {
  const { angle, vCap } = firing(rs);
  const r = rs + GATE.ron;
  const dv = vCap - GATE.von;
  // Between firings the capacitor follows the supply: ∫(CωVpk cos ωt)² over [0, α/ω].
  const charging = ((C * W * VPK) ** 2 / W) * (angle / 2 + Math.sin(2 * angle) / 4);
  const meanSquare = FIRINGS_PER_S * ((C * dv * dv) / (2 * r) + charging);
  return {
    rms: Math.sqrt(meanSquare),
    power: FIRINGS_PER_S * ((C * dv * dv) / 2) * (rs / r) + rs * FIRINGS_PER_S * charging,
  };
}

describe("triac lamp stage with a snubber", () => {
  for (const rs of [100, 39]) {
    it(`gives RS and CS (${rs} Ω, 47 nF) one RMS current, the closed form's within 1%`, () => {
      const r = analyzeCircuit(stage(rs), { minSupply: false });
      if (!r.ok) throw new Error(r.error.message);
      const { parts } = r.value;
      const expected = snubber(rs).rms;
      expect(Math.abs(parts.RS!.current_rms / parts.CS!.current_rms - 1)).toBeLessThan(0.01);
      expect(Math.abs(parts.RS!.current_rms / expected - 1)).toBeLessThan(0.01);
      expect(Math.abs(parts.F1!.current_rms / parts.LAMP1!.current_rms - 1)).toBeLessThan(0.01);
    });

    it(`dissipates the closed form's power in RS (${rs} Ω) within 2%, none in CS`, () => {
      const r = analyzeCircuit(stage(rs), { minSupply: false });
      if (!r.ok) throw new Error(r.error.message);
      const { parts, input } = r.value;
      expect(Math.abs(parts.RS!.power / snubber(rs).power - 1)).toBeLessThan(0.02);
      expect(Math.abs(parts.CS!.power)).toBeLessThan(STORAGE_POWER_TOLERANCE * input.power);
      // Source: conservation of energy (Tellegen's theorem), a law.
      const sum = Object.values(parts).reduce((a, p) => a + p.power, 0);
      expect(Math.abs(sum / input.power - 1)).toBeLessThan(1e-3);
    });
  }

  it("gives the lamp the phase-control RMS current within 1% at the closed-form angle", () => {
    const r = analyzeCircuit(stage(100), { minSupply: false });
    if (!r.ok) throw new Error(r.error.message);
    const { angle } = firing(100);
    const expected =
      (VRMS / LAMP) * Math.sqrt(1 - angle / Math.PI + Math.sin(2 * angle) / (2 * Math.PI));
    expect(Math.abs(r.value.parts.LAMP1!.current_rms / expected - 1)).toBeLessThan(0.01);
    expect(Math.abs(r.value.triggers[0]!.angle_deg! - (angle * 180) / Math.PI)).toBeLessThan(0.5);
  });

  it("resolves a bare capacitor's discharge: its RMS, mean power and plotted peak agree", () => {
    const r = analyzeCircuit(stage(null), { minSupply: false });
    if (!r.ok) throw new Error(r.error.message);
    const { parts, input, waveforms } = r.value;
    // With RS = 0 the closed form is the discharge through the on-state resistance alone.
    const expected = snubber(0).rms;
    expect(Math.abs(parts.CS!.current_rms / expected - 1)).toBeLessThan(0.01);
    expect(Math.abs(parts.CS!.power)).toBeLessThan(STORAGE_POWER_TOLERANCE * input.power);
    // The plot shows the discharge at its height ((V − Von)/ron), not only the charging current.
    const plotted = Math.max(...waveforms.series["CS.current"]!.map(Math.abs));
    const { vCap } = firing(0);
    expect(plotted).toBeGreaterThan(0.5 * ((vCap - GATE.von) / GATE.ron));
    // A current that holds no step-to-step ringing: its mean over the cycle is zero (a capacitor
    // in a periodic state passes no DC), to a part in 1e4 of its RMS.
    expect(Math.abs(parts.CS!.current_dc)).toBeLessThan(1e-4 * parts.CS!.current_rms);
  });

  for (const rs of [null, 100, 39]) {
    it(`leaves no step-to-step ringing in the capacitor's current (${rs ?? "no"} resistor)`, () => {
      const r = solveCircuit(stage(rs));
      if (!r.ok) throw new Error(r.error.message);
      const cs = r.value.circuit.devices.find((d) => d.ref === "CS")!;
      // A capacitor's memory holds its voltage, then its current, at every computed point.
      const i = r.value.steady.run.samples.map((s) => s.mem[cs.mem + 1]!);
      const peak = Math.max(...i.map(Math.abs));
      // Source: closed form, after each firing the current is a single decaying exponential
      // plus the slow charging current, so it never turns back and forth from point to point.
      // Count the longest run of alternating steps larger than a thousandth of the peak.
      let run = 0;
      let longest = 0;
      for (let k = 2; k < i.length; k++) {
        const a = i[k - 1]! - i[k - 2]!;
        const b = i[k]! - i[k - 1]!;
        run = a * b < 0 && Math.abs(b) > 1e-3 * peak ? run + 1 : 0;
        longest = Math.max(longest, run);
      }
      expect(longest).toBeLessThan(3);
    });
  }
});
