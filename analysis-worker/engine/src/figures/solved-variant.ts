/**
 * A steady state with its figures: the solver's one steady-state search (solver/variants)
 * followed by the figures of the cycle it found. Bands, hints and what-if runs use this; the
 * solver itself never computes figures.
 */
import type { Supply, TeardownRecord } from "../record/types.js";
import type { SolverOutcome } from "../solver/solver-error.js";
import type { Budget } from "../solver/transient.js";
import type { SteadyCircuit, SteadyRequest } from "../solver/variants/steady-variant.js";
import { solveSteady } from "../solver/variants/steady-variant.js";
import type { CycleFigures } from "./circuit-figures.js";
import { cycleFigures } from "./circuit-figures.js";

/** A solved circuit: compiled model, steady cycle and figures. */
export interface SolvedCircuit extends SteadyCircuit {
  figures: CycleFigures;
}

/**
 * Steady-state tolerance of a Monte Carlo sample, as a multiple of the solver's own: 1e-4 of a
 * state per cycle, far inside the spread of the part tolerances that the samples explore.
 */
export const SAMPLE_TOLERANCE_SCALE = 10;
/** Cycle cap of a Monte Carlo sample: a firing pattern not settled by then is taken over its nearest-repeating window. */
export const SAMPLE_MAX_CYCLES = 100;

/**
 * The steady circuit with the figures of its steady cycle, computed on first read: a tolerance
 * sample or a sensitivity that reads one net's voltage never pays for the line-current FFT,
 * every part's figures and the waveforms.
 */
export function withFigures(s: SteadyCircuit): SolvedCircuit {
  let figures: CycleFigures | undefined;
  return {
    ...s,
    get figures(): CycleFigures {
      figures ??= cycleFigures(s.circuit, s.steady);
      return figures;
    },
  };
}

/** The steady state of a request, with its figures. */
export function solveWithFigures(
  rec: TeardownRecord,
  req: SteadyRequest,
  budget: Budget,
): SolverOutcome<SolvedCircuit> {
  const s = solveSteady(rec, req, budget);
  return s.ok ? { ok: true, value: withFigures(s.value) } : s;
}

/**
 * Periodic steady state of a record at a supply with its figures, warm-started from `warm`
 * when given (a cycle-start memory of the same circuit); `toleranceScale` loosens the settling
 * test, `periodHint` is the warm state's repeat length.
 */
export function solveVariant(
  rec: TeardownRecord,
  supply: Supply,
  budget: Budget,
  warm?: Float64Array,
  opts: { toleranceScale?: number; maxCycles?: number; periodHint?: number } = {},
): SolverOutcome<SolvedCircuit> {
  return solveWithFigures(
    rec,
    {
      supply,
      toleranceScale: opts.toleranceScale,
      maxCycles: opts.maxCycles,
      ...(warm ? { warm: { mem: warm, periodCycles: opts.periodHint } } : {}),
    },
    budget,
  );
}
