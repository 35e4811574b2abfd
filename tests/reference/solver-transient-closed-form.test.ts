/**
 * Time-domain responses against their closed forms: RC and RL natural (step-to-zero) responses
 * from a charged capacitor and a fluxed inductor, and the switch-on responses of a series RC
 * and a series RL circuit to the sinusoidal supply (the textbook switching transients).
 */
import { describe, expect, it } from "vitest";
import type { TeardownRecord } from "@teardown/engine";
import { compileCircuit, TransientSolver } from "@teardown/engine";
import { part, record } from "../support/record-factory.js";

const vpk = 230 * Math.SQRT2;
const w = 2 * Math.PI * 50;

function firstCycle(
  rec: TeardownRecord,
  init: (mem: Float64Array, devices: ReturnType<typeof devicesOf>) => void = () => {},
) {
  const compiled = compileCircuit(rec, { vrms: 230, hz: 50 });
  if (!compiled.ok) throw new Error(compiled.error.message);
  const c = compiled.value;
  const mem = new Float64Array(c.memSize);
  init(mem, devicesOf(c));
  const solver = new TransientSolver(c, { lu: "sparse", maxNewtonIterations: 60 });
  const run = solver.runCycle(mem, new Float64Array(c.size), true, {
    now: null,
    deadlineMs: Infinity,
    stepsLeft: 1e6,
  });
  if (!run.ok) throw new Error(run.error.message);
  return { c, samples: run.run.samples };
}

function devicesOf(c: { devices: Array<{ ref: string; mem: number }> }) {
  return new Map(c.devices.map((d) => [d.ref, d]));
}

describe("closed-form transients", () => {
  it("discharges a capacitor through a resistor as V0·e^(−t/RC)", () => {
    const rc = 1000 * 4.7e-6;
    const rec = record([
      part("R0", "resistor", ["L", "N"], 1000),
      part("C1", "capacitor", ["X", "N"], 4.7e-6),
      part("R1", "resistor", ["X", "N"], 1000),
    ]);
    const { c, samples } = firstCycle(rec, (mem, d) => (mem[d.get("C1")!.mem] = 100));
    const x = c.nodeNames.indexOf("X");
    for (const s of samples) {
      // Source: closed form, first-order RC natural response.
      expect(Math.abs(s.x[x]! - 100 * Math.exp(-s.t / rc))).toBeLessThan(0.05);
    }
  });

  it("lets an inductor's current decay through a resistor as I0·e^(−tR/L)", () => {
    const tau = 0.1 / 50;
    const rec = record([
      part("R0", "resistor", ["L", "N"], 1000),
      part("L1", "inductor", ["X", "N"], 0.1),
      part("R1", "resistor", ["X", "N"], 50),
    ]);
    const { c, samples } = firstCycle(rec, (mem, d) => (mem[d.get("L1")!.mem] = 2));
    const dev = c.devices.find((d) => d.ref === "L1")!;
    const branch = dev.type === "coupled" ? dev.branches[0]! : -1;
    for (const s of samples) {
      // Source: closed form, first-order RL natural response.
      expect(Math.abs(s.x[branch]! - 2 * Math.exp(-s.t / tau))).toBeLessThan(2e-3);
    }
  });

  it("switches a series RC onto the sine supply with the textbook transient term", () => {
    const r = 1000;
    const cap = 2.2e-6;
    const z = Math.hypot(r, 1 / (w * cap));
    const phi = Math.atan(1 / (w * r * cap));
    const rec = record([
      part("R1", "resistor", ["L", "A"], r),
      part("C1", "capacitor", ["A", "N"], cap),
    ]);
    const { c, samples } = firstCycle(rec);
    const a = c.nodeNames.indexOf("A");
    const vc = (t: number) =>
      -(vpk / (z * w * cap)) * Math.cos(w * t + phi) +
      (vpk / (z * w * cap)) * Math.cos(phi) * Math.exp(-t / (r * cap));
    // Source: closed form (steady-state phasor plus the decaying term that makes v_C(0) = 0).
    for (const s of samples) expect(Math.abs(s.x[a]! - vc(s.t))).toBeLessThan(0.3);
  });

  it("switches a series RL onto the sine supply with the textbook DC offset term", () => {
    const r = 100;
    const l = 0.5;
    const z = Math.hypot(r, w * l);
    const theta = Math.atan((w * l) / r);
    const rec = record([
      part("R1", "resistor", ["L", "A"], r),
      part("L1", "inductor", ["A", "N"], l),
    ]);
    const { c, samples } = firstCycle(rec);
    const dev = c.devices.find((d) => d.ref === "L1")!;
    const branch = dev.type === "coupled" ? dev.branches[0]! : -1;
    const i = (t: number) =>
      (vpk / z) * (Math.sin(w * t - theta) + Math.sin(theta) * Math.exp((-t * r) / l));
    // Source: closed form, the classic RL switching transient.
    for (const s of samples) expect(Math.abs(s.x[branch]! - i(s.t))).toBeLessThan(2e-3 * (vpk / z));
  });
});
