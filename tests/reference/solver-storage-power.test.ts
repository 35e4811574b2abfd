/**
 * Energy-storing parts take no mean power in a periodic steady state, on the demo records as
 * read from their files: over a window that truly repeats, a capacitor ends with the charge
 * (and an inductor with the current) it started with, so its stored energy is unchanged. The
 * ionizer's trigger fires every few mains cycles (a subharmonic orbit), which is where a
 * one-cycle window used to leave its capacitor with a large negative "dissipation".
 */
import { readFileSync, readdirSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { analyzeCircuit, readCircuitFile, solveCircuit } from "@teardown/engine";

const DEMO_DIR = new URL("../../seed-demo/records/", import.meta.url);
/** The larger of these two bounds applies: 1 mW, or 1 % of the input power. */
const STORAGE_POWER_FLOOR_W = 1e-3;
const STORAGE_POWER_FRACTION = 0.01;

function demo(file: string) {
  const parsed = readCircuitFile(readFileSync(new URL(file, DEMO_DIR), "utf8"), { filename: file });
  if (!parsed.ok) throw new Error(`${file}: ${parsed.errors[0]?.message}`);
  return parsed.record;
}

const files = readdirSync(DEMO_DIR)
  .filter((f) => f.endsWith(".yaml"))
  .sort();

describe("mean power of energy-storing parts on the demo records", () => {
  it("reads the ionizer among the demo records", () => {
    expect(files).toContain("breezel-desk-ionizer.yaml");
  });

  for (const file of files) {
    it(`leaves every capacitor and inductor of ${file} within 1 mW or 1 % of the input power`, () => {
      const rec = demo(file);
      const r = analyzeCircuit(rec, { minSupply: false });
      if (!r.ok) throw new Error(r.error.message);
      const bound = Math.max(
        STORAGE_POWER_FLOOR_W,
        STORAGE_POWER_FRACTION * Math.abs(r.value.input.power),
      );
      // Inductors with a winding resistance dissipate in it; only ideal storage is checked.
      const storage = rec.parts.filter(
        (p) => p.kind === "capacitor" || (p.kind === "inductor" && !(p.model.r! > 0)),
      );
      expect(storage.length).toBeGreaterThan(0);
      for (const p of storage) {
        // Source: closed form (conservation of energy): over a window that repeats, the mean of
        // v·i of a capacitor is C/2·(v_end² − v_start²)/T = 0.
        expect(Math.abs(r.value.parts[p.ref]!.power), `${p.ref}`).toBeLessThan(bound);
      }
    });
  }

  it("records a window of the ionizer that repeats (its end state is its start state)", () => {
    const r = solveCircuit(demo("breezel-desk-ionizer.yaml"));
    if (!r.ok) throw new Error(r.error.message);
    const c1 = r.value.circuit.devices.find((d) => d.ref === "C1")!;
    const start = r.value.steady.startMem[c1.mem]!;
    const end = r.value.steady.run.endMem[c1.mem]!;
    // Source: the definition of a periodic state; 1 mV against a capacitor swinging over 100 V.
    expect(Math.abs(end - start)).toBeLessThan(1e-3);
    expect(r.value.steady.residual).toBeLessThanOrEqual(1);
    // Source: closed form, the window is a whole number of mains cycles.
    const span = r.value.steady.run.samples[r.value.steady.run.samples.length - 1]!.t;
    expect(span * 50).toBeCloseTo(r.value.steady.periodCycles, 6);
  });
});
