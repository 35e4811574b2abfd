// A what-if that changes a load's value must change the load: a load keeps its resistance in its
// model, not in `value`, and setting `value` there used to change nothing. Checked against the
// closed form of a resistor across a sine supply, P = V_rms² / R (Ohm's and Joule's laws).
import { describe, expect, it } from "vitest";
import { analyzeWhatIf, checkWhatIf } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";

const heater = () => record([part("HT1", "load", ["L", "N"], null, { model: { r: 529 } })]);

describe("a what-if that changes a load", () => {
  it("writes the new resistance into the load's model", () => {
    const c = checkWhatIf(heater(), { changes: [{ part: "HT1", value: "1.058k" }] });
    if (!c.ok) throw new Error(JSON.stringify(c.errors));
    const ht1 = c.value.record.parts.find((p) => p.ref === "HT1")!;
    expect(ht1.kind === "load" && ht1.model.r).toBe(1058);
  });

  it("halves a resistive load's power when its resistance doubles (P = V² / R)", async () => {
    const out = await analyzeWhatIf(heater(), { changes: [{ part: "HT1", value: "1058" }] });
    if (!out.ok) throw new Error(JSON.stringify(out));
    if (out.result.status === "not-solved") throw new Error(out.result.reason);
    const expected = (230 * 230) / 1058; // 50.0 W
    expect(out.result.input.power).toBeCloseTo(expected, 0);
    expect(Math.abs((out.result.input.power as number) / expected - 1)).toBeLessThan(0.01);
  });

  it("refuses a load with no resistance or capacitance to change, naming the part's place", () => {
    const rec = record([part("M1", "load", ["L", "N"], null, { model: {} })]);
    const c = checkWhatIf(rec, { changes: [{ part: "M1", value: "1k" }] });
    expect(c.ok ? [] : c.errors.map((e) => [e.path, e.code])).toEqual([
      ["changes[0].part", "no-value"],
    ]);
  });
});
