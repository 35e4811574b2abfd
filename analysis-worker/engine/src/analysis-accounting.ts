/**
 * What an analysis says about itself, gathered for the stored result: why it could not be solved,
 * the parts and nets it left out (gaps) and the defaults it chose (assumptions), from the solver
 * and the risk assessment. analyze.ts decides the status from these.
 */
import type { NotSolvedResult } from "./analysis-result.js";
import type { Gap } from "./record/gaps-and-assumptions.js";
import type { TeardownRecord } from "./record/types.js";
import { compileCircuit } from "./solver/circuit-model.js";

/** Why the record has no supply to solve against, or null when it has a line and a neutral net. */
export function missingSupplyRole(record: TeardownRecord): string | null {
  const roles = new Set(Object.values(record.nets).map((n) => n.role));
  const missing = (["line", "neutral"] as const).filter((r) => !roles.has(r));
  if (missing.length === 0) return null;
  return `no net has the ${missing.join(" or the ")} role, so there is no supply to solve against`;
}

/** A not-solved result: what every analysis keeps, the reason, and the gaps naming where. */
export function notSolved(
  kept: Pick<NotSolvedResult, "engine" | "supply" | "blocks" | "checks" | "series">,
  reason: string,
  solverCode: string | null,
  gaps: Gap[],
): NotSolvedResult {
  return {
    ...kept,
    status: "not-solved",
    reason,
    solver_code: solverCode,
    gaps,
    assumptions: [],
    flags: [],
  };
}

/** What an analysis of this record would leave out, known before solving (for the form editor). */
export interface ExpectedGaps {
  /** Why it could not be solved at all (no line or neutral, a structural fault), else null. */
  notSolvable: string | null;
  gaps: Gap[];
}

/**
 * The parts and nets the solver would leave out of this record, from compiling it (cheap: no
 * time stepping), so an editor can ask for what is missing before the record is saved.
 */
export function expectedGaps(record: TeardownRecord): ExpectedGaps {
  const missing = missingSupplyRole(record);
  if (missing !== null) return { notSolvable: missing, gaps: [] };
  const compiled = compileCircuit(record, record.device.rated_supply);
  if (!compiled.ok) return { notSolvable: compiled.error.message, gaps: [] };
  return { notSolvable: null, gaps: compiled.value.gaps };
}
