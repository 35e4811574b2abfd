/**
 * The one budget builder of every solve: a clock deadline (enforced only when a clock is passed,
 * the engine never reads one itself) and a step cap enforced with or without a clock. The
 * nominal analysis and every variant of it (bands, hints, unplug, plug-in, firing-supply
 * search) draw on budgets built here, so a heavy record stops where its budget says.
 */
import type { Budget } from "../transient.js";

/** Default time budget of one analysis (only enforced when a clock is passed). */
export const DEFAULT_BUDGET_MS = 20_000;
/** Default time budget of a whole risk assessment's variants (enforced only with a clock). */
export const DEFAULT_RISK_BUDGET_MS = 10_000;
/** Step cap of one analysis, enforced with or without a clock. */
export const MAX_STEPS_PER_ANALYSIS = 3_000_000;
/** The variants of one assessment may take this many times the steps of one analysis. */
export const RISK_STEP_FACTOR = 20;

/** A budget that ends `budgetMs` after now on the given clock and after `steps` steps. */
export function makeBudget(
  now: (() => number) | undefined | null,
  budgetMs: number,
  steps: number,
): Budget {
  const clock = now ?? null;
  return { now: clock, deadlineMs: clock ? clock() + budgetMs : Infinity, stepsLeft: steps };
}

/** The budget of one analysis (nominal solve, linear view, lowest firing supply). */
export function analysisBudget(
  now: (() => number) | undefined,
  budgetMs: number | undefined,
): Budget {
  return makeBudget(now, budgetMs ?? DEFAULT_BUDGET_MS, MAX_STEPS_PER_ANALYSIS);
}

/** A shared budget for every variant solve of one assessment. */
export function riskBudget(now: (() => number) | undefined, budgetMs: number | undefined): Budget {
  return makeBudget(
    now,
    budgetMs ?? DEFAULT_RISK_BUDGET_MS,
    RISK_STEP_FACTOR * MAX_STEPS_PER_ANALYSIS,
  );
}

/** True when the budget's clock has passed its deadline or its steps are spent. */
export function budgetSpent(b: Budget): boolean {
  return b.stepsLeft <= 0 || (b.now !== null && b.now() > b.deadlineMs);
}
