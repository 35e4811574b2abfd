// The scenario's batch variants differ exactly as scenario-expectations.ts says: the records are
// compared part by part with an independent differ (plain YAML, no engine), so a record edit that
// changes a pair without updating the scenario fails here.
import { describe, expect, it } from "vitest";
import { DEMO_ENTRIES, RECORDS_DIR } from "@teardown/seed-demo";
import { VARIANT_PAIRS } from "@teardown/seed-demo/scenario-expectations";
import { diffParts, rawParts } from "./part-differ.js";

const currentFile = (slug: string): string => {
  const e = DEMO_ENTRIES.find((x) => x.slug === slug);
  if (!e) throw new Error(`no demo entry ${slug}`);
  return e.revisions[e.revisions.length - 1]!.file;
};
const byRefField = (a: { ref: string; field: string }, b: { ref: string; field: string }) =>
  `${a.ref} ${a.field}`.localeCompare(`${b.ref} ${b.field}`);

describe("the demo's variant pairs", () => {
  it("has at least two pairs, each of two different demo entries", () => {
    expect(VARIANT_PAIRS.length).toBeGreaterThanOrEqual(2);
    for (const p of VARIANT_PAIRS) expect(currentFile(p.a)).not.toBe(currentFile(p.b));
  });

  for (const pair of VARIANT_PAIRS)
    it(`${pair.a} and ${pair.b} differ exactly by the scenario's changes`, () => {
      const a = rawParts(RECORDS_DIR, currentFile(pair.a));
      const b = rawParts(RECORDS_DIR, currentFile(pair.b));
      // Renamed designators exist on their own board only.
      for (const [from, to] of Object.entries(pair.renamed)) {
        expect(a.map((p) => p.ref)).toContain(from);
        expect(b.map((p) => p.ref)).toContain(to);
        expect(b.map((p) => p.ref)).not.toContain(from);
      }
      const diff = diffParts(a, b, pair.renamed);
      expect(diff.added.sort()).toEqual([...pair.added].sort());
      expect(diff.removed.sort()).toEqual([...pair.removed].sort());
      expect(diff.changed.sort(byRefField)).toEqual([...pair.changed].sort(byRefField));
      // Every other part is identical field for field, so the pair is a pair.
      const untouched = b.length - diff.added.length - new Set(diff.changed.map((c) => c.ref)).size;
      expect(untouched).toBeGreaterThan(b.length / 2);
    });

  it("the differ itself sees a changed value, a new part and a rename", () => {
    const a = [
      { ref: "R1", kind: "resistor", value: "1k", pins: ["A", "B"] },
      { ref: "C9", kind: "capacitor", value: "1u", pins: ["B", "N"] },
    ];
    const b = [
      { ref: "R1", kind: "resistor", value: "2k2", pins: ["A", "B"] },
      { ref: "C1", kind: "capacitor", value: "1u", pins: ["B", "N"] },
      { ref: "D1", kind: "diode", pins: { anode: "B", cathode: "P" } },
    ];
    expect(diffParts(a, b, { C9: "C1" })).toEqual({
      added: ["D1"],
      removed: [],
      changed: [{ ref: "R1", field: "value", from: "1k", to: "2k2" }],
    });
    expect(diffParts(a, b, {}).removed).toEqual(["C9"]);
  });
});
