import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  parseRecord,
  type InputError,
  type ParseResult,
  type TeardownRecord,
} from "@teardown/engine";

const example = readFileSync(new URL("./fixtures/fragrance-warmer.yaml", import.meta.url), "utf8");

function ok(result: ParseResult): TeardownRecord {
  if (!result.ok) throw new Error(JSON.stringify(result.errors, null, 1));
  return result.record;
}

function errors(result: ParseResult): InputError[] {
  if (result.ok) throw new Error("expected errors");
  return result.errors;
}

const brief = (e: InputError): [string, string, number | null, number | null] => [
  e.path,
  e.code,
  e.line,
  e.column,
];

describe("parseRecord on the record-format example", () => {
  const r = ok(parseRecord(example, { filename: "warmer.yaml" }));

  it("reads values as SI numbers and keeps their text", () => {
    expect(r.parts[0]).toMatchObject({
      ref: "C1",
      value: 3.3e-7,
      value_text: "330n",
      tolerance: 0.1,
      rating: { volts: 310, class: "X2" },
    });
    expect(r.parts[1]).toMatchObject({ ref: "R1", value: 1e6, value_text: "1M" });
  });

  it("turns list pins into the kind's roles and keeps map pins", () => {
    expect(r.parts[0]!.pins).toEqual({ a: "L", b: "A" });
    expect(r.parts[3]!.pins).toEqual({ anode: "P", gate: "G", cathode: "M" });
  });

  it("reads model parameters in the value notation", () => {
    expect(r.parts[3]!.model).toEqual({ vgt: 0.7, igt: 50e-6, ih: 3e-3, von: 1.2 });
  });

  it("gives every net named anywhere an entry with defaults", () => {
    expect(Object.keys(r.nets).sort()).toEqual(["A", "CASE", "G", "HV", "L", "M", "N", "P", "X"]);
    expect(r.nets.A).toEqual({ role: null, accessible: false, note: null });
    expect(r.nets.CASE).toEqual({ role: null, accessible: true, note: null });
    expect(r.nets.L!.role).toBe("line");
  });

  it("defaults a measurement's supply to the rated one and keeps a stated one", () => {
    expect(r.measurements[0]!.supply).toEqual({ vrms: 232, hz: 50 });
    expect(r.measurements[0]!.uncertainty).toEqual({ relative: 0.02 });
    expect(r.measurements[1]!.supply).toEqual({ vrms: 230, hz: 50 });
    expect(r.measurements[1]!.between).toEqual(["P", "M"]);
  });

  it("defaults a spacing to material group IIIa and pollution degree 2", () => {
    expect(r.board.spacings[0]).toEqual({
      between: ["L", "CASE"],
      creepage_mm: 3.2,
      clearance_mm: 2.5,
      slot: true,
      material_group: "IIIa",
      pollution_degree: 2,
    });
  });
});

describe("parseRecord defaults and warnings", () => {
  it("assumes 230 V / 50 Hz with a warning when no rated supply is given", () => {
    const result = parseRecord("record: 1\ntitle: t\nparts: []\n");
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.record.device.rated_supply).toEqual({ vrms: 230, hz: 50 });
      expect(result.warnings.map((w) => w.code)).toContain("no-rated-supply");
    }
  });

  it("names list pins p1..pN for connectors and unknown kinds, and warns about the unknown kind", () => {
    const result = parseRecord(`record: 1
title: t
device: { rated_supply: { vrms: 120, hz: 60 } }
parts:
  - { ref: J1, kind: connector, pins: [L, N, PE] }
  - { ref: U1, kind: timer-ic, pins: [A, B] }
  - { ref: U2, kind: Resistor, pins: { vin: A } }
`);
    const r = ok(result);
    expect(r.parts[0]!.pins).toEqual({ p1: "L", p2: "N", p3: "PE" });
    expect(r.parts[1]!.pins).toEqual({ p1: "A", p2: "B" });
    expect(r.parts[2]!.pins).toEqual({ vin: "A" });
    if (result.ok)
      expect(result.warnings.filter((w) => w.code === "unknown-kind").map((w) => w.path)).toEqual([
        "parts[1].kind",
        "parts[2].kind",
      ]);
  });

  it("keeps a marking that YAML would read as a number as its text", () => {
    const r = ok(
      parseRecord(
        "record: 1\ntitle: t\nparts:\n  - { ref: C1, kind: capacitor, value: 100n, marking: 0104, pins: [A, B] }\n",
      ),
    );
    expect(r.parts[0]!.marking).toBe("0104");
  });

  it("keeps a numeric value's own spelling as value_text", () => {
    const r = ok(
      parseRecord(
        "record: 1\ntitle: t\nparts:\n  - { ref: R1, kind: resistor, value: 1e6, pins: [A, B] }\n",
      ),
    );
    expect(r.parts[0]).toMatchObject({ value: 1e6, value_text: "1e6" });
  });

  it("orders polarised capacitor pins plus, minus", () => {
    const r = ok(
      parseRecord(
        "record: 1\ntitle: t\nparts:\n  - { ref: C2, kind: capacitor, polarised: true, value: 10u, pins: [P, M] }\n",
      ),
    );
    expect(r.parts[0]).toMatchObject({ polarised: true, pins: { plus: "P", minus: "M" } });
  });

  it("warns about unknown fields and ignores them", () => {
    const result = parseRecord("record: 1\ntitle: t\ncolour: red\nparts: []\n");
    expect(result.ok).toBe(true);
    if (result.ok)
      expect(result.warnings.find((w) => w.code === "unknown-field")).toMatchObject({
        path: "colour",
        line: 3,
      });
  });
});

describe("parseRecord errors", () => {
  const broken = [
    /* 1 */ "record: 1",
    /* 2 */ "title: Broken board",
    /* 3 */ "parts:",
    /* 4 */ "  - ref: R1",
    /* 5 */ "    kind: resistor",
    /* 6 */ "    value: 330nF",
    /* 7 */ "    pins: [A, B]",
    /* 8 */ "  - ref: R1",
    /* 9 */ "    kind: diode",
    /* 10 */ "    pins: { anode: A, gate: B }",
    /* 11 */ "  - ref: 2C",
    /* 12 */ "    kind: capacitor",
    /* 13 */ "    value: 4x7",
    /* 14 */ "    pins: [A]",
    /* 15 */ "measurements:",
    /* 16 */ "  - what: voltage.dc",
    /* 17 */ "    between: [A, Z]",
    /* 18 */ "    value: 12",
    /* 19 */ "  - what: part.power",
    /* 20 */ "    part: Q7",
    /* 21 */ "    value: 1",
    "",
  ].join("\n");

  it("reports every error at once with its path, line and column", () => {
    expect(errors(parseRecord(broken, { filename: "broken.yaml" })).map(brief)).toEqual([
      ["parts[0].value", "wrong-unit", 6, 12],
      ["parts[1].ref", "duplicate-ref", 8, 10],
      ["parts[1].pins", "missing-pin", 10, 11],
      ["parts[1].pins.gate", "unknown-pin", 10, 29],
      ["parts[2].ref", "bad-format", 11, 10],
      ["parts[2].value", "bad-notation", 13, 12],
      ["parts[2].pins", "pin-count", 14, 11],
      ["measurements[0].between[1]", "unknown-net", 17, 18],
      ["measurements[1].part", "unknown-part", 20, 11],
    ]);
  });

  it("reports record version, title and missing fields", () => {
    const e = errors(parseRecord("record: 2\ntitle: '   '\n"));
    // a missing top-level field is placed at the start of the document
    expect(e.map(brief)).toEqual([
      ["parts", "missing-field", 1, 1],
      ["record", "not-allowed", 1, 9],
      ["title", "bad-format", 2, 8],
    ]);
  });

  it("reports a title longer than 200 characters", () => {
    const e = errors(parseRecord(`record: 1\ntitle: ${"x".repeat(201)}\nparts: []\n`));
    expect(e.map((x) => [x.path, x.code])).toEqual([["title", "out-of-range"]]);
  });

  it("reports wrong types with what was found", () => {
    const e = errors(
      parseRecord(
        "record: 1\ntitle: t\nparts:\n  - { ref: R1, kind: resistor, value: [1], pins: [A, B], polarised: 3 }\n",
      ),
    );
    expect(e.map((x) => [x.path, x.code, x.line])).toEqual([
      ["parts[0].value", "wrong-type", 4],
      ["parts[0].polarised", "wrong-type", 4],
    ]);
  });

  it("reports YAML syntax errors with their line", () => {
    const e = errors(parseRecord("record: 1\ntitle: t\nparts:\n  - ref: R1\n   kind: [\n"));
    expect(e[0]!.code).toBe("yaml-syntax");
    expect(e[0]!.line).toBeGreaterThanOrEqual(4);
  });

  it("reports a duplicate key as a syntax error at the second key", () => {
    expect(errors(parseRecord("record: 1\ntitle: a\ntitle: b\nparts: []\n")).map(brief)).toEqual([
      ["", "yaml-syntax", 3, 1],
    ]);
  });

  it("needs a measurement's between and part fields", () => {
    const e = errors(
      parseRecord(
        "record: 1\ntitle: t\nparts: []\nmeasurements:\n  - { what: voltage.rms, value: 3 }\n  - { what: part.power, value: 3 }\n",
      ),
    );
    expect(e.map((x) => [x.path, x.code, x.line])).toEqual([
      ["measurements[0]", "missing-field", 5],
      ["measurements[1]", "missing-field", 6],
    ]);
  });
});

describe("parseRecord on JSON", () => {
  const json = `{
  "record": 1,
  "title": "JSON board",
  "parts": [
    { "ref": "R1", "kind": "resistor", "value": "4k7", "pins": ["A", "B"] },
    { "ref": "C1", "kind": "capacitor", "value": "4n7Ω", "pins": ["A", "B"] }
  ]
}`;

  it("places errors at the JSON line and column", () => {
    expect(errors(parseRecord(json, { filename: "b.json" })).map(brief)).toEqual([
      ["parts[1].value", "wrong-unit", 6, 50],
    ]);
  });

  it("sniffs JSON without a file name", () => {
    expect(errors(parseRecord(json)).map((e) => e.path)).toEqual(["parts[1].value"]);
  });

  it("reports JSON syntax errors at their line and column, including a trailing comma YAML would accept", () => {
    expect(
      errors(
        parseRecord('{\n  "record": 1,\n  "title": "x" "parts": []\n}', { filename: "a.json" }),
      ).map(brief),
    ).toEqual([["", "json-syntax", 3, 16]]);
    expect(
      errors(parseRecord('{"record": 1, "title": "x", "parts": [],}', { filename: "a.json" })).map(
        brief,
      ),
    ).toEqual([["", "json-syntax", 1, 41]]);
  });

  it("reads tab-indented JSON", () => {
    const r = ok(
      parseRecord('{\n\t"record": 1,\n\t"title": "t",\n\t"parts": []\n}', { filename: "t.json" }),
    );
    expect(r.title).toBe("t");
  });
});

describe("parseRecord never throws", () => {
  it("answers absurd input with structured errors", () => {
    const inputs = [
      "",
      "\u0000\u0001\u00ff",
      "[".repeat(50_000),
      "a: &x [*x]\n",
      "- - - -",
      "record: 1e999\n",
      "x".repeat(2_100_000),
      "42",
      "null",
    ];
    for (const text of inputs) {
      const result = parseRecord(text);
      expect(result.ok).toBe(false);
      if (!result.ok) expect(result.errors.length).toBeGreaterThan(0);
    }
  });
});

describe("deeply nested JSON", () => {
  it("refuses a record file nested 100,000 levels deep before reading it, naming the line", () => {
    const text = '{\n"parts":\n' + "[".repeat(100_000) + "]".repeat(100_000) + "\n}";
    const result = parseRecord(text, { filename: "deep.json" });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.errors).toHaveLength(1);
    expect(result.errors[0]!.code).toBe("too-deep");
    // the 65th bracket opens on line 3 (the object's brace is level 1)
    expect(result.errors[0]!.line).toBe(3);
  });

  it("still reads JSON nested as deep as a record is", () => {
    const result = parseRecord(JSON.stringify({ a: [[[[{ b: [1] }]]]] }), { filename: "x.json" });
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.errors.map((e) => e.code)).not.toContain("too-deep");
  });
});
