/**
 * What an analysis says about itself, gathered for the stored result: why it could not be solved,
 * the parts and nets it left out (gaps) and the defaults it chose (assumptions), from the solver
 * and the risk assessment. analyze.ts decides the status from these.
 */
import type { NotSolvedResult, StoredFlag } from "./analysis-result.js";
import type { RiskAssessment } from "./flags/flag-types.js";
import type { Assumption, Gap } from "./record/gaps-and-assumptions.js";
import type { TeardownRecord } from "./record/types.js";
import type { CircuitAnalysis } from "./solver/analyze-circuit.js";
import { compileCircuit } from "./solver/circuit-model.js";
import { evidenceList, gapsFromSolverNotes, withoutInternalMarks } from "./stored-result.js";

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

/** The solver's gaps: its own list once it reports one, else read from its notes. */
export function solverGaps(a: CircuitAnalysis, record: TeardownRecord): Gap[] {
  const reported = (a as { gaps?: Gap[] }).gaps;
  if (reported !== undefined) return reported;
  // bridge: until solver-trust lands (CircuitAnalysis.gaps); the notes say "REF: why (left out)".
  return gapsFromSolverNotes(a.solver.notes, record.parts);
}

/** The defaults the solver chose where the record was silent. */
export function solverAssumptions(a: CircuitAnalysis): Assumption[] {
  const reported = (a as { assumptions?: Assumption[] }).assumptions;
  if (reported !== undefined) return reported;
  // bridge: until solver-trust lands (CircuitAnalysis.assumptions); today only strings
  // "REF: what value" (the gmin line is the method, not a part default, and is left out).
  const out: Assumption[] = [];
  for (const s of a.solver.assumptions) {
    const m = /^([^:\s]+): (.+)$/.exec(s);
    if (m)
      out.push({
        part: m[1]!,
        field: "model",
        value: m[2]!,
        why: "the record does not give it; a typical value",
      });
  }
  return out;
}

/** The defaults the risk assessment chose (ratings by package and the like). */
export function riskAssumptions(risks: RiskAssessment): Assumption[] {
  // bridge: until flags-trust lands (RiskAssessment.assumptions)
  return (risks as { assumptions?: Assumption[] }).assumptions ?? [];
}

/** A flag as stored: evidence as labelled quantities and a citation id. */
export function storedFlag(flag: RiskAssessment["flags"][number]): StoredFlag {
  const f = flag as unknown as Record<string, unknown> & { code: StoredFlag["code"] };
  // bridge: until flags-trust lands (Evidence[], source_id, sources from the citations table);
  // once it has, these are no-ops.
  return {
    ...(flag as unknown as StoredFlag),
    evidence: evidenceList(f.evidence),
    source: withoutInternalMarks(String(f.source)) || "common practice",
    source_id: typeof f.source_id === "string" ? f.source_id : f.code,
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
  const reported = (compiled.value as { gaps?: Gap[] }).gaps;
  // bridge: until solver-trust lands (compileCircuit reports Gap[]); read its notes meanwhile.
  return {
    notSolvable: null,
    gaps: reported ?? gapsFromSolverNotes(compiled.value.notes, record.parts),
  };
}
