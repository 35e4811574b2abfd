/**
 * The form editor asks for what the solver needs before saving: from the form's state alone (no
 * time stepping) it names each part or net an analysis would leave out, or says nothing will be
 * computed when no net has the line or neutral role. Expectations are worked out by hand from the
 * record (a load with no model.r or model.c cannot be simulated; a supply needs both roles), and
 * the prediction is held against what the solver then reports for the same record.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { analyzeCircuit, parseRecord, serializeRecord } from "@teardown/engine";
import { formFromDocument, type FormState } from "@/app/components/entry/form/form-state";
import { checkForm, solverShortfall } from "@/app/components/entry/form/use-live-check";

const RECORDS = fileURLToPath(new URL("../../seed-demo/records/", import.meta.url));

/** The heater controller: a 47 Ω element (HE1) on L1–T, a triac stage, L and N roles. */
function heaterForm(): FormState {
  const file = "thermbrook-heater-controller.yaml";
  const read = parseRecord(readFileSync(RECORDS + file, "utf8"), { filename: file });
  if (!read.ok) throw new Error(`${file}: ${read.errors[0]?.message}`);
  return formFromDocument(JSON.parse(serializeRecord(read.record, "json")));
}

const withPart = (s: FormState, ref: string, change: Partial<FormState["parts"][number]>) => ({
  ...s,
  parts: s.parts.map((p) => (p.ref === ref ? { ...p, ...change } : p)),
});

describe("what the form says the analysis will not cover", () => {
  it("says nothing when every part can be simulated and the supply is found", () => {
    const check = checkForm(heaterForm());
    expect(check.errors).toEqual([]);
    expect(check.expected).toEqual({ notSolvable: null, gaps: [] });
    expect(solverShortfall(check.expected)).toBeNull();
  });

  it("names a load whose resistance was cleared, before saving, as the solver then reports", () => {
    const state = withPart(heaterForm(), "HE1", { model: "" });
    const check = checkForm(state);
    // The record itself is valid: a load without a model is allowed, only not simulated.
    expect(check.errors).toEqual([]);
    expect(check.expected!.notSolvable).toBeNull();
    expect(check.expected!.gaps.map((g) => g.part ?? `net ${g.net}`)).toEqual(["HE1"]);
    expect(check.expected!.gaps[0]!.reason).toMatch(/load without a resistance/);
    expect(solverShortfall(check.expected)).toMatch(
      /^Left out of the analysis: HE1: load without a resistance/,
    );
    // The promise holds: the solver leaves out exactly what the form said it would.
    const solved = analyzeCircuit(check.record!, { minSupply: false });
    if (!solved.ok) throw new Error(solved.error.message);
    expect(solved.value.gaps.map((g) => g.part ?? `net ${g.net}`)).toEqual(["HE1"]);
  });

  it("says nothing will be computed when no net has the neutral role", () => {
    const state = heaterForm();
    const nets = state.nets.map((n) => (n.role === "neutral" ? { ...n, role: "" } : n));
    const check = checkForm({ ...state, nets });
    expect(check.errors).toEqual([]);
    expect(check.expected!.notSolvable).toMatch(/neutral role/);
    expect(check.expected!.notSolvable).not.toMatch(/line/);
    expect(solverShortfall(check.expected)).toMatch(/^Nothing will be computed: no net has the/);
  });

  it("asks nothing while the form has errors (the errors come first)", () => {
    const check = checkForm(withPart(heaterForm(), "R1", { value: "4k7k" }));
    expect(check.errors.length).toBeGreaterThan(0);
    expect(solverShortfall(check.expected)).toBeNull();
  });
});
