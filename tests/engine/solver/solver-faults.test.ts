/**
 * Expected failures come back as values with a code, a message and where: a floating net, a
 * loop of voltage sources, Newton that does not converge, a spent time budget, no supply.
 * Each returns quickly.
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, solveCircuit } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { dropperSupply } from "./reference-circuits.js";

function timed<T>(f: () => T): { value: T; ms: number } {
  const t0 = performance.now();
  const value = f();
  return { value, ms: performance.now() - t0 };
}

describe("solver failures as values", () => {
  it("names the floating nets of a part connected to nothing else", () => {
    const rec = record([
      part("R1", "resistor", ["L", "N"], 1000),
      part("R2", "resistor", ["X", "Y"], 1000),
    ]);
    const { value: r, ms } = timed(() => analyzeCircuit(rec));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.code).toBe("floating-net");
    expect(r.error.where.nets).toEqual(["X", "Y"]);
    expect(ms).toBeLessThan(1000);
  });

  it("names the loop when a zero-ohm link shorts the supply", () => {
    const rec = record([
      part("R1", "resistor", ["L", "N"], 1000),
      part("R0", "resistor", ["L", "N"], 0),
    ]);
    const { value: r, ms } = timed(() => analyzeCircuit(rec));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.code).toBe("voltage-source-loop");
    expect(r.error.where.parts.sort()).toEqual(["R0", "supply"]);
    expect(ms).toBeLessThan(1000);
  });

  it("names both links of two zero-ohm links in parallel", () => {
    const rec = record([
      part("R1", "resistor", ["L", "A"], 1000),
      part("J1", "resistor", ["A", "B"], 0),
      part("J2", "resistor", ["B", "A"], 0),
      part("R2", "resistor", ["B", "N"], 1000),
    ]);
    const r = analyzeCircuit(rec);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.code).toBe("voltage-source-loop");
    expect(r.error.where.parts.sort()).toEqual(["J1", "J2"]);
  });

  it("names the part and the time when Newton-Raphson does not converge", () => {
    const rec = record([
      part("R1", "resistor", ["L", "A"], 1000),
      part("D1", "diode", { anode: "A", cathode: "N" }),
    ]);
    const { value: r, ms } = timed(() => solveCircuit(rec, { maxNewtonIterations: 1 }));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.code).toBe("no-convergence");
    expect(r.error.where.parts).toEqual(["D1"]);
    expect(r.error.where.time_s).not.toBeNull();
    expect(r.error.message).toContain("D1");
    expect(ms).toBeLessThan(1000);
  });

  it("stops with a time-budget error when the passed clock runs past the budget", () => {
    let clock = 0;
    const now = () => (clock += 1);
    const { value: r, ms } = timed(() => analyzeCircuit(dropperSupply(), { now, budgetMs: 50 }));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.code).toBe("time-budget");
    expect(ms).toBeLessThan(1000);
  });

  it("refuses a record with no line net", () => {
    const rec = record([part("R1", "resistor", ["A", "B"], 1000)]);
    const r = analyzeCircuit(rec);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.code).toBe("no-supply");
  });

  it("takes the lowest-named net as the reference when there is no neutral", () => {
    const rec = record([
      part("R1", "resistor", ["L", "B"], 1000),
      part("R2", "resistor", ["B", "A"], 1000),
    ]);
    const r = analyzeCircuit(rec, { minSupply: false });
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.nets.A).toEqual({ dc: 0, rms: 0, peak: 0 });
    // Source: closed form, a 1:1 divider.
    expect(r.value.nets.B!.rms).toBeCloseTo(115, 2);
  });

  it("lists parts it leaves out and the defaults it assumed", () => {
    const rec = record([
      part("R1", "resistor", ["L", "A"], 1000),
      part("D1", "diode", { anode: "A", cathode: "N" }),
      part("J1", "connector", ["L", "N"]),
      part("X1", "spark-gap", ["A", "N"]),
    ]);
    const r = analyzeCircuit(rec, { minSupply: false });
    if (!r.ok) throw new Error(r.error.message);
    // a connector is documentation only: nothing the figures depend on is missing without it
    expect(r.value.gaps.map((g) => g.part).sort()).toEqual(["X1"]);
    expect(r.value.gaps.find((g) => g.part === "X1")!.reason).toMatch(/unknown kind/);
    expect(r.value.assumptions).toContainEqual(
      expect.objectContaining({ part: "D1", field: "model.is", value: 5e-9 }),
    );
  });

  it("names a load without a resistance and a part of an unknown kind as gaps", () => {
    const rec = record([
      part("R1", "resistor", ["L", "A"], 1000),
      part("HT1", "load", ["A", "N"]),
      part("U1", "mystery-module", ["A", "N"]),
      part("R2", "resistor", ["A", "N"], 2000),
    ]);
    const r = analyzeCircuit(rec, { minSupply: false });
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.gaps).toEqual([
      { part: "HT1", reason: "load without a resistance or capacitance (model.r or model.c)" },
      { part: "U1", reason: 'unknown kind "mystery-module"' },
    ]);
    // What is left is a plain divider: 230·2000/3000 V at A.
    expect(r.value.nets.A!.rms).toBeCloseTo((230 * 2) / 3, 1);
  });

  it("names a net that touches no simulated part as a gap", () => {
    const rec = record([
      part("R1", "resistor", ["L", "N"], 1000),
      part("J2", "connector", ["L", "AUX"]),
    ]);
    const r = analyzeCircuit(rec, { minSupply: false });
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.gaps).toContainEqual({
      net: "AUX",
      reason: "no simulated part reaches it, so it has no figures",
    });
  });

  it("lists every default of a zener, an LED and a triac, and none the record gives", () => {
    const rec = record([
      part("R1", "resistor", ["L", "A"], 47_000),
      part("Z1", "zener", { anode: "N", cathode: "A" }, 12, { model: { rz: 10 } }),
      part("LED1", "led", { anode: "A", cathode: "N" }),
      part("R2", "resistor", ["L", "B"], 500),
      part("Q1", "triac", { mt1: "N", mt2: "B", gate: "G" }, null, { model: { ron: 0.05 } }),
      part("R3", "resistor", ["G", "N"], 1000),
    ]);
    const r = analyzeCircuit(rec, { minSupply: false });
    if (!r.ok) throw new Error(r.error.message);
    const fields = (ref: string) =>
      r.value.assumptions
        .filter((a) => a.part === ref)
        .map((a) => a.field)
        .sort();
    expect(fields("Z1")).toEqual(["model.is", "model.iz_test"]);
    expect(r.value.assumptions).toContainEqual(
      expect.objectContaining({ part: "Z1", field: "model.iz_test", value: 5e-3 }),
    );
    expect(fields("LED1")).toEqual(["model.if", "model.n", "model.rs", "model.vf"]);
    expect(r.value.assumptions).toContainEqual(
      expect.objectContaining({ part: "LED1", field: "model.rs", value: 5 }),
    );
    expect(fields("Q1")).toEqual(["model.igt", "model.ih", "model.vgt", "model.von"]);
    expect(fields("R1")).toEqual([]);
    // Reasons are plain words: no internal file names, no confidence marks.
    for (const a of r.value.assumptions) {
      expect(a.why).not.toMatch(/\.md|FOUND|MEMORY|DERIVED/);
      expect(a.why.length).toBeGreaterThan(10);
    }
  });
});
