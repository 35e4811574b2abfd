/**
 * Re-solving a record with some part values changed (tolerance samples, sensitivities, the value
 * that explains a measurement), built on the solver's exported pieces so a variant can start from
 * the nominal steady state: the memory layout is the same when only values change, and a warm
 * start settles in a few cycles instead of many.
 */
import type { Part, Supply, TeardownRecord } from "../record/types.js";
import type { SolvedCircuit } from "../solver/analyze-circuit.js";
import { MAX_STEPS_PER_ANALYSIS } from "../solver/analyze-circuit.js";
import { cycleFigures } from "../figures/circuit-figures.js";
import { compileCircuit } from "../solver/circuit-model.js";
import { periodicSteadyState } from "../solver/periodic-steady-state.js";
import type { SolverOutcome } from "../solver/solver-error.js";
import type { Budget } from "../solver/transient.js";
import { MAX_NEWTON_ITERATIONS, TransientSolver } from "../solver/transient.js";

/** Default time budget of a whole risk assessment (enforced only when a clock is passed). */
export const DEFAULT_RISK_BUDGET_MS = 10_000;

/** Where a part keeps the value that tolerances vary: its main value, or a load's model r or c. */
export type ValueSlot = "value" | "model.r" | "model.c";

/** The varied value of a part and where it lives, or null for a part with none. */
export function partValueOf(p: Part): { slot: ValueSlot; value: number } | null {
  if (p.kind === "load") {
    if (p.model.r !== undefined) return { slot: "model.r", value: p.model.r };
    if (p.model.c !== undefined) return { slot: "model.c", value: p.model.c };
    return null;
  }
  if (
    ["resistor", "capacitor", "inductor", "zener", "varistor"].includes(p.kind) &&
    p.value !== null &&
    p.value > 0
  )
    return { slot: "value", value: p.value };
  return null;
}

/** The part with its varied value replaced. */
export function withPartValue(p: Part, value: number): Part {
  const slot = partValueOf(p)?.slot;
  if (slot === "model.r") return { ...p, model: { ...p.model, r: value } };
  if (slot === "model.c") return { ...p, model: { ...p.model, c: value } };
  return { ...p, value, value_text: String(value) };
}

/** The record with the given parts' values replaced (ref -> new value). */
export function withPartValues(
  rec: TeardownRecord,
  values: ReadonlyMap<string, number>,
): TeardownRecord {
  return {
    ...rec,
    parts: rec.parts.map((p) => (values.has(p.ref) ? withPartValue(p, values.get(p.ref)!) : p)),
  };
}

/** A shared budget for every solve of one assessment. */
export function riskBudget(now: (() => number) | undefined, budgetMs: number | undefined): Budget {
  const clock = now ?? null;
  return {
    now: clock,
    deadlineMs: clock ? clock() + (budgetMs ?? DEFAULT_RISK_BUDGET_MS) : Infinity,
    stepsLeft: 20 * MAX_STEPS_PER_ANALYSIS,
  };
}

/** True when the budget's clock has passed its deadline or its steps are spent. */
export function budgetSpent(b: Budget): boolean {
  return b.stepsLeft <= 0 || (b.now !== null && b.now() > b.deadlineMs);
}

/**
 * Steady-state tolerance of a Monte Carlo sample, as a multiple of the solver's own: 1e-4 of a
 * state per cycle, far inside the spread of the part tolerances that the samples explore.
 */
export const SAMPLE_TOLERANCE_SCALE = 10;
/** Cycle cap of a Monte Carlo sample: a firing pattern not settled by then is taken over its nearest-repeating window. */
export const SAMPLE_MAX_CYCLES = 100;

/**
 * Periodic steady state of a record at a supply, warm-started from `warm` when given;
 * `toleranceScale` loosens the settling test, `periodHint` is the warm state's repeat length.
 */
export function solveVariant(
  rec: TeardownRecord,
  supply: Supply,
  budget: Budget,
  warm?: Float64Array,
  opts: { toleranceScale?: number; maxCycles?: number; periodHint?: number } = {},
): SolverOutcome<SolvedCircuit> {
  const compiled = compileCircuit(rec, supply);
  if (!compiled.ok) return compiled;
  const circuit = compiled.value;
  const solver = new TransientSolver(circuit, {
    lu: "sparse",
    maxNewtonIterations: MAX_NEWTON_ITERATIONS,
  });
  const start = warm !== undefined && warm.length === circuit.memSize ? warm : undefined;
  const steady = periodicSteadyState(solver, budget, start, {
    toleranceScale: opts.toleranceScale,
    maxCycles: opts.maxCycles,
    periodHint: opts.periodHint,
  });
  if (!steady.ok) return steady;
  return {
    ok: true,
    value: {
      circuit,
      steady: steady.value,
      figures: cycleFigures(circuit, steady.value),
      steps: solver.totalSteps,
    },
  };
}
