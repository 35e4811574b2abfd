/**
 * The engine's whole analysis of one stored record, stage by stage: validate, check, blocks,
 * solve and figures, flags, fingerprint, layout. An invalid record or a layout failure is returned
 * as a value naming the stage (the worker stores it as the failure reason); a record that cannot
 * be solved is still an analysis, `not-solved`, that keeps its layout, blocks and checks and says
 * why. A solved one is `partial` when it left anything out (its gaps), else `complete`.
 */
import { parseRecord } from "./record/parse-record.js";
import type { InputError, Supply, TeardownRecord } from "./record/types.js";
import { eSeriesOf } from "./values/e-series.js";
import { checkCircuit } from "./graph/check-circuit.js";
import { findBlocks } from "./blocks/find-blocks.js";
import { fingerprint } from "./fingerprint/wl-fingerprint.js";
import { layoutSchematic } from "./layout/layout-schematic.js";
import { ENGINE_VERSION } from "./engine-version.js";
import { searchColumnsFor, type SearchColumns } from "./search-columns.js";
import type { CircuitAnalysis, NominalCircuitAnalysis } from "./figures/analyze-circuit.js";
import { analyzeNominal, searchLowestSupplies } from "./figures/analyze-circuit.js";
import { unsolvedVariants } from "./figures/risk-variants.js";
import type { SolverError } from "./solver/solver-error.js";
import type { Gap } from "./record/gaps-and-assumptions.js";
import type { RiskAssessment } from "./flags/flag-types.js";
import { judgeRisks } from "./flags/judge-risks.js";
import {
  DEFAULT_RISK_BUDGET_MS,
  MAX_STEPS_PER_ANALYSIS,
  makeBudget,
} from "./solver/variants/budget.js";
import { selectStoredWaveforms } from "./stored-waveforms.js";
import { assessRisks } from "./assess-risks.js";
import type { AnalysisResult } from "./analysis-result.js";
import { missingSupplyRole, notSolved } from "./analysis-accounting.js";

export type AnalysisStage =
  "validate" | "check" | "blocks" | "solve" | "flags" | "fingerprint" | "layout";

export interface AnalysisOptions {
  /** A clock for stage timings and budgets (the engine never reads the clock itself). */
  now?: () => number;
  /** Analyse at this supply instead of the record's rated supply (a what-if run). */
  supply?: Supply;
  /** The most the nominal solve may take, in ms of `now` (only enforced with a clock). */
  budgetMs?: number;
  /**
   * The most the variants may take after the nominal part is done (lowest firing supply, bands,
   * hints, unplug, plug-in), in ms of `now`. Variants cut short leave the result partial, with
   * the reason, instead of failing it.
   */
  variantBudgetMs?: number;
  /** Called with the cheap part before the variants run (see `RecordAnalysisOptions`). */
  onNominal?: (output: AnalysisOutput) => void;
}

/** Of the variants' budget, the lowest-firing-supply searches may take this share; the risk variants get the rest. */
export const MIN_SUPPLY_BUDGET_SHARE = 0.5;

export interface AnalysisOutput {
  /** The stored result (analysis-result.ts): complete, partial or not solved, with its gaps. */
  result: AnalysisResult;
  layout: unknown;
  search: SearchColumns;
  /** Milliseconds per stage. */
  timings: Partial<Record<AnalysisStage, number>>;
}

export type AnalysisOutcome =
  | { ok: true; output: AnalysisOutput }
  | { ok: false; stage: AnalysisStage; code: string; message: string; errors: InputError[] };

/** Analyses a record given as its stored JSON document (record format version 1). */
export async function analyzeStoredRecord(
  doc: unknown,
  opts: AnalysisOptions = {},
): Promise<AnalysisOutcome> {
  const now = opts.now ?? (() => 0);
  const timings: Partial<Record<AnalysisStage, number>> = {};
  const timed = <T>(stage: AnalysisStage, fn: () => T): T => {
    const t0 = now();
    const out = fn();
    timings[stage] = now() - t0;
    return out;
  };
  const parsed = timed("validate", () =>
    parseRecord(JSON.stringify(doc), { filename: "revision.json" }),
  );
  if (!parsed.ok) {
    const first = parsed.errors[0];
    const message = `${parsed.errors.length} error(s) in the record; first: ${first ? `${first.path}: ${first.message}` : "unknown"}`;
    return { ok: false, stage: "validate", code: "invalid-record", message, errors: parsed.errors };
  }
  return analyzeRecord(parsed.record, {
    now,
    timings,
    supply: opts.supply,
    budgetMs: opts.budgetMs,
    variantBudgetMs: opts.variantBudgetMs,
    onNominal: opts.onNominal,
  });
}

/** Options of `analyzeRecord` beyond `AnalysisOptions`: the clock is required, timings may be shared. */
export interface RecordAnalysisOptions {
  now: () => number;
  timings?: Partial<Record<AnalysisStage, number>>;
  supply?: Supply;
  budgetMs?: number;
  variantBudgetMs?: number;
  /**
   * Called once with the cheap part (validate, blocks, nominal solve, layout) before the
   * variants run: a `partial` result whose `variants` says they are pending, so a caller can
   * store something to show while the variants take their budget.
   */
  onNominal?: (output: AnalysisOutput) => void;
}

/** What an analysis keeps whether it is solved or not. */
type Kept = Pick<AnalysisResult, "engine" | "supply" | "blocks" | "checks" | "series">;

/** What the variants still to run are, in words, for the pending result. */
export const PENDING_VARIANTS =
  "the lowest firing supply of each trigger, the tolerance bands and hints of the measurements, and the unplugging and plug-in checks";

/** Analyses a validated record: the cheap nominal part first, then the variants under their own budget. */
export async function analyzeRecord(
  record: TeardownRecord,
  opts: RecordAnalysisOptions,
): Promise<AnalysisOutcome> {
  const { now } = opts;
  const timings = opts.timings ?? {};
  const timed = <T>(stage: AnalysisStage, fn: () => T): T => {
    const t0 = now();
    const out = fn();
    timings[stage] = (timings[stage] ?? 0) + (now() - t0);
    return out;
  };
  const checks = timed("check", () => checkCircuit(record));
  const blocks = timed("blocks", () => findBlocks(record));
  const features = timed("fingerprint", () => fingerprint(record));
  const t0 = now();
  const layout = await layoutSchematic(record);
  timings.layout = now() - t0;
  if (!layout.ok)
    return { ok: false, stage: "layout", code: layout.code, message: layout.message, errors: [] };
  const supply = opts.supply ?? record.device.rated_supply;
  const kept: Kept = {
    engine: ENGINE_VERSION,
    supply,
    blocks,
    checks,
    series: seriesMembership(record),
  };
  const output = (result: AnalysisResult): AnalysisOutput => ({
    result,
    layout: layout.layout,
    search: searchColumnsFor(record, result, features),
    timings: { ...timings },
  });
  const missingRole = missingSupplyRole(record);
  if (missingRole !== null) {
    // A board fragment with no line or neutral: drawn and checked, nothing computed, and the
    // result says so rather than "done" with empty figures.
    const gaps = record.parts.map((p) => ({
      part: p.ref,
      reason: "not simulated: there is no supply to solve against",
    }));
    return { ok: true, output: output(notSolved(kept, missingRole, null, gaps)) };
  }
  const nominal = timed("solve", () =>
    analyzeNominal(record, { supply, now, budgetMs: opts.budgetMs }),
  );
  if (!nominal.ok) return { ok: true, output: output(solverFailed(kept, nominal.error)) };
  if (opts.onNominal) {
    const cheap = timed("flags", () => nominalFlags(record, nominal.value));
    opts.onNominal(
      output(solvedResult(record, kept, nominal.value.analysis, [], cheap, "pending")),
    );
  }
  // The variants share their own budget, counted from the end of the nominal part: half for
  // the lowest-firing-supply searches, the rest (whatever they left) for the risk variants.
  const variantMs = opts.variantBudgetMs ?? DEFAULT_RISK_BUDGET_MS;
  const endAt = now() + variantMs;
  const searched = timed("solve", () =>
    searchLowestSupplies(
      record,
      nominal.value,
      { supply, now },
      makeBudget(now, variantMs * MIN_SUPPLY_BUDGET_SHARE, MAX_STEPS_PER_ANALYSIS),
    ),
  );
  if (!searched.ok) return { ok: true, output: output(solverFailed(kept, searched.error)) };
  const a = searched.value.analysis;
  const risks = timed("flags", () =>
    assessRisks(record, a, {
      now,
      budgetMs: Math.max(0, endAt - now()),
      nominal: searched.value.solved,
    }),
  );
  // Variants cut short by the budget are gaps too: the result is partial and says why.
  const gaps = [...searched.value.unfinished, ...risks.unfinished];
  return { ok: true, output: output(solvedResult(record, kept, a, gaps, risks, null)) };
}

/** The flags that need no variant, judged before the variants run (the pending result's). */
function nominalFlags(record: TeardownRecord, nominal: NominalCircuitAnalysis): RiskAssessment {
  return judgeRisks(record, nominal.analysis, unsolvedVariants(nominal.analysis, nominal.solved));
}

/** A not-solved result for a solver failure, its gaps naming where. */
function solverFailed(kept: Kept, error: SolverError): AnalysisResult {
  const { code, message, where } = error;
  return notSolved(kept, message, code, [
    ...where.parts.map((part) => ({ part, reason: message })),
    ...where.nets.map((net) => ({ net, reason: message })),
  ]);
}

/** The stored result of a solved analysis: partial when anything was left out, unsettled or still pending. */
function solvedResult(
  record: TeardownRecord,
  kept: Kept,
  a: CircuitAnalysis,
  unfinished: Gap[],
  risks: RiskAssessment,
  pending: "pending" | null,
): AnalysisResult {
  const gaps = [...a.gaps, ...unfinished];
  return {
    ...kept,
    // figures of a cycle that had not settled are not the steady state: say so
    status: gaps.length > 0 || !a.solver.converged || pending !== null ? "partial" : "complete",
    gaps,
    assumptions: [...a.assumptions, ...risks.assumptions],
    input: a.input,
    parts: a.parts,
    nets: a.nets,
    triggers: a.triggers,
    ...(a.steady_states ? { steady_states: a.steady_states } : {}),
    waveforms: selectStoredWaveforms(record, a.waveforms, a.nets, a.parts),
    linear: a.linear,
    solver: a.solver,
    flags: risks.flags.map((f) => ({ ...f })),
    comparisons: risks.comparisons,
    risk_notes: risks.notes,
    ...(pending !== null
      ? { variants: { state: "pending" as const, reason: `still to run: ${PENDING_VARIANTS}` } }
      : {}),
  };
}

/** Each resistor, capacitor, inductor and zener value's smallest IEC 60063 series, or null. */
function seriesMembership(record: TeardownRecord): Record<string, string | null> {
  const out: Record<string, string | null> = {};
  for (const p of record.parts)
    if (p.value !== null && ["resistor", "capacitor", "inductor", "zener"].includes(p.kind))
      out[p.ref] = eSeriesOf(p.value, p.kind);
  return out;
}
