/**
 * What-if runs: a sweep of one part's value (the gate-feed suggestion of a what-if lives in
 * what-if/gate-feed-suggestion.ts).
 */
import type { TeardownRecord } from "../record/types.js";
import type { SolverOutcome } from "../solver/solver-error.js";
import { solverFailure } from "../solver/solver-error.js";
import { partValueOf, withPartValues } from "../solver/variants/part-value.js";
import type { CircuitAnalysis, SolveOptions } from "./analyze-circuit.js";
import { analyzeCircuit } from "./analyze-circuit.js";

/** The record with part `ref`'s value changed, by the one value-change rule (a load's lives in its model). */
function withValue(rec: TeardownRecord, ref: string, value: number): TeardownRecord {
  return withPartValues(rec, new Map([[ref, value]]));
}

/** One point of a sweep. */
export interface SweepPoint {
  value: number;
  result: SolverOutcome<CircuitAnalysis>;
}

/**
 * Analyses the record once per value of part `ref` (its changeable value replaced: a load's
 * resistance or capacitance, else its main value). A part with no value a variant can change
 * is refused, since sweeping it would change nothing.
 */
export function sweepPartValue(
  rec: TeardownRecord,
  ref: string,
  values: number[],
  opts: SolveOptions = {},
): SolverOutcome<SweepPoint[]> {
  const p = rec.parts.find((q) => q.ref === ref);
  if (p === undefined)
    return solverFailure("unknown-part", `no part ${ref} in the record`, { parts: [ref] });
  if (partValueOf(p) === null)
    return solverFailure("unknown-part", `${ref} has no value a sweep can change`, {
      parts: [ref],
    });
  return {
    ok: true,
    value: values.map((value) => ({
      value,
      result: analyzeCircuit(withValue(rec, ref, value), opts),
    })),
  };
}
