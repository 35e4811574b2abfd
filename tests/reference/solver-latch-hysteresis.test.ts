/**
 * A thyristor latched on smoothed DC (reference-circuits.ts, latchedOnDc): from rest it fires
 * when the divider's Thevenin voltage reaches the gate threshold, k·Vdc = vgt + igt·(Ra‖Rb)
 * (closed form, as in solver-trigger.test.ts); once on, it stays on while the load current
 * (Vdc − von)/(RL + ron) stays above the holding current ih (the latch rule of the part's
 * model, closed form). Vdc is the supply's crest less the rectifier diode's drop, which the
 * closed form brackets between 0.5 V and 1.0 V (a silicon junction at milliamps to the charging
 * pulses; common practice), and the capacitor's droop over a cycle, I·T/C. The searches bracket
 * each supply to 0.5 V from above.
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, assessRisks } from "@teardown/engine";
import { latchedOnDc } from "../engine/solver/reference-circuits.js";

const ra = 100_000;
const rb = 1000;
const rl = 10_000;
const vgt = 0.6;
const igt = 200e-6;
const ih = 5e-3;
const von = 1.0;
const ron = 0.05;
const c1 = 1000e-6;
const period = 1 / 50;
const resolution = 0.5;
const diodeLow = 0.5;
const diodeHigh = 1.0;

describe("a thyristor latched on smoothed DC starts and keeps running at different supplies", () => {
  const rec = latchedOnDc(rl);
  const result = analyzeCircuit(rec);
  if (!result.ok) throw new Error(result.error.message);
  const q1 = result.value.triggers.find((t) => t.part === "Q1")!;

  it("starts from cold at the supply whose crest brings the divider to the gate threshold", () => {
    // Source: closed form, divider Thevenin equivalent at the DC (crest less the diode drop).
    const vth = vgt + igt * ((ra * rb) / (ra + rb));
    const vdc = (vth * (ra + rb)) / rb;
    const droop = (vdc / (ra + rb)) * (period / c1);
    const low = (vdc + diodeLow) / Math.SQRT2;
    const high = (vdc + diodeHigh + droop) / Math.SQRT2 + resolution;
    expect(q1.min_supply_cold_vrms).toBeGreaterThanOrEqual(low);
    expect(q1.min_supply_cold_vrms).toBeLessThanOrEqual(high);
  });

  it("keeps running down to the supply whose DC holds the load current at ih", () => {
    // Source: closed form, the latch holds while (Vdc − von)/(RL + ron) ≥ ih.
    const vdc = von + ih * (rl + ron);
    const droop = (ih + vdc / (ra + rb)) * (period / c1);
    const low = (vdc + diodeLow) / Math.SQRT2;
    const high = (vdc + diodeHigh + droop) / Math.SQRT2 + resolution;
    expect(q1.min_supply_vrms).toBeGreaterThanOrEqual(low);
    expect(q1.min_supply_vrms).toBeLessThanOrEqual(high);
  });

  it("raises the start-dependent finding with both supplies as evidence", () => {
    const flag = assessRisks(rec, result.value, { samples: 2 }).flags.find(
      (f) => f.code === "start-dependent-state",
    );
    expect(flag?.source).toBe("common practice");
    const value = (label: string) => flag?.evidence.find((e) => e.label === label)?.value;
    expect(value("lowest supply, from cold (RMS)")).toBe(q1.min_supply_cold_vrms);
    expect(value("lowest supply, while running (RMS)")).toBe(q1.min_supply_vrms);
  });
});

describe("the same latch analysed at a supply between its two lowest supplies", () => {
  const vrms = 45;
  const vpk = vrms * Math.SQRT2;
  const result = analyzeCircuit(latchedOnDc(rl), { supply: { vrms, hz: 50 } });
  if (!result.ok) throw new Error(result.error.message);
  const states = result.value.steady_states ?? [];
  const cold = states.find((s) => s.start === "cold");
  const running = states.find((s) => s.start === "running");
  // The input power of a capacitor-input rectifier: it draws its charge near the crest, so the
  // mean power is the crest voltage times the mean DC current (closed form, to the droop).
  const bracket = (current: (vdc: number) => number) => [
    vpk * current(vpk - diodeHigh) * 0.98,
    vpk * current(vpk - diodeLow) * 1.02,
  ];

  it("reports two steady states: off from cold, latched on while running", () => {
    expect(states.map((s) => s.start)).toEqual(["cold", "running"]);
    expect(cold!.triggers.find((t) => t.part === "Q1")!.fires).toBe(false);
    expect(running!.triggers.find((t) => t.part === "Q1")!.fires).toBe(true);
    expect(result.value.triggers.find((t) => t.part === "Q1")!.running?.fires).toBe(true);
  });

  it("draws the divider's power from cold", () => {
    // Source: closed form, Vdc²/(Ra + Rb) drawn at the crest.
    const [low, high] = bracket((vdc) => vdc / (ra + rb));
    expect(cold!.input.power).toBeGreaterThanOrEqual(low!);
    expect(cold!.input.power).toBeLessThanOrEqual(high!);
  });

  it("draws the load's power as well while running", () => {
    // Source: closed form, load current (Vdc − von)/(RL + ron) plus the divider's.
    const [low, high] = bracket((vdc) => (vdc - von) / (rl + ron) + vdc / (ra + rb));
    expect(running!.input.power).toBeGreaterThanOrEqual(low!);
    expect(running!.input.power).toBeLessThanOrEqual(high!);
  });
});
