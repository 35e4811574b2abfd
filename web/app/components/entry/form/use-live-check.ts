"use client";
/**
 * Live validation of the form by the engine itself: the form state is written as a record
 * document and read back with parseRecord, so the form shows exactly what the server will say.
 * A valid record is also put through the circuit checks (floating nets, no supply path...).
 */
import { useDeferredValue, useMemo } from "react";
import {
  checkCircuit,
  expectedGaps,
  gapsText,
  parseRecord,
  type CircuitIssue,
  type ExpectedGaps,
  type InputError,
  type TeardownRecord,
} from "@teardown/engine";
import { documentFromForm, type FormState } from "./form-state";

/** What the engine says about the form's record. */
export interface LiveCheck {
  document: Record<string, unknown>;
  record: TeardownRecord | null;
  errors: InputError[];
  warnings: InputError[];
  issues: CircuitIssue[];
  /** What the solver would leave out of this record, or why it could not solve it; null while invalid. */
  expected: ExpectedGaps | null;
}

/** Reads a form state with the engine. */
export function checkForm(state: FormState): LiveCheck {
  const document = documentFromForm(state);
  const read = parseRecord(JSON.stringify(document, null, 2), { filename: "form.json" });
  if (!read.ok)
    return {
      document,
      record: null,
      errors: read.errors,
      warnings: [],
      issues: [],
      expected: null,
    };
  return {
    document,
    record: read.record,
    errors: [],
    warnings: read.warnings,
    issues: checkCircuit(read.record),
    expected: expectedGaps(read.record),
  };
}

/** One sentence on what an analysis would not cover, or null when it would cover everything. */
export function solverShortfall(expected: ExpectedGaps | null): string | null {
  if (expected === null) return null;
  if (expected.notSolvable !== null) return `Nothing will be computed: ${expected.notSolvable}.`;
  if (expected.gaps.length === 0) return null;
  return `Left out of the analysis: ${gapsText(expected.gaps)}.`;
}

/** The live check of a form state, computed off the typing path (deferred). */
export function useLiveCheck(state: FormState): LiveCheck {
  const deferred = useDeferredValue(state);
  return useMemo(() => checkForm(deferred), [deferred]);
}
