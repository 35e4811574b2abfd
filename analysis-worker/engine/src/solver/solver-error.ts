/**
 * Expected failures of the circuit solver, returned as values: each has a code, a message and
 * where it happened (nets, parts, time).
 */

export type SolverErrorCode =
  | "no-supply"
  | "floating-net"
  | "voltage-source-loop"
  | "singular-matrix"
  | "no-convergence"
  | "time-budget"
  | "step-limit"
  | "bad-model"
  | "unknown-part";

/** Where a solver failure is: nets, parts and the simulated time (seconds), when known. */
export interface SolverWhere {
  nets: string[];
  parts: string[];
  time_s: number | null;
}

/** One expected solver failure. */
export interface SolverError {
  code: SolverErrorCode;
  message: string;
  where: SolverWhere;
}

/** Either a value or a solver failure. */
export type SolverOutcome<T> = { ok: true; value: T } | { ok: false; error: SolverError };

/** Builds a failure outcome. */
export function solverFailure(
  code: SolverErrorCode,
  message: string,
  where: Partial<SolverWhere> = {},
): { ok: false; error: SolverError } {
  return {
    ok: false,
    error: { code, message, where: { nets: [], parts: [], time_s: null, ...where } },
  };
}
