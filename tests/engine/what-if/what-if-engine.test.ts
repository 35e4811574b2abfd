// The what-if's pieces on their own: the request checked against the record (paths, units,
// kinds), the gate-feed resistor found in dividers, RC networks and chains, and harmonics kept
// in the stored result while results without them still read.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  analyzeCircuit,
  checkWhatIf,
  gateFeedResistor,
  parseStoredResult,
  readCircuitFile,
  type TeardownRecord,
} from "@teardown/engine";
import { RECORDS_DIR } from "@teardown/seed-demo";
import { part, record } from "../../support/record-factory.js";
import { dropperIntoResistor, phaseControlled, triacDimmer } from "../solver/reference-circuits.js";

function demo(name: string): TeardownRecord {
  const file = `${RECORDS_DIR}/${name}.yaml`;
  const read = readCircuitFile(readFileSync(file, "utf8"), { filename: file });
  if (!read.ok) throw new Error(`${file} does not read`);
  return read.record;
}

describe("checking a what-if against the record", () => {
  const rec = triacDimmer();

  it("reads values in record notation or SI and writes the new value into the variant", () => {
    const c = checkWhatIf(rec, {
      changes: [
        { part: "RA", value: "22k" },
        { part: "RB", value: 470 },
      ],
    });
    if (!c.ok) throw new Error(JSON.stringify(c.errors));
    expect(c.value.changes).toEqual([
      { part: "RA", value: 22_000 },
      { part: "RB", value: 470 },
    ]);
    const ra = c.value.record.parts.find((p) => p.ref === "RA")!;
    expect(ra.value).toBe(22_000);
    expect(ra.value_text).toBe("22k");
    expect(rec.parts.find((p) => p.ref === "RA")!.value).toBe(47_000); // the original is untouched
    expect(c.value.supply).toEqual(rec.device.rated_supply);
  });

  it("names every problem by its place in the request", () => {
    const c = checkWhatIf(rec, {
      supply: { vrms: 120, hz: 5000 },
      changes: [
        { part: "R99", value: "1k" },
        { part: "Q1", value: "1k" },
        { part: "RA", value: "1uF" },
        { part: "RB", value: 0 },
        { part: "RL", value: "1k" },
        { part: "RL", value: "2k" },
      ],
    });
    if (c.ok) throw new Error("accepted");
    expect(c.errors.map((e) => [e.path, e.code])).toEqual([
      ["supply.hz", "out-of-range"],
      ["changes[0].part", "unknown-part"],
      ["changes[1].part", "no-value"],
      ["changes[2].value", "wrong-unit"],
      ["changes[3].value", "not-positive"],
      ["changes[5].part", "duplicate"],
    ]);
  });
});

describe("the resistor feeding a gate from the supply side", () => {
  it("is a divider's upper arm, for a thyristor and for a triac", () => {
    expect(gateFeedResistor(phaseControlled(100_000), "Q1")).toBe("RA");
    expect(gateFeedResistor(triacDimmer(), "Q1")).toBe("RA");
  });

  it("is the series resistor of an RC network, followed up a chain to its supply end", () => {
    expect(gateFeedResistor(demo("dimmbo-lamp-dimmer"), "Q1")).toBe("VR1");
    // VR1 (pot) – VR2 (trimmer) – R1 to the capacitor node: the pot meets the supply side.
    expect(gateFeedResistor(demo("whirlby-fan-speed-control"), "Q1")).toBe("VR1");
    expect(gateFeedResistor(demo("breezel-desk-ionizer"), "Q1")).toBe("R2");
  });

  it("is nothing for a lone gate resistor, or for a part that is not a thyristor or triac", () => {
    const lone = record([
      part("RL", "resistor", ["L", "A"], 100),
      part("Q1", "triac", { mt1: "N", mt2: "A", gate: "G" }),
      part("RG", "resistor", ["A", "G"], 1000),
    ]);
    expect(gateFeedResistor(lone, "Q1")).toBeNull();
    expect(gateFeedResistor(lone, "RL")).toBeNull();
  });
});

describe("harmonics in the stored result", () => {
  it("are kept with the analysis, order 1 up, and read back", () => {
    const a = analyzeCircuit(dropperIntoResistor(), { minSupply: false });
    if (!a.ok) throw new Error(a.error.message);
    const h = a.value.input.harmonics;
    expect(h.map((x) => x.order).slice(0, 3)).toEqual([1, 2, 3]);
    expect(h).toHaveLength(40);
    // A linear circuit draws a sine: the fundamental is the whole RMS current.
    expect(h[0]!.rms / a.value.input.current_rms).toBeCloseTo(1, 3);
  });

  it("may be absent from an older result, which still reads", () => {
    const a = analyzeCircuit(dropperIntoResistor(), { minSupply: false });
    if (!a.ok) throw new Error(a.error.message);
    const base = {
      ...a.value,
      status: "complete",
      flags: [],
      blocks: [],
      checks: [],
      series: {},
      comparisons: [],
      risk_notes: [],
    };
    const withH = parseStoredResult(JSON.parse(JSON.stringify(base)));
    expect(
      withH.ok && withH.result.status !== "not-solved" && withH.result.input.harmonics?.length,
    ).toBe(40);
    const { harmonics: _dropped, ...olderInput } = base.input;
    void _dropped;
    const older = parseStoredResult(JSON.parse(JSON.stringify({ ...base, input: olderInput })));
    expect(older.ok).toBe(true);
  });
});
