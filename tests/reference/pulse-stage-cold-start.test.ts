/**
 * A capacitor-dump pulse stage (reference-circuits.ts, pulseStage) starts firing from cold when
 * the capacitor, charged from rest through the half-wave rectifier and R1 and drained by the
 * gate divider, reaches the gate threshold k·V = vgt + igt·(R2‖R3) (closed form of the divider).
 * The capacitor's charge is found by brute force: a plain fixed-step integration written here
 * (forward Euler at 2000 steps per mains cycle, for 150 cycles from rest, the diode taken as a
 * fixed drop), and the lowest supply whose charge reaches the threshold by bisection. The diode
 * drop is bracketed between 0.4 V and 0.9 V (a silicon junction at a milliamp; common practice),
 * and the engine brackets its answer to 0.5 V from above.
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit } from "@teardown/engine";
import { pulseStage } from "../engine/solver/reference-circuits.js";

const r1 = 47_000;
const c1 = 470e-9;
const r2 = 1e6;
const r3 = 10_000;
const vgt = 0.7;
const igt = 50e-6;
const hz = 50;
const threshold = (vgt + igt * ((r2 * r3) / (r2 + r3))) * ((r2 + r3) / r3);

/** Highest capacitor voltage over the last cycle of a cold start at `vrms` (brute force). */
function settledPeak(vrms: number, diodeDrop: number): number {
  const stepsPerCycle = 2000;
  const dt = 1 / hz / stepsPerCycle;
  let v = 0;
  let peak = 0;
  for (let cycle = 0; cycle < 150; cycle++) {
    peak = 0;
    for (let k = 0; k < stepsPerCycle; k++) {
      const vin = vrms * Math.SQRT2 * Math.sin((2 * Math.PI * k) / stepsPerCycle);
      const charge = Math.max(0, vin - diodeDrop - v) / r1;
      v += ((charge - v / (r2 + r3)) / c1) * dt;
      peak = Math.max(peak, v);
    }
  }
  return peak;
}

/** Lowest supply whose cold start charges the capacitor to the threshold (bisection). */
function lowestColdSupply(diodeDrop: number): number {
  let lo = 0;
  let hi = 230;
  while (hi - lo > 0.05) {
    const mid = 0.5 * (lo + hi);
    if (settledPeak(mid, diodeDrop) >= threshold) hi = mid;
    else lo = mid;
  }
  return hi;
}

describe("a capacitor-dump pulse stage", () => {
  const result = analyzeCircuit(pulseStage());
  if (!result.ok) throw new Error(result.error.message);
  const q1 = result.value.triggers.find((t) => t.part === "Q1")!;

  it("fires at the rated supply", () => {
    expect(q1.fires).toBe(true);
  });

  it("starts from cold at the supply a brute-force integration of its charge gives", () => {
    // Source: brute force (fixed-step integration above) with the divider's closed form.
    const low = lowestColdSupply(0.4);
    const high = lowestColdSupply(0.9) + 0.5;
    expect(q1.min_supply_cold_vrms).toBeGreaterThanOrEqual(low);
    expect(q1.min_supply_cold_vrms).toBeLessThanOrEqual(high);
  });
});
