/**
 * The risk assessment's front door: the variants solved first under one budget
 * (figures/risk-variants.ts), then every flag judged from them (flags/judge-risks.ts). Pure:
 * the clock and the seed are passed in. The unplugging rule's numbers come from the flags'
 * own rule table, so the variant runs exactly the test the flag judges.
 */
import type { TeardownRecord } from "./record/types.js";
import type { CircuitAnalysis } from "./figures/analyze-circuit.js";
import { solveRiskVariants } from "./figures/risk-variants.js";
import { DEFAULT_TOLERANCE_SAMPLES, DEFAULT_TOLERANCE_SEED } from "./figures/tolerance-bands.js";
import { riskBudget } from "./solver/variants/budget.js";
import type { RiskAssessment, RiskOptions } from "./flags/flag-types.js";
import { DISCHARGE_CAPACITANCE_THRESHOLD_F, PIN_VOLTAGE_DELAY_S } from "./flags/discharge-rules.js";
import { judgeRisks } from "./flags/judge-risks.js";

/** All risk flags and measurement comparisons of a record, given the solver's analysis at the analysed supply. */
export function assessRisks(
  record: TeardownRecord,
  analysis: CircuitAnalysis,
  opts: RiskOptions = {},
): RiskAssessment {
  const variants = solveRiskVariants(record, analysis, {
    budget: riskBudget(opts.now, opts.budgetMs),
    nominal: opts.nominal,
    unplugDelayS: PIN_VOLTAGE_DELAY_S,
    unplugAboveF: DISCHARGE_CAPACITANCE_THRESHOLD_F,
    seed: opts.seed ?? DEFAULT_TOLERANCE_SEED,
    samples: opts.samples ?? DEFAULT_TOLERANCE_SAMPLES,
  });
  return judgeRisks(record, analysis, variants);
}
