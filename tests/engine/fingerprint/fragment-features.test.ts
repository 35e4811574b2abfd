// Fragment features must survive subgraph embedding (else the containment lookup would miss
// entries holding a fragment): any subset of a circuit's parts, kept with their nets, has
// features contained in the circuit's. Checked by brute force over the hand-made test circuits,
// with random part subsets, renamed refs and nets, and roles dropped.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { fnv1a32, fragmentFeatures, type TeardownRecord } from "@teardown/engine";
import { ALL_TEST_CIRCUITS } from "../../support/circuits/all-test-circuits.js";
import { part, record } from "../../support/record-factory.js";

function subCircuit(rec: TeardownRecord, keep: boolean[]): TeardownRecord {
  const parts = rec.parts
    .filter((_, i) => keep[i % keep.length])
    .map((p) => ({
      ...structuredClone(p),
      ref: `F_${p.ref}`,
      pins: Object.fromEntries(Object.entries(p.pins).map(([r, n]) => [r, `net_${n}`])),
    }));
  // Net roles left out, as a pasted fragment may.
  return record(parts, {});
}

describe("fragment features", () => {
  it("of any part subset are contained in the whole circuit's (property)", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...ALL_TEST_CIRCUITS),
        fc.array(fc.boolean(), { minLength: 1, maxLength: 12 }),
        (circuit, keep) => {
          const fragment = subCircuit(circuit.record, keep);
          fc.pre(fragment.parts.length > 0);
          const whole = new Set(fragmentFeatures(circuit.record));
          for (const f of fragmentFeatures(fragment)) expect(whole.has(f)).toBe(true);
        },
      ),
      { seed: 1202, numRuns: 300 },
    );
  });

  it("count parts per kind and link pins that share a net, by the rule written out here", () => {
    const rec = record([
      part("R1", "resistor", ["A", "B"], 100),
      part("R2", "resistor", ["B", "C"], 100),
      part("D1", "diode", { anode: "C", cathode: "A" }),
    ]);
    // Expected features, hashed the way the file comment states them.
    const expected = new Set([
      fnv1a32("count:resistor#1"),
      fnv1a32("count:resistor#2"),
      fnv1a32("count:diode#1"),
      fnv1a32("link:resistor.end|resistor.end"), // net B
      fnv1a32("link:diode.anode|resistor.end"), // net C
      fnv1a32("link:diode.cathode|resistor.end"), // net A
    ]);
    expect(new Set(fragmentFeatures(rec))).toEqual(expected);
  });
});
