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
    expect(r.value.solver.notes.some((n) => n.startsWith("J1"))).toBe(true);
    expect(r.value.solver.notes.some((n) => n.startsWith("X1"))).toBe(true);
    expect(r.value.solver.assumptions.some((a) => a.startsWith("D1: is"))).toBe(true);
  });
});
