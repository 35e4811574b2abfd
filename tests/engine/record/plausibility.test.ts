/**
 * Plausibility of a record's numbers: impossible ones refused at the field with its line,
 * implausible ones kept, warned about (`implausible-value`) and named by the circuit checks.
 * The bounds are physical facts (k of two coupled windings lies in (0, 1]) or the range of parts
 * made (common practice), not figures the engine computes.
 */
import { describe, expect, it } from "vitest";
import { checkCircuit, parseRecord, type InputError, type ParseResult } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";

function errors(result: ParseResult): InputError[] {
  if (result.ok) throw new Error("expected errors");
  return result.errors;
}

/** A YAML record with one part written at line 6 (the part's fields follow on lines 7-). */
function yamlWith(partLines: string): string {
  return [
    "record: 1",
    "title: Plausibility probe",
    "device:",
    "  rated_supply: { vrms: 230, hz: 50 }",
    "parts:",
    ...partLines.split("\n").map((l) => `  ${l}`),
    "  - { ref: R9, kind: resistor, value: 1k, pins: [L, N] }",
    "nets: { L: { role: line }, N: { role: neutral } }",
  ].join("\n");
}

const TRANSFORMER = (k: string): string =>
  `- ref: T1\n  kind: transformer\n  pins: [L, N, S1, S2]\n  model: { lp: 10, ratio: 20, k: ${k} }`;

describe("impossible values are refused at the field", () => {
  it("refuses a transformer with k = 1.5, naming parts[0].model.k and its line", () => {
    const e = errors(parseRecord(yamlWith(TRANSFORMER("1.5"))));
    expect(e.map((x) => [x.path, x.code, x.line])).toEqual([
      ["parts[0].model.k", "impossible-value", 9],
    ]);
    expect(e[0]!.message).toMatch(/coupling factor/);
  });

  it("accepts k = 1 and k = 0.98, and refuses k = 0 and k = -0.2", () => {
    expect(parseRecord(yamlWith(TRANSFORMER("1"))).ok).toBe(true);
    expect(parseRecord(yamlWith(TRANSFORMER("0.98"))).ok).toBe(true);
    for (const k of ["0", "-0.2"])
      expect(errors(parseRecord(yamlWith(TRANSFORMER(k))))[0]!.path).toBe("parts[0].model.k");
  });

  it("refuses a turns ratio or primary inductance at or below zero", () => {
    const bad = `- ref: T1\n  kind: transformer\n  pins: [L, N, S1, S2]\n  model: { lp: 0, ratio: -3 }`;
    expect(
      errors(parseRecord(yamlWith(bad)))
        .map((x) => [x.path, x.code])
        .sort(),
    ).toEqual([
      ["parts[0].model.lp", "impossible-value"],
      ["parts[0].model.ratio", "impossible-value"],
    ]);
  });

  it("refuses a 1e30 F capacitor at parts[0].value, on its line", () => {
    const e = errors(
      parseRecord(yamlWith("- { ref: C1, kind: capacitor, value: 1e30, pins: [L, N] }")),
    );
    expect(e.map((x) => [x.path, x.code, x.line])).toEqual([
      ["parts[0].value", "impossible-value", 6],
    ]);
    expect(e[0]!.message).toContain("1e+30 F");
  });

  it("refuses a negative series resistance and a zero saturation current in a diode model", () => {
    const d = "- { ref: D1, kind: diode, pins: [L, N], model: { rs: -1, is: 0 } }";
    expect(
      errors(parseRecord(yamlWith(d)))
        .map((x) => x.path)
        .sort(),
    ).toEqual(["parts[0].model.is", "parts[0].model.rs"]);
  });
});

describe("implausible values are kept and named", () => {
  const cases: Array<[string, string, string]> = [
    ["capacitor above 1 F", "- { ref: C1, kind: capacitor, value: 2.2, pins: [L, N] }", "value"],
    ["capacitor below 1 pF", "- { ref: C1, kind: capacitor, value: 0.1p, pins: [L, N] }", "value"],
    ["resistor below 1 mΩ", "- { ref: R1, kind: resistor, value: 0.2m, pins: [L, N] }", "value"],
    ["zener below 1.8 V", "- { ref: Z1, kind: zener, value: 0.5, pins: [L, N] }", "value"],
    [
      "load of 0.1 Ω on the mains",
      "- { ref: HT1, kind: load, pins: [L, N], model: { r: 0.1 } }",
      "model.r",
    ],
  ];
  for (const [name, line, field] of cases) {
    it(`warns on a ${name} at parts[0].${field} and names it in the circuit checks`, () => {
      const r = parseRecord(yamlWith(line));
      if (!r.ok) throw new Error(JSON.stringify(r.errors));
      const w = r.warnings.filter((x) => x.code === "implausible-value");
      expect(w.map((x) => [x.path, x.line])).toEqual([[`parts[0].${field}`, 6]]);
      const named = checkCircuit(r.record).filter((i) => i.code === "implausible-value");
      expect(named).toHaveLength(1);
      expect(named[0]!.severity).toBe("warning");
      expect(named[0]!.message).toContain(`parts[0].${field}`);
      expect(named[0]!.parts).toEqual([r.record.parts[0]!.ref]);
    });
  }

  it("does not warn on ordinary mains-board values (100 nF, 1 MΩ, 5.1 V zener, 470 V varistor)", () => {
    const parts = [
      "- { ref: C1, kind: capacitor, value: 100n, pins: [L, A] }",
      "- { ref: R1, kind: resistor, value: 1M, pins: [L, A] }",
      "- { ref: Z1, kind: zener, value: 5.1, pins: [A, N] }",
      "- { ref: RV1, kind: varistor, value: 470, pins: [L, N] }",
      "- { ref: D1, kind: diode, pins: [A, N], model: { is: 5n, n: 1.9 } }",
    ].join("\n");
    const r = parseRecord(yamlWith(parts));
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    expect(r.warnings.filter((w) => w.code === "implausible-value")).toEqual([]);
    expect(checkCircuit(r.record).filter((i) => i.code === "implausible-value")).toEqual([]);
  });

  it("names an odd mains frequency at device.rated_supply.hz", () => {
    const text = yamlWith("- { ref: C1, kind: capacitor, value: 100n, pins: [L, N] }").replace(
      "hz: 50",
      "hz: 5",
    );
    const r = parseRecord(text);
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    expect(r.warnings.map((w) => [w.path, w.code])).toContainEqual([
      "device.rated_supply.hz",
      "implausible-value",
    ]);
  });
});

describe("records built in code, which skip validation", () => {
  it("get an impossible-value error from the circuit checks for k = 1.5 and a 1e30 F capacitor", () => {
    const rec = record([
      part("T1", "transformer", ["L", "N", "S1", "S2"], null, {
        model: { lp: 10, ratio: 20, k: 1.5 },
      }),
      part("C1", "capacitor", ["S1", "S2"], 1e30),
    ]);
    const found = checkCircuit(rec).filter((i) => i.code === "impossible-value");
    expect(found.map((i) => [i.severity, i.parts, i.message.split(":")[0]])).toEqual([
      ["error", ["C1"], "C1 (parts[1].value)"],
      ["error", ["T1"], "T1 (parts[0].model.k)"],
    ]);
  });
});
