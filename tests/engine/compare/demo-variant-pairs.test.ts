// The demo's batch variants compared: the pairing follows what the scenario says changed
// (scenario-expectations.ts, written by hand from the gadgets' stories), exactly the parts whose
// values changed are marked as differing, and the added or removed part stands alone.
import { describe, expect, it } from "vitest";
import { compareBoards } from "@teardown/engine";
import { VARIANT_PAIRS } from "@teardown/seed-demo/scenario-expectations";
import { demoRecord } from "./demo-record.js";

/** Fields that are values (not the printed marking, not a connection). */
const isValueField = (field: string): boolean =>
  field === "value" || field === "tolerance" || /^(model|rating)\./.test(field);

describe.each(VARIANT_PAIRS)("comparing $a with $b", (pair) => {
  const a = demoRecord(pair.a);
  const b = demoRecord(pair.b);
  const result = compareBoards({ record: a, result: null }, { record: b, result: null });

  it("pairs every part the scenario keeps with its counterpart, renamed or not", () => {
    const expected = a.parts
      .map((p) => p.ref)
      .filter((ref) => !pair.removed.includes(ref))
      .map((ref) => [ref, pair.renamed[ref] ?? ref])
      .sort(([x], [y]) => (x! < y! ? -1 : 1));
    expect(result.parts.pairs.map((p) => [p.a, p.b])).toEqual(expected);
  });

  it("lists the added and the removed parts alone", () => {
    expect(result.parts.onlyA).toEqual([...pair.removed].sort());
    expect(result.parts.onlyB).toEqual([...pair.added].sort());
  });

  it("marks exactly the parts whose values the scenario changed as differing", () => {
    const changed = [
      ...new Set(pair.changed.filter((c) => isValueField(c.field)).map((c) => c.ref)),
    ];
    expect(
      result.parts.pairs
        .filter((p) => p.differs)
        .map((p) => p.b)
        .sort(),
    ).toEqual(changed.sort());
  });

  it("is fully confident in every pair whose connections did not change", () => {
    const moved = new Set(
      pair.changed.filter((c) => c.field.startsWith("pins.")).map((c) => c.ref),
    );
    for (const p of result.parts.pairs) {
      if (moved.has(p.b)) continue;
      expect(p.confidence, `${p.a} ↔ ${p.b}`).toBe(1);
    }
  });
});

describe("the night light's second batch", () => {
  const result = compareBoards(
    { record: demoRecord("glowmoth-night-light"), result: null },
    { record: demoRecord("glowmoth-night-light-batch2"), result: null },
  );

  it("is less sure of the LED whose cathode moved: one pin of two on a matching net", () => {
    // By hand: base 1 for a structure pair, times 1 − 0.5 + 0.5 × (1 of 2 pins) = 0.75.
    expect(result.parts.pairs.find((p) => p.b === "LED2")?.confidence).toBe(0.75);
  });

  it("names the nets whose connections changed: the bridged LED pad and the string's bottom", () => {
    expect(result.nets).toEqual([
      { a: "K2", b: null, onlyA: ["LED2.cathode", "LED3.anode"], onlyB: [], changes: [] },
      { a: "M", b: "M", onlyA: ["LED3.cathode"], onlyB: ["LED2.cathode"], changes: [] },
    ]);
  });

  it("shows the changed values side by side", () => {
    const c1 = result.parts.pairs.find((p) => p.a === "C1")!;
    expect(c1.values.a).toMatch(/^330nF/);
    expect(c1.values.b).toMatch(/^220nF/);
    expect(c1.marking).toEqual({ a: "334K 310V~ X2", b: "224K 310V~ X2" });
  });
});
