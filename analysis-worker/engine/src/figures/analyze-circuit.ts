/**
 * The solved circuit with its figures: `solveCircuit` (periodic steady state of a record at a
 * supply) and `analyzeCircuit` (the record-format result fields the solver owns: supply, input,
 * parts, nets, triggers, waveforms, the linear view and the solver's own account).
 * It sits in the figures stage because it turns the solver's steady states into figures; the
 * solver itself (solver/) never reads figures.
 */
import type { Assumption, Gap } from "../record/gaps-and-assumptions.js";
import type { Supply, TeardownRecord } from "../record/types.js";
import { ENGINE_VERSION } from "../engine-version.js";
import type { AcSolution } from "../solver/ac-phasor.js";
import { solveAcCircuit } from "../solver/ac-phasor.js";
import { THERMAL_VOLTAGE_V } from "../solver/device-models.js";
import type { LuChoice } from "../solver/mna.js";
import { GMIN_SIEMENS } from "../solver/mna.js";
import { gateMargin, lowestFiringSupply } from "../solver/min-firing-supply.js";
import type { SolverOutcome } from "../solver/solver-error.js";
import type { Budget } from "../solver/transient.js";
import { analysisBudget } from "../solver/variants/budget.js";
import type { SteadyRequest } from "../solver/variants/steady-variant.js";
import { solveSteady } from "../solver/variants/steady-variant.js";
import type { CycleFigures, FiringFigures } from "./circuit-figures.js";
import { firingFigures } from "./circuit-figures.js";
import type { SolvedCircuit } from "./solved-variant.js";
import { withFigures } from "./solved-variant.js";

export type { SolvedCircuit };

/** The lowest firing supply is bracketed to this many volts RMS. */
export const MIN_SUPPLY_RESOLUTION_V = 0.5;
/** The bisection's steady states only decide fires / does not fire: 100 times the usual tolerance (1e-3 of a state). */
export const MIN_SUPPLY_TOLERANCE_SCALE = 100;
/** Cycle cap of each bisection solve: a firing pattern that has not settled by then is judged on its last window. */
export const MIN_SUPPLY_MAX_CYCLES = 60;

/** Options of the solver's front doors. */
export interface SolveOptions {
  supply?: Supply;
  budgetMs?: number;
  /** Milliseconds clock; without one only the step cap limits the run. */
  now?: () => number;
  lu?: LuChoice;
  maxNewtonIterations?: number;
  /** Bisect each trigger's lowest firing supply (default true). */
  minSupply?: boolean;
}

/** The record-format fields the solver owns. */
export interface CircuitAnalysis {
  engine: string;
  supply: Supply;
  input: CycleFigures["input"];
  parts: CycleFigures["parts"];
  nets: CycleFigures["nets"];
  triggers: Array<{
    part: string;
    fires: boolean;
    angle_deg: number | null;
    angle_negative_deg: number | null;
    min_supply_vrms: number | null;
  }>;
  waveforms: CycleFigures["waveforms"];
  linear: AcSolution;
  /** Parts and nets left out of the simulation, and why. */
  gaps: Gap[];
  /** Every default model value the solver chose where the record was silent. */
  assumptions: Assumption[];
  solver: {
    method: "cycles" | "shooting";
    cycles: number;
    steps: number;
    /** Circuit-wide modelling choices (not tied to a part), in words. */
    assumptions: string[];
    /** Free-text remarks on how parts were modelled. */
    notes: string[];
    kcl_residual_amps: number;
    /** Estimated distance from the periodic steady state, in tolerances (≤ 1: settled). */
    periodic_residual: number;
    /**
     * False when the cycles did not settle within the cycle cap: the figures are those of the
     * last cycles, not of a steady state, and the analysis must say so rather than show them as such.
     */
    converged: boolean;
    gmin_siemens: number;
  };
}

function budgetFrom(opts: SolveOptions): Budget {
  return analysisBudget(opts.now, opts.budgetMs);
}

/** The solver choices of the options, for every steady state of one analysis. */
function solverChoices(opts: SolveOptions): Pick<SteadyRequest, "lu" | "maxNewtonIterations"> {
  return { lu: opts.lu, maxNewtonIterations: opts.maxNewtonIterations };
}

function solveWith(
  rec: TeardownRecord,
  supply: Supply,
  opts: SolveOptions,
  budget: Budget,
): SolverOutcome<SolvedCircuit> {
  const r = solveSteady(rec, { supply, ...solverChoices(opts) }, budget);
  return r.ok ? { ok: true, value: withFigures(r.value) } : r;
}

/** Periodic steady state of a record at a supply (the rated supply by default), with its figures. */
export function solveCircuit(
  rec: TeardownRecord,
  opts: SolveOptions = {},
): SolverOutcome<SolvedCircuit> {
  return solveWith(rec, opts.supply ?? rec.device.rated_supply, opts, budgetFrom(opts));
}

/** True when `f` fires in every half-cycle that `ref` fires in. */
function coversHalves(f: FiringFigures | undefined, ref: FiringFigures): boolean {
  if (f === undefined || !f.fires) return false;
  return (!ref.halves.positive || f.halves.positive) && (!ref.halves.negative || f.halves.negative);
}

/**
 * Where to look first for the lowest firing supply: a gate drive that follows the supply fires
 * where it first reaches the threshold, sin(angle) = Vth / (k·Vpk), so at the supply
 * rated·sin(angle) it reaches the threshold only at the peak. The latest required half decides;
 * the search confirms or corrects the guess, so a trigger of another kind only costs a trial.
 */
function firstGuess(rated: number, f: FiringFigures): number | undefined {
  const angles: number[] = [];
  if (f.halves.positive && f.angle_deg !== null) angles.push(f.angle_deg);
  if (f.halves.negative && f.angle_negative_deg !== null) angles.push(f.angle_negative_deg);
  if (angles.length === 0) return undefined;
  const latest = Math.max(...angles);
  if (!(latest > 0 && latest < 90)) return undefined;
  return rated * Math.sin((latest * Math.PI) / 180);
}

/** The triggers of a solved circuit, each with its lowest firing supply when asked for. */
interface TriggerSearch {
  triggers: CircuitAnalysis["triggers"];
  steps: number;
  cycles: number;
  /** Triggers whose lowest firing supply was not found, and why (a budget that ran out, a failed solve). */
  unfinished: Gap[];
}

/**
 * The lowest firing supply of one trigger: a bracket on the supply voltage, first probed around
 * a guess from the firing angle, then narrowed by bisection steered by the gate margin; the
 * answer fires in every half it fires in at the rated supply. Every trial starts from the
 * nearest supply already solved (the nominal first), its state scaled by the amplitude ratio,
 * and reuses the last one-cycle Jacobian, so it settles in a few cycles.
 */
function minSupplyOf(
  rec: TeardownRecord,
  solved: SolvedCircuit,
  f: FiringFigures,
  opts: SolveOptions,
  budget: Budget,
): SolverOutcome<{ vrms: number; steps: number; cycles: number }> {
  const supply = solved.circuit.supply;
  const solvedStarts = [{ vrms: supply.vrms, mem: solved.steady.startMem }];
  let jacobian = solved.steady.jacobian;
  let jacobianCycles = solved.steady.jacobianCycles ?? 1;
  let steps = 0;
  let cycles = 0;
  const found = lowestFiringSupply(
    supply.vrms,
    MIN_SUPPLY_RESOLUTION_V,
    (v) => {
      let near = solvedStarts[0]!;
      for (const s of solvedStarts) if (Math.abs(s.vrms - v) < Math.abs(near.vrms - v)) near = s;
      const r = solveSteady(
        rec,
        {
          supply: { vrms: v, hz: supply.hz },
          warm: {
            mem: near.mem,
            scale: v / near.vrms,
            ...(jacobian ? { jacobian, jacobianCycles } : {}),
          },
          toleranceScale: MIN_SUPPLY_TOLERANCE_SCALE,
          maxCycles: MIN_SUPPLY_MAX_CYCLES,
          ...solverChoices(opts),
        },
        budget,
      );
      if (!r.ok) return r;
      if (r.value.steady.jacobian) {
        jacobian = r.value.steady.jacobian;
        jacobianCycles = r.value.steady.jacobianCycles ?? 1;
      }
      solvedStarts.push({ vrms: v, mem: r.value.steady.startMem });
      steps += r.value.steps;
      cycles += r.value.steady.cycles;
      const fires = coversHalves(
        firingFigures(r.value.circuit, r.value.steady).find((g) => g.part === f.part),
        f,
      );
      return {
        ok: true,
        value: {
          fires,
          margin: fires ? null : gateMargin(r.value.circuit, r.value.steady, f.part, f.halves),
        },
      };
    },
    firstGuess(supply.vrms, f),
  );
  return found.ok ? { ok: true, value: { vrms: found.value.vrms, steps, cycles } } : found;
}

/**
 * The triggers of a solved circuit with their lowest firing supply. `strict`: a failed search
 * fails the whole call (the one-call analysis); otherwise the trigger keeps a null lowest supply
 * and the failure is returned as a gap, so the rest of the analysis is kept.
 */
function searchTriggers(
  rec: TeardownRecord,
  solved: SolvedCircuit,
  opts: SolveOptions,
  budget: Budget,
  strict: boolean,
): SolverOutcome<TriggerSearch> {
  const out: TriggerSearch = { triggers: [], steps: 0, cycles: 0, unfinished: [] };
  for (const f of solved.figures.firings) {
    let minSupply: number | null = null;
    if (f.fires && opts.minSupply !== false) {
      const found = minSupplyOf(rec, solved, f, opts, budget);
      if (found.ok) {
        minSupply = found.value.vrms;
        out.steps += found.value.steps;
        out.cycles += found.value.cycles;
      } else if (strict) return found;
      else
        out.unfinished.push({
          part: f.part,
          reason: `lowest firing supply not computed: ${found.error.message} (${found.error.code})`,
        });
    }
    out.triggers.push({
      part: f.part,
      fires: f.fires,
      angle_deg: f.angle_deg,
      angle_negative_deg: f.angle_negative_deg,
      min_supply_vrms: minSupply,
    });
  }
  return { ok: true, value: out };
}

/** The record-format fields of a solved circuit, its linear view and its triggers. */
function circuitAnalysis(
  solved: SolvedCircuit,
  linear: AcSolution,
  search: TriggerSearch,
): CircuitAnalysis {
  const { circuit, steady, figures } = solved;
  return {
    engine: ENGINE_VERSION,
    supply: circuit.supply,
    input: figures.input,
    parts: figures.parts,
    nets: figures.nets,
    triggers: search.triggers,
    waveforms: figures.waveforms,
    linear,
    gaps: circuit.gaps,
    assumptions: circuit.assumptions,
    solver: {
      method: steady.method,
      cycles: steady.cycles + search.cycles,
      steps: solved.steps + search.steps,
      assumptions: [
        `gmin ${GMIN_SIEMENS} S from every net to ${circuit.reference}`,
        `junctions at 300 K (thermal voltage ${THERMAL_VOLTAGE_V} V)`,
      ],
      notes: circuit.notes,
      kcl_residual_amps: figures.kclResidualAmps,
      periodic_residual: steady.residual,
      converged: steady.converged,
      gmin_siemens: GMIN_SIEMENS,
    },
  };
}

/** Full analysis: AC linear view, periodic steady state, figures, triggers with their lowest firing supply. */
export function analyzeCircuit(
  rec: TeardownRecord,
  opts: SolveOptions = {},
): SolverOutcome<CircuitAnalysis> {
  const supply = opts.supply ?? rec.device.rated_supply;
  const budget = budgetFrom(opts);
  const solved = solveWith(rec, supply, opts, budget);
  if (!solved.ok) return solved;
  const linear = solveAcCircuit(solved.value.circuit, opts.lu ?? "sparse");
  if (!linear.ok) return linear;
  const search = searchTriggers(rec, solved.value, opts, budget, true);
  if (!search.ok) return search;
  return { ok: true, value: circuitAnalysis(solved.value, linear.value, search.value) };
}

/** The staged analysis: the nominal part, and what the variants left unfinished. */
export interface StagedCircuitAnalysis {
  analysis: CircuitAnalysis;
  /** The nominal solve, for the variants that start from it (bands, hints, unplug, plug-in). */
  solved: SolvedCircuit;
  /** What a variant could not finish within its budget, and why. */
  unfinished: Gap[];
}

/**
 * The analysis in two budgets: the cheap nominal part (steady state, figures, linear view)
 * under `opts.budgetMs`, then the lowest-firing-supply searches under `variantBudget()`. A search
 * that runs out of its budget leaves that trigger's lowest supply null and says why, instead of
 * failing the whole analysis.
 */
export function analyzeCircuitStaged(
  rec: TeardownRecord,
  opts: SolveOptions,
  /** Built once the nominal part is done, so the variants get what it left. */
  variantBudget: () => Budget,
): SolverOutcome<StagedCircuitAnalysis> {
  const supply = opts.supply ?? rec.device.rated_supply;
  const solved = solveWith(rec, supply, opts, budgetFrom(opts));
  if (!solved.ok) return solved;
  const linear = solveAcCircuit(solved.value.circuit, opts.lu ?? "sparse");
  if (!linear.ok) return linear;
  const search = searchTriggers(rec, solved.value, opts, variantBudget(), false);
  if (!search.ok) return search;
  return {
    ok: true,
    value: {
      analysis: circuitAnalysis(solved.value, linear.value, search.value),
      solved: solved.value,
      unfinished: search.value.unfinished,
    },
  };
}
