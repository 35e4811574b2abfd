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
import { analyzeCircuitStaged } from "./figures/analyze-circuit.js";
import {
  DEFAULT_RISK_BUDGET_MS,
  MAX_STEPS_PER_ANALYSIS,
  makeBudget,
} from "./solver/variants/budget.js";
import { selectStoredWaveforms } from "./stored-waveforms.js";
import { assessRisks } from "./flags/assess-risks.js";
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
  });
}

/** Analyses a validated record. */
export async function analyzeRecord(
  record: TeardownRecord,
  opts: {
    now: () => number;
    timings?: Partial<Record<AnalysisStage, number>>;
    supply?: Supply;
    budgetMs?: number;
    variantBudgetMs?: number;
  },
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
  const kept = { engine: ENGINE_VERSION, supply, blocks, checks, series: seriesMembership(record) };
  const missingRole = missingSupplyRole(record);
  let result: AnalysisResult;
  if (missingRole !== null) {
    // A board fragment with no line or neutral: drawn and checked, nothing computed, and the
    // result says so rather than "done" with empty figures.
    result = notSolved(
      kept,
      missingRole,
      null,
      record.parts.map((p) => ({
        part: p.ref,
        reason: "not simulated: there is no supply to solve against",
      })),
    );
  } else {
    const t1 = now();
    // The cheap part first: the nominal steady state and its figures (nothing else can be
    // shown without it); the variants then share their own budget, counted from there.
    let endAt = Infinity;
    const variantBudget = () => {
      const ms = opts.variantBudgetMs ?? DEFAULT_RISK_BUDGET_MS;
      endAt = now() + ms;
      return makeBudget(now, ms * MIN_SUPPLY_BUDGET_SHARE, MAX_STEPS_PER_ANALYSIS);
    };
    const solved = analyzeCircuitStaged(
      record,
      { supply, now, budgetMs: opts.budgetMs },
      variantBudget,
    );
    timings.solve = now() - t1;
    if (!solved.ok) {
      const { code, message, where } = solved.error;
      result = notSolved(kept, message, code, [
        ...where.parts.map((part) => ({ part, reason: message })),
        ...where.nets.map((net) => ({ net, reason: message })),
      ]);
    } else {
      const a = solved.value.analysis;
      const t2 = now();
      const risks = assessRisks(record, a, {
        now,
        budgetMs: Math.max(0, endAt - now()),
        nominal: solved.value.solved,
      });
      timings.flags = now() - t2;
      // Variants cut short by the budget are gaps too: the result is partial and says why.
      const gaps = [...a.gaps, ...solved.value.unfinished, ...risks.unfinished];
      result = {
        ...kept,
        // figures of a cycle that had not settled are not the steady state: say so
        status: gaps.length > 0 || !a.solver.converged ? "partial" : "complete",
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
      };
    }
  }
  return {
    ok: true,
    output: {
      result,
      layout: layout.layout,
      search: searchColumnsFor(record, result, features),
      timings,
    },
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
