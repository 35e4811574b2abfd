/**
 * Budget fairness inside one analysis: the nominal part (steady state, figures) is solved first
 * under its own budget, and variants that run out of theirs (the lowest firing supply, the
 * measurement bands) leave the result partial, with a gap naming what was cut short and why,
 * instead of failing the analysis or showing a cut-short band as complete.
 */
import { describe, expect, it } from "vitest";
import { AnalysisResultSchema, analyzeRecord, type TeardownRecord } from "@teardown/engine";
import { phaseControlled } from "../solver/reference-circuits.js";

/** The phase controller with one measurement, so the bands run. */
function measured(): TeardownRecord {
  const rec = phaseControlled(47_000);
  return {
    ...rec,
    measurements: [
      {
        what: "input.current_rms",
        value: 0.01,
        between: null,
        part: null,
        supply: rec.device.rated_supply,
        instrument: null,
        uncertainty: { relative: 0.05 },
      },
    ],
  };
}

/** A clock that moves one millisecond per reading, so a zero budget is spent at once. */
function tickingClock(): () => number {
  let t = 0;
  return () => ++t;
}

describe("the variants' budget", () => {
  it("leaves the result partial, with the reasons, when the variants have no time", async () => {
    const out = await analyzeRecord(measured(), {
      now: tickingClock(),
      budgetMs: 1e12,
      variantBudgetMs: 0,
    });
    if (!out.ok) throw new Error(out.message);
    const r = out.output.result;
    expect(AnalysisResultSchema.safeParse(r).success).toBe(true);
    if (r.status === "not-solved") throw new Error("the nominal part should be solved");
    expect(r.status).toBe("partial");
    // The nominal part is kept: the thyristor fires and the line current is there.
    expect(r.triggers[0]).toMatchObject({ part: "Q1", fires: true, min_supply_vrms: null });
    expect(r.input.current_rms).toBeGreaterThan(0);
    expect(r.gaps).toContainEqual({
      part: "Q1",
      reason: expect.stringMatching(/^lowest firing supply not computed: .*time-budget/),
    });
    expect(r.gaps.some((g) => /rests on 0 of 40 tolerance samples/.test(g.reason))).toBe(true);
  });

  it("computes every variant and stays complete when the budget suffices", async () => {
    const out = await analyzeRecord(measured(), { now: () => 0 });
    if (!out.ok) throw new Error(out.message);
    const r = out.output.result;
    if (r.status === "not-solved") throw new Error("the nominal part should be solved");
    expect(r.status).toBe("complete");
    expect(r.gaps).toEqual([]);
    expect(r.triggers[0]!.min_supply_vrms).not.toBeNull();
  });
});
