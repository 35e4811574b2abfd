/**
 * What the web app reads and tells before anything is solved: the form editor's live check
 * names what the solver would leave out (before the person saves), and a result stored by an
 * older engine is upgraded for the page, with internal marks gone from its sources.
 */
import { describe, expect, it } from "vitest";
import { analyzeCircuit, parseStoredResult, withoutInternalMarks } from "@teardown/engine";
import { checkForm, solverShortfall } from "@/app/components/entry/form/use-live-check";
import { emptyForm, formFromDocument } from "@/app/components/entry/form/form-state";

const PARTIAL_DOC = {
  record: 1,
  title: "Bench heater",
  parts: [
    { ref: "R1", kind: "resistor", value: "23k", pins: ["L", "N"] },
    { ref: "HT1", kind: "load", pins: ["L", "A"] },
    { ref: "U1", kind: "widget", pins: { a: "A", b: "N" } },
  ],
  nets: { L: { role: "line" }, N: { role: "neutral" } },
};

describe("the form editor's account of what the solver needs", () => {
  it("names a load without a resistance and a part of unknown kind before saving", () => {
    const live = checkForm(formFromDocument(PARTIAL_DOC));
    expect(live.errors).toEqual([]);
    expect(live.expected?.notSolvable).toBeNull();
    const named = (live.expected?.gaps ?? []).map((g) => g.part ?? `net ${g.net}`);
    expect(named).toEqual(["HT1", "U1", "net A"]);
    // The sentence the form shows above its submit button, part by part.
    expect(solverShortfall(live.expected)).toMatch(
      /^Left out of the analysis: HT1: load without a resistance.*; U1: unknown kind "widget"; net A: /,
    );
    // The promise holds: the solver then leaves out exactly what the form said it would.
    const solved = analyzeCircuit(live.record!, { minSupply: false });
    if (!solved.ok) throw new Error(solved.error.message);
    expect(solved.value.gaps.map((g) => g.part ?? `net ${g.net}`)).toEqual(named);
  });

  it("asks for nothing once the load has a resistance and the unknown part is gone", () => {
    const doc = {
      ...PARTIAL_DOC,
      parts: [
        PARTIAL_DOC.parts[0],
        { ...PARTIAL_DOC.parts[1], pins: ["L", "N"], model: { r: 47 } },
      ],
    };
    const live = checkForm(formFromDocument(doc));
    expect(live.expected).toEqual({ notSolvable: null, gaps: [] });
    expect(solverShortfall(live.expected)).toBeNull();
  });

  it("says nothing will be computed when no net has the line and neutral roles", () => {
    const doc = { ...PARTIAL_DOC, parts: PARTIAL_DOC.parts.slice(0, 1), nets: {} };
    const live = checkForm(formFromDocument(doc));
    expect(live.expected?.notSolvable).toMatch(/line or the neutral role/);
    expect(solverShortfall(live.expected)).toMatch(/^Nothing will be computed: no net has the/);
  });

  it("has nothing to say about an empty form the engine cannot read yet", () => {
    expect(checkForm(emptyForm()).expected ?? null).toBeNull();
    expect(solverShortfall(checkForm(emptyForm()).expected)).toBeNull();
  });
});

describe("reading back a stored result", () => {
  // The shape engine 1.0.0 stored: no status, evidence keyed by name with the unit as suffix,
  // sources naming internal notes and confidence marks, gaps only as solver notes.
  const OLD = {
    engine: "1.0.0",
    supply: { vrms: 230, hz: 50 },
    input: { current_rms: 0.01, power: 2.3, apparent_power: 2.3, power_factor: 1, thd: 0 },
    parts: { R1: { voltage_peak: 325, current_rms: 0.01, power: 2.3 } },
    nets: { L: { dc: 0, rms: 230, peak: 325 } },
    triggers: [],
    waveforms: { t: [0], series: {} },
    linear: {
      supply: { vrms: 230, hz: 50 },
      input_current: { re: 0, im: 0, rms: 0, phase_deg: 0 },
      nets: {},
      parts: {},
      linearised: [],
    },
    solver: {
      method: "cycles",
      cycles: 3,
      steps: 100,
      assumptions: [],
      notes: [
        "HT1: load without model.r or model.c (left out)",
        "J1: connector is documentation only (left out)",
      ],
      kcl_residual_amps: 0,
      periodic_residual: 0,
      gmin_siemens: 1e-12,
    },
    flags: [
      {
        code: "overstress-voltage",
        severity: "danger",
        parts: ["R1"],
        nets: [],
        message: "R1 sees 325 V",
        evidence: { peak_v: 325, ratio: 1.3 },
        source: "resistor limiting element voltage, reference-values.md §8 (FOUND)",
        caution: "An estimate.",
      },
    ],
    comparisons: [],
    risk_notes: [],
    blocks: [],
    checks: [],
    series: { R1: "E24" },
  };

  it("upgrades an older engine's result: status from its notes, labelled evidence, clean source", () => {
    const read = parseStoredResult(OLD);
    if (!read.ok) throw new Error(read.message);
    expect(read.upgradedFrom).toBe("1.0.0");
    expect(read.result.status).toBe("partial");
    expect(read.result.gaps).toEqual([
      { part: "HT1", reason: "load without a resistance or capacitance" },
    ]);
    const flag = read.result.flags[0]!;
    expect(flag.evidence).toEqual([
      { label: "peak", value: 325, unit: "V" },
      { label: "ratio", value: 1.3, unit: "" },
    ]);
    expect(flag.source).toBe("resistor limiting element voltage");
    expect(flag.source).not.toMatch(/FOUND|MEMORY|DERIVED|\.md/);
  });

  it("refuses a result it cannot read, saying where", () => {
    const read = parseStoredResult({ engine: "0.9.0" });
    expect(read.ok).toBe(false);
    if (read.ok) return;
    expect(read.engine).toBe("0.9.0");
    expect(read.message).toMatch(/supply/);
  });

  it("strips confidence marks and note names from any source text", () => {
    expect(
      withoutInternalMarks(
        "IEC 60384-14 subclasses X1/X2/X3 (FOUND, reference-values.md §7); a dropper: common practice",
      ),
    ).toBe("IEC 60384-14 subclasses X1/X2/X3; a dropper: common practice");
  });
});
