/**
 * An analysis says what it did: complete when every part was simulated, partial when something
 * was left out (each named in `gaps`), not-solved when there is no solution (and why), while it
 * still keeps the layout, blocks and checks. The figures are checked against Ohm's law, not
 * against the engine.
 */
import { describe, expect, it } from "vitest";
import {
  AnalysisResultSchema,
  analysisStateLine,
  analyzeRecord,
  ENGINE_VERSION,
  type AnalysisOutcome,
  type AnalysisResult,
} from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";

const now = () => 0;

function resultOf(outcome: AnalysisOutcome): AnalysisResult {
  if (!outcome.ok) throw new Error(`analysis failed: ${outcome.message}`);
  // The stored shape is the schema's: what the worker writes, the web app reads back.
  expect(AnalysisResultSchema.safeParse(outcome.output.result).success).toBe(true);
  return outcome.output.result;
}

// 23 kΩ across 230 V RMS: 10 mA RMS and 2.3 W by Ohm's law (V²/R), power factor 1.
const R_OHMS = 23_000;
const V_RMS = 230;

describe("analysis status", () => {
  it("is complete for a record whose every part is simulated, with Ohm's-law figures", async () => {
    const r = resultOf(
      await analyzeRecord(record([part("R1", "resistor", ["L", "N"], R_OHMS)]), { now }),
    );
    expect(r.engine).toBe(ENGINE_VERSION);
    expect(r.status).toBe("complete");
    expect(r.gaps).toEqual([]);
    if (r.status === "not-solved") throw new Error("unreachable");
    expect(r.input.current_rms).toBeCloseTo(V_RMS / R_OHMS, 5);
    expect(r.input.power).toBeCloseTo((V_RMS * V_RMS) / R_OHMS, 3);
  });

  it("is partial with a load without a resistance and a part of unknown kind, both named", async () => {
    const rec = record([
      part("R1", "resistor", ["L", "N"], R_OHMS),
      part("HT1", "load", ["L", "A"]),
      part("U1", "widget", ["A", "N"]),
    ]);
    const r = resultOf(await analyzeRecord(rec, { now }));
    expect(r.status).toBe("partial");
    const byPart = Object.fromEntries(r.gaps.map((g) => [g.part ?? g.net, g.reason]));
    // Net A between them reaches only those two, so it has no figures either.
    expect(Object.keys(byPart).sort()).toEqual(["A", "HT1", "U1"]);
    expect(byPart.HT1).toMatch(/load without a resistance/);
    expect(byPart.U1).toMatch(/unknown kind/);
    // The left-out branch carries nothing in the model: the line current is R1's alone.
    if (r.status === "not-solved") throw new Error("unreachable");
    expect(r.input.current_rms).toBeCloseTo(V_RMS / R_OHMS, 5);
  });

  it("is not-solved without line and neutral roles, keeping layout, blocks and checks", async () => {
    const rec = record(
      [part("R1", "resistor", ["X", "Y"], 1000), part("C1", "capacitor", ["X", "Y"], 1e-7)],
      {},
    );
    const outcome = await analyzeRecord(rec, { now });
    const r = resultOf(outcome);
    expect(r.status).toBe("not-solved");
    if (r.status !== "not-solved") throw new Error("unreachable");
    expect(r.reason).toMatch(/line or the neutral role/);
    expect(r.solver_code).toBeNull();
    expect("input" in r).toBe(false);
    expect(r.gaps.map((g) => g.part).sort()).toEqual(["C1", "R1"]);
    expect(r.checks.map((c) => c.code)).toContain("no-supply");
    if (!outcome.ok) throw new Error("unreachable");
    const layout = outcome.output.layout as { parts: { ref: string }[] };
    expect(layout.parts.map((p) => p.ref).sort()).toEqual(["C1", "R1"]);
    expect(outcome.output.search.facets.analysis_status).toBe("not-solved");
  });

  it("is not-solved when the solver fails, naming the parts it failed at", async () => {
    // A 0 Ω link straight across the supply is a loop of voltage sources: no solution exists.
    const rec = record([
      part("R1", "resistor", ["L", "N"], 0),
      part("R2", "resistor", ["L", "N"], 1000),
    ]);
    const r = resultOf(await analyzeRecord(rec, { now }));
    expect(r.status).toBe("not-solved");
    if (r.status !== "not-solved") throw new Error("unreachable");
    expect(r.solver_code).toBe("voltage-source-loop");
    expect(r.gaps.some((g) => g.part === "R1")).toBe(true);
    expect(r.flags).toEqual([]);
  });
});

describe("a steady state that was not reached", () => {
  it("makes a solved result partial and says so in the state line", async () => {
    const rec = record([part("R1", "resistor", ["L", "N"], R_OHMS)]);
    const solved = resultOf(await analyzeRecord(rec, { now }));
    if (solved.status === "not-solved") throw new Error("unreachable");
    expect(solved.status).toBe("complete");
    expect(solved.solver.converged).toBe(true);
    // The same result as it would be stored had the cycle search run out of budget.
    const unsettled: AnalysisResult = {
      ...solved,
      status: "partial",
      solver: { ...solved.solver, converged: false },
    };
    expect(AnalysisResultSchema.safeParse(unsettled).success).toBe(true);
    expect(analysisStateLine(unsettled)).toMatch(/^partial: the steady state was not reached/);
  });
});
