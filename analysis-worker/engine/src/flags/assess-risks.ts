/**
 * The risk assessment's front door: every flag computed from the solved circuit, and the
 * measured-versus-predicted comparisons. Pure: the clock and the seed are passed in; the
 * variants (unplugging, crest switch-on, tolerance samples, sensitivities) are re-solved inside
 * under one shared budget, and a check that cannot finish is noted, never guessed.
 */
import type { Gap } from "../record/gaps-and-assumptions.js";
import type { TeardownRecord } from "../record/types.js";
import type { SolverOutcome } from "../solver/solver-error.js";
import type { SolvedCircuit } from "../figures/solved-variant.js";
import type { CircuitAnalysis } from "../figures/analyze-circuit.js";
import { compareMeasurements } from "../figures/measurement-comparisons.js";
import { DEFAULT_TOLERANCE_SAMPLES, DEFAULT_TOLERANCE_SEED } from "../figures/tolerance-bands.js";
import type { Flag, FlagSeverity, RiskAssessment, RiskOptions } from "./flag-types.js";
import { FLAG_CODES } from "./flag-types.js";
import { accessibleMainsFlags } from "./accessible-mains.js";
import { bleederFlags } from "./bleeder-flags.js";
import { capacitorClassFlags } from "./capacitor-class.js";
import { domainNotes } from "./domain-notes.js";
import { measurementFlags } from "./measurement-flags.js";
import { overstressFlags } from "./overstress-flags.js";
import { implausibleInputFlags } from "./implausible-input.js";
import { assume, riskContext } from "./risk-context.js";
import { spacingFlags } from "./spacing-flags.js";
import { fuseFlags, surgeFlags } from "./supply-protection.js";
import { triggerFlags } from "./trigger-flags.js";
import { startStateFlags } from "./start-state-flags.js";
import { budgetSpent, riskBudget } from "../solver/variants/budget.js";
import { solveVariant } from "../figures/solved-variant.js";

const SEVERITY_ORDER: Record<FlagSeverity, number> = { danger: 0, warning: 1, info: 2 };

/** Flags ordered by severity, then code (FLAG_CODES order), then parts. */
export function compareFlags(a: Flag, b: Flag): number {
  return (
    SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity] ||
    FLAG_CODES.indexOf(a.code) - FLAG_CODES.indexOf(b.code) ||
    a.parts.join(",").localeCompare(b.parts.join(",")) ||
    a.nets.join(",").localeCompare(b.nets.join(","))
  );
}

/** Measurements whose band the spent budget cut short (fewer samples than asked for), as gaps naming the measured part or net. */
function bandsCutShort(
  record: TeardownRecord,
  checks: ReadonlyArray<{ comparison: { measurement: number }; band: { samples: number } }>,
  samples: number,
): Gap[] {
  const gaps: Gap[] = [];
  for (const c of checks) {
    if (c.band.samples >= samples) continue;
    const m = record.measurements[c.comparison.measurement]!;
    const reason = `measurements[${c.comparison.measurement}] (${m.what}): its band rests on ${c.band.samples} of ${samples} tolerance samples, the time budget ended the rest`;
    if (m.part !== null) gaps.push({ part: m.part, reason });
    else if (m.between !== null) gaps.push({ net: m.between[0], reason });
    else gaps.push({ net: Object.keys(record.nets)[0] ?? "supply", reason });
  }
  return gaps;
}

/** All risk flags and measurement comparisons of a record, given the solver's analysis at the analysed supply. */
export function assessRisks(
  record: TeardownRecord,
  analysis: CircuitAnalysis,
  opts: RiskOptions = {},
): RiskAssessment {
  const budget = riskBudget(opts.now, opts.budgetMs);
  const solvedOutcome: SolverOutcome<SolvedCircuit> = opts.nominal
    ? { ok: true, value: opts.nominal }
    : solveVariant(record, analysis.supply, budget);
  const ctx = riskContext(record, analysis, solvedOutcome.ok ? solvedOutcome.value : null, budget);
  if (!solvedOutcome.ok)
    ctx.notes.push(
      `the steady cycle could not be re-solved (${solvedOutcome.error.code}: ${solvedOutcome.error.message}); discharge, surge and measurement checks were skipped`,
    );
  const flags: Flag[] = [
    ...accessibleMainsFlags(ctx),
    ...fuseFlags(ctx),
    ...capacitorClassFlags(ctx),
    ...overstressFlags(ctx),
    ...spacingFlags(ctx),
    ...triggerFlags(ctx),
    ...startStateFlags(ctx),
    ...domainNotes(ctx),
    ...bleederFlags(ctx),
    ...surgeFlags(ctx),
  ];
  const compared = compareMeasurements(record, {
    seed: opts.seed ?? DEFAULT_TOLERANCE_SEED,
    samples: opts.samples ?? DEFAULT_TOLERANCE_SAMPLES,
    budget,
    reuse: ctx.solved ? { supply: analysis.supply, solved: ctx.solved } : null,
  });
  ctx.notes.push(...compared.notes);
  for (const a of compared.assumptions) assume(ctx, a);
  flags.push(...measurementFlags(record, compared.checks, budget));
  flags.push(...implausibleInputFlags(ctx));
  return {
    flags: flags.sort(compareFlags),
    comparisons: compared.checks.map((c) => c.comparison),
    assumptions: ctx.assumptions,
    notes: [...new Set(ctx.notes)],
    unfinished: budgetSpent(budget)
      ? bandsCutShort(record, compared.checks, opts.samples ?? DEFAULT_TOLERANCE_SAMPLES)
      : [],
  };
}
