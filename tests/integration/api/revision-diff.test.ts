// The ref-keyed revision diff (web/lib/revision-diff.ts), pure: records in, changes out.
import { describe, expect, it } from "vitest";
import { parseRecord, type TeardownRecord } from "@teardown/engine";
import { diffRevisions } from "@/lib/revision-diff";
import { nightLightDoc } from "../../support/record-docs.js";

function rec(doc: Record<string, unknown>): TeardownRecord {
  const read = parseRecord(JSON.stringify(doc), { filename: "r.json" });
  if (!read.ok) throw new Error(JSON.stringify(read.errors));
  return read.record;
}

describe("the revision diff", () => {
  it("finds nothing between a record and itself", () => {
    const d = diffRevisions(rec(nightLightDoc(2)), rec(nightLightDoc(2)));
    expect(d.same).toBe(true);
    expect(d.parts).toEqual({ added: [], removed: [], changed: [] });
  });

  it("does not count the same value written another way as a change", () => {
    const a = nightLightDoc(0);
    const b = structuredClone(a) as { parts: Record<string, unknown>[] };
    b.parts[0] = { ...b.parts[0], value: "0.22u" }; // 220n written in microfarads
    expect(diffRevisions(rec(a), rec(b as Record<string, unknown>)).same).toBe(true);
  });

  it("reports a rating, a marking and a net role that changed", () => {
    const a = nightLightDoc(0);
    const b = structuredClone(a) as {
      parts: Record<string, unknown>[];
      nets: Record<string, unknown>;
    };
    b.parts[0] = { ...b.parts[0], rating: { volts: 275, class: "X2" }, marking: "224K" };
    b.nets = { ...b.nets, M: { accessible: true } };
    const d = diffRevisions(rec(a), rec(b as unknown as Record<string, unknown>));
    expect(d.parts.changed).toEqual([
      {
        ref: "C1",
        kind: "capacitor",
        changes: [
          { field: "rating", from: { class: "X2", volts: 310 }, to: { class: "X2", volts: 275 } },
          { field: "marking", from: null, to: "224K" },
        ],
        pins: [],
      },
    ]);
    expect(d.nets.changed).toEqual([
      { net: "M", changes: [{ field: "accessible", from: false, to: true }] },
    ]);
  });

  it("reports measurements added, removed and changed, keyed by what and where", () => {
    const a = {
      ...nightLightDoc(0),
      measurements: [
        { what: "input.current_rms", value: 0.016 },
        { what: "voltage.dc", between: ["P", "M"], value: 3.1 },
      ],
    };
    const b = {
      ...nightLightDoc(0),
      measurements: [
        { what: "input.current_rms", value: 0.018 },
        { what: "input.power", value: 0.2 },
      ],
    };
    const d = diffRevisions(rec(a), rec(b));
    expect(d.measurements.changed).toEqual([
      {
        key: "input.current_rms@input@230V/50Hz",
        what: "input.current_rms",
        changes: [{ field: "value", from: 0.016, to: 0.018 }],
      },
    ]);
    expect(d.measurements.added.map((m) => m.what)).toEqual(["input.power"]);
    expect(d.measurements.removed.map((m) => m.key)).toEqual(["voltage.dc@P-M@230V/50Hz"]);
    expect(d.same).toBe(false);
  });
});
