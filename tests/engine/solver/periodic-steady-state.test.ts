/**
 * Periodic steady state: shooting reaches the same cycle as plain cycling, in fewer cycles,
 * and settles a storage capacitor whose time constant spans many cycles.
 */
import { describe, expect, it } from "vitest";
import type { TeardownRecord } from "@teardown/engine";
import {
  compileCircuit,
  periodicSteadyState,
  solveCircuit,
  TransientSolver,
} from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { bridge, dropperSupply } from "./reference-circuits.js";

function steady(rec: TeardownRecord, shooting: boolean) {
  const c = compileCircuit(rec, { vrms: 230, hz: 50 });
  if (!c.ok) throw new Error(c.error.message);
  const solver = new TransientSolver(c.value, { lu: "sparse", maxNewtonIterations: 60 });
  const r = periodicSteadyState(
    solver,
    { now: null, deadlineMs: Infinity, stepsLeft: 5e6 },
    undefined,
    { shooting, maxCycles: 2000 },
  );
  if (!r.ok) throw new Error(r.error.message);
  const cap = c.value.devices.find((d) => d.ref === "C2")!;
  return { ...r.value, vCap: r.value.startMem[cap.mem]! };
}

describe("periodic steady state", () => {
  it("finds the same storage-capacitor voltage by shooting as by plain cycling, in fewer cycles", () => {
    const plain = steady(dropperSupply(), false);
    const shot = steady(dropperSupply(), true);
    expect(plain.method).toBe("cycles");
    expect(shot.method).toBe("shooting");
    expect(shot.cycles).toBeLessThan(plain.cycles);
    // Source: closed form. A capacitive dropper into a bridge moves the charge C·2(Vpk − Vo')
    // every half-cycle (Vo' the output plus two diode drops), so it feeds 4fC(Vpk − Vo') on
    // average; what the 1 kΩ load does not take flows in the zener, whose model holds
    // Vz + n·VT·ln(Iz/Izt) + rz·Iz at that current (Vz 12 V, Izt 5 mA, rz 5 Ω, VT 25.865 mV).
    let v = 12;
    for (let k = 0; k < 20; k++) {
      const feed = 4 * 50 * 330e-9 * (230 * Math.SQRT2 - (v + 2 * 0.75));
      const iz = feed - v / 1000;
      v = 12 + 0.025865 * Math.log(iz / 5e-3) + 5 * iz;
    }
    // Both methods land on it; the ripple and R2 move the mean by a few tens of millivolts.
    expect(Math.abs(plain.vCap / v - 1)).toBeLessThan(5e-3);
    expect(Math.abs(shot.vCap / v - 1)).toBeLessThan(5e-3);
  });

  it("settles 470 µF behind a 330 nF dropper (a time constant of seconds) by shooting", () => {
    const rec = record([
      part("C1", "capacitor", ["L", "A"], 330e-9),
      part("R2", "resistor", ["A", "B"], 100),
      ...bridge("B", "N", "P", "M"),
      part("C2", "capacitor", ["P", "M"], 470e-6),
      part("RL", "resistor", ["P", "M"], 10_000),
    ]);
    const r = solveCircuit(rec);
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.steady.method).toBe("shooting");
    expect(r.value.steady.cycles).toBeLessThan(60);
    expect(r.value.steady.residual).toBeLessThanOrEqual(1);
    // Source: closed form, DC balance: the mean rectified dropper current flows in RL, and the
    // dropper is close to a current source: I_avg ≈ (2/π)·Vpk·ωC (capacitor reactance dominates
    // until the output approaches the peak), so V ≈ RL·I_avg, less what the rising output takes.
    const vDc = r.value.figures.nets.P!.dc - r.value.figures.nets.M!.dc;
    const iAvgUpper = (2 / Math.PI) * 230 * Math.SQRT2 * 2 * Math.PI * 50 * 330e-9;
    expect(vDc).toBeLessThan(iAvgUpper * 10_000);
    expect(vDc).toBeGreaterThan(0.5 * iAvgUpper * 10_000);
  });
});
