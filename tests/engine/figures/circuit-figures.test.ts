/**
 * Figures of a steady cycle: net DC/RMS/peak of a half-wave rectifier, part figures, firing
 * angles of a triac in both half-cycles, and waveforms capped at 1,000 points.
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, MAX_WAVEFORM_POINTS } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { triacDimmer } from "../solver/reference-circuits.js";

describe("figures of a steady cycle", () => {
  it("gives a half-wave rectified resistor load a DC of about Vpk/π and an RMS of about Vpk/2", () => {
    const rec = record([
      part("D1", "diode", { anode: "L", cathode: "P" }),
      part("R1", "resistor", ["P", "N"], 10_000),
    ]);
    const r = analyzeCircuit(rec, { minSupply: false });
    if (!r.ok) throw new Error(r.error.message);
    const vpk = 230 * Math.SQRT2;
    // Source: closed form for an ideal half-wave rectifier; the diode's ~0.7 V drop takes < 1%.
    expect(Math.abs(r.value.nets.P!.dc / (vpk / Math.PI) - 1)).toBeLessThan(0.01);
    expect(Math.abs(r.value.nets.P!.rms / (vpk / 2) - 1)).toBeLessThan(0.01);
    expect(Math.abs(r.value.nets.P!.peak / vpk - 1)).toBeLessThan(0.01);
    // The diode blocks the full negative peak.
    expect(Math.abs(r.value.parts.D1!.voltage_peak / vpk - 1)).toBeLessThan(0.01);
    // Source: closed form, a half-sine of peak Vpk across R dissipates Vpk²/(4R) on average;
    // the diode's drop takes about 2·Vf/Vpk < 1% of it.
    expect(Math.abs(r.value.parts.R1!.power / (vpk ** 2 / 40_000) - 1)).toBeLessThan(0.01);
    // Source: closed form, the mean of a half-wave rectified sine is Ipk/π (into R1's first pin).
    expect(Math.abs(r.value.parts.R1!.current_dc / (vpk / 10_000 / Math.PI) - 1)).toBeLessThan(
      0.01,
    );
  });

  it("fires a triac at the same angle in both half-cycles and keeps waveforms within 1,000 points", () => {
    const r = analyzeCircuit(triacDimmer(), { minSupply: false });
    if (!r.ok) throw new Error(r.error.message);
    const trig = r.value.triggers[0]!;
    expect(trig.fires).toBe(true);
    // Source: symmetry of a triac with a symmetric gate drive (closed form).
    expect(Math.abs(trig.angle_deg! - trig.angle_negative_deg!)).toBeLessThan(0.1);
    expect(r.value.waveforms.t.length).toBeLessThanOrEqual(MAX_WAVEFORM_POINTS);
    for (const s of Object.values(r.value.waveforms.series))
      expect(s.length).toBe(r.value.waveforms.t.length);
    expect(Object.keys(r.value.waveforms.series)).toContain("input.current");
  });

  it("reports a thyristor that never fires with a null angle", () => {
    const rec = record([
      part("RL", "resistor", ["L", "A"], 1000),
      part("Q1", "thyristor", { anode: "A", gate: "G", cathode: "N" }),
      part("RG", "resistor", ["G", "N"], 1000),
    ]);
    const r = analyzeCircuit(rec);
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.triggers).toEqual([
      {
        part: "Q1",
        fires: false,
        angle_deg: null,
        angle_negative_deg: null,
        min_supply_vrms: null,
        min_supply_cold_vrms: null,
      },
    ]);
    expect(r.value.assumptions).toContainEqual(
      expect.objectContaining({ part: "Q1", field: "model.igt", value: 200e-6 }),
    );
  });
});
