/**
 * The risk checks over solved results: every flag of a record, judged from the analysis at the
 * analysed supply and the variants solved before the checks (figures/risk-variants.ts). Nothing
 * here simulates or spends a budget; a variant that did not finish is noted, never guessed.
 */
import type { TeardownRecord } from "../record/types.js";
import type { CircuitAnalysis } from "../figures/analyze-circuit.js";
import type { RiskVariants } from "../figures/risk-variants.js";
import type { Flag, FlagSeverity, RiskAssessment } from "./flag-types.js";
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

/** All risk flags and measurement comparisons of a record, read off its analysis and solved variants. */
export function judgeRisks(
  record: TeardownRecord,
  analysis: CircuitAnalysis,
  variants: RiskVariants,
): RiskAssessment {
  const ctx = riskContext(record, analysis, variants);
  if (variants.solveFailure !== null) ctx.notes.push(variants.solveFailure);
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
  ctx.notes.push(...variants.notes);
  for (const a of variants.assumptions) assume(ctx, a);
  flags.push(...measurementFlags(record, variants));
  flags.push(...implausibleInputFlags(ctx));
  return {
    flags: flags.sort(compareFlags),
    comparisons: variants.checks.map((c) => c.comparison),
    assumptions: ctx.assumptions,
    notes: [...new Set(ctx.notes)],
    unfinished: variants.unfinished,
  };
}
