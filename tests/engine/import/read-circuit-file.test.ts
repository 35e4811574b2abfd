import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { circuitFileFormatOf, readCircuitFile } from "@teardown/engine";

const example = readFileSync(
  new URL("../record/fixtures/fragrance-warmer.yaml", import.meta.url),
  "utf8",
);
const deck = "Night light\n.line L\nR1 L A 1meg\nC1 A N 100n\n.end\n";
const csv = "ref,kind,value,pins\nR1,resistor,1M,L A\nC1,capacitor,100n,A N\n";

describe("circuitFileFormatOf", () => {
  it("picks the reader by extension", () => {
    expect(
      ["a.yaml", "a.yml", "a.json", "a.cir", "a.net", "a.deck", "a.sp", "a.csv", "A.CSV"].map((f) =>
        circuitFileFormatOf("", f),
      ),
    ).toEqual(["record", "record", "record", "deck", "deck", "deck", "deck", "csv", "csv"]);
  });

  it("sniffs the content when the extension says nothing", () => {
    expect(circuitFileFormatOf(example)).toBe("record");
    expect(circuitFileFormatOf('{"record": 1}')).toBe("record");
    expect(circuitFileFormatOf(deck, "upload.txt")).toBe("deck");
    expect(circuitFileFormatOf("Night light\nR1 L A 1k\nC1 A N 1u\n")).toBe("deck");
    expect(circuitFileFormatOf(csv)).toBe("csv");
    expect(circuitFileFormatOf(`# title: x\n${csv}`)).toBe("csv");
  });
});

describe("readCircuitFile", () => {
  it("reads a record, a deck and a CSV parts list into the same circuit", () => {
    const fromDeck = readCircuitFile(deck);
    const fromCsv = readCircuitFile(csv, { filename: "night.csv" });
    expect(fromDeck.ok && fromCsv.ok).toBe(true);
    if (fromDeck.ok && fromCsv.ok) {
      const shape = (parts: typeof fromDeck.record.parts) =>
        parts.map((p) => [p.ref, p.kind, p.value, p.pins]);
      expect(shape(fromDeck.record.parts)).toEqual(shape(fromCsv.record.parts));
      expect(shape(fromDeck.record.parts)).toEqual([
        ["R1", "resistor", 1e6, { a: "L", b: "A" }],
        ["C1", "capacitor", 1e-7, { a: "A", b: "N" }],
      ]);
    }
    expect(readCircuitFile(example, { filename: "w.yaml" }).ok).toBe(true);
  });

  it("gives the same error code for the same mistake in every format, at that format's line", () => {
    const yaml = readCircuitFile(
      "record: 1\ntitle: t\nparts:\n  - { ref: R1, kind: resistor, value: 1uF, pins: [A, B] }\n",
    );
    const fromDeck = readCircuitFile("t\nR1 A B 1uF\n", { filename: "t.cir" });
    const fromCsv = readCircuitFile("ref,kind,value,pins\nR1,resistor,1uF,A B\n", {
      filename: "t.csv",
    });
    const brief = (r: ReturnType<typeof readCircuitFile>) =>
      r.ok ? [] : r.errors.map((e) => [e.code, e.line]);
    expect(brief(yaml)).toEqual([["wrong-unit", 4]]);
    expect(brief(fromDeck)).toEqual([["wrong-unit", 2]]);
    expect(brief(fromCsv)).toEqual([["wrong-unit", 2]]);
  });
});
