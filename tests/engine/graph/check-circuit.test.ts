import { describe, expect, it } from "vitest";
import { checkCircuit, type CircuitIssue } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { ALL_TEST_CIRCUITS } from "../../support/circuits/all-test-circuits.js";
import { nightLightDropper, triacDimmer } from "../../support/circuits/mains-circuits.js";

const codes = (issues: CircuitIssue[]): string[] => issues.map((i) => i.code);
const MAINS = { L: { role: "line" as const }, N: { role: "neutral" as const } };

describe("checkCircuit", () => {
  it("finds nothing to say about a well-formed night light", () => {
    expect(checkCircuit(nightLightDropper())).toEqual([]);
  });

  it("reports duplicate refs, naming the ref", () => {
    const rec = record(
      [part("R1", "resistor", ["L", "N"], 1), part("R1", "resistor", ["L", "N"], 2)],
      MAINS,
    );
    const dup = checkCircuit(rec).filter((i) => i.code === "duplicate-ref");
    expect(dup).toEqual([
      {
        code: "duplicate-ref",
        severity: "error",
        message: expect.stringContaining("2 parts share the ref R1"),
        parts: ["R1"],
        nets: [],
      },
    ]);
  });

  it("reports a missing pin and an unknown pin of a known kind", () => {
    const rec = record(
      [
        part("D1", "diode", { anode: "L" }),
        part("Q1", "thyristor", { anode: "L", gate: "G", cathode: "N", base: "N" }),
        part("R1", "resistor", ["G", "N"], 1),
      ],
      MAINS,
    );
    const issues = checkCircuit(rec);
    expect(issues.find((i) => i.code === "pin-missing")).toMatchObject({
      severity: "error",
      parts: ["D1"],
      nets: ["L"],
    });
    expect(issues.find((i) => i.code === "pin-unknown")).toMatchObject({
      severity: "error",
      parts: ["Q1"],
      nets: ["G", "L", "N"],
    });
    expect(issues.find((i) => i.code === "pin-unknown")!.message).toContain("base");
  });

  it("accepts polarised capacitor pins plus/minus but not a/b", () => {
    const good = record(
      [part("C1", "capacitor", { plus: "L", minus: "N" }, 1e-6, { polarised: true })],
      MAINS,
    );
    const bad = record(
      [part("C1", "capacitor", { a: "L", b: "N" }, 1e-6, { polarised: true })],
      MAINS,
    );
    expect(checkCircuit(good)).toEqual([]);
    expect(codes(checkCircuit(bad))).toEqual(["pin-missing", "pin-unknown"]);
  });

  it("reports measurement nets and parts that the circuit does not have", () => {
    const rec = record([part("R1", "resistor", ["L", "N"], 1e3)], MAINS, {
      measurements: [
        {
          what: "voltage.dc",
          value: 1,
          between: ["L", "Q"],
          part: null,
          supply: { vrms: 230, hz: 50 },
          instrument: null,
          uncertainty: null,
        },
        {
          what: "part.power",
          value: 1,
          between: null,
          part: "R9",
          supply: { vrms: 230, hz: 50 },
          instrument: null,
          uncertainty: null,
        },
      ],
    });
    const issues = checkCircuit(rec);
    expect(issues.map((i) => [i.code, i.parts, i.nets])).toEqual([
      ["measurement-unknown-net", [], ["Q"]],
      ["measurement-unknown-part", ["R9"], []],
    ]);
  });

  it("warns of a net with one simulated pin, not counting connectors and test points", () => {
    const rec = record(
      [
        part("R1", "resistor", ["L", "X"], 1),
        part("R2", "resistor", ["L", "N"], 1),
        part("TP1", "testpoint", ["X"]),
        part("J1", "connector", ["X"]),
      ],
      MAINS,
    );
    expect(checkCircuit(rec)).toEqual([
      expect.objectContaining({
        code: "floating-net",
        severity: "warning",
        parts: ["R1"],
        nets: ["X"],
      }),
    ]);
  });

  it("does not call a supply net floating: the mains is its other connection", () => {
    const rec = record(
      [part("R1", "resistor", ["L", "A"], 1), part("R2", "resistor", ["A", "N"], 1)],
      MAINS,
    );
    expect(checkCircuit(rec)).toEqual([]);
  });

  it("warns of a part shorted by its own pins, and of a shorted transformer winding", () => {
    const rec = record(
      [
        part("R1", "resistor", ["L", "L"], 1),
        part("R2", "resistor", ["L", "N"], 1),
        part("T1", "transformer", { p1: "L", p2: "N", s1: "S", s2: "S" }),
      ],
      MAINS,
    );
    const shorted = checkCircuit(rec).filter((i) => i.code === "part-shorted");
    expect(shorted.map((i) => [i.parts, i.nets])).toEqual([
      [["R1"], ["L"]],
      [["T1"], ["S"]],
    ]);
  });

  it("says there is no supply when no net has the line or neutral role", () => {
    const rec = record(
      [part("R1", "resistor", ["A", "B"], 1), part("R2", "resistor", ["A", "B"], 1)],
      { L: { role: null } },
    );
    expect(codes(checkCircuit(rec))).toEqual(["no-supply"]);
  });

  it("warns when the neutral or the line is not declared", () => {
    const noNeutral = record(
      [part("R1", "resistor", ["L", "X"], 1), part("R2", "resistor", ["L", "X"], 1)],
      { N: { role: null } },
    );
    expect(codes(checkCircuit(noNeutral))).toEqual(["no-neutral"]);
    const noLine = record([
      part("R1", "resistor", ["N", "X"], 1),
      part("R2", "resistor", ["N", "X"], 1),
    ]);
    expect(codes(checkCircuit(noLine))).toEqual(["no-line"]);
  });

  it("reports each island with no path to the supply, with its parts and nets", () => {
    const rec = record(
      [
        part("R1", "resistor", ["L", "N"], 1),
        part("R2", "resistor", ["X", "Y"], 1),
        part("C1", "capacitor", ["X", "Y"], 1e-9),
        part("R3", "resistor", ["U", "V"], 1),
        part("R4", "resistor", ["U", "V"], 1),
      ],
      MAINS,
    );
    const islands = checkCircuit(rec).filter((i) => i.code === "no-supply-path");
    expect(islands.map((i) => [i.parts, i.nets])).toEqual([
      [
        ["C1", "R2"],
        ["X", "Y"],
      ],
      [
        ["R3", "R4"],
        ["U", "V"],
      ],
    ]);
  });

  it("carries a transformer's secondary into the primary's island", () => {
    const rec = record(
      [
        part("T1", "transformer", { p1: "L", p2: "N", s1: "S1", s2: "S2" }),
        part("R1", "resistor", ["S1", "S2"], 10),
      ],
      MAINS,
    );
    expect(checkCircuit(rec)).toEqual([]);
  });

  it("notes unknown kinds as left out of the simulation", () => {
    const issues = checkCircuit(triacDimmer());
    expect(issues.map((i) => [i.code, i.severity, i.parts, i.nets])).toEqual([
      ["floating-net", "warning", ["TR1"], ["G"]],
      ["unknown-kind", "info", ["DB1"], ["G", "X"]],
    ]);
  });

  it("never throws on any test circuit, and finds no errors in them", () => {
    for (const c of ALL_TEST_CIRCUITS) {
      const errors = checkCircuit(c.record).filter((i) => i.severity === "error");
      expect(errors, c.name).toEqual([]);
    }
  });
});
