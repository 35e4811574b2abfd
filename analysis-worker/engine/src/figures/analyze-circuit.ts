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
import type { SolverOutcome } from "../solver/solver-error.js";
import type { Budget } from "../solver/transient.js";
import { analysisBudget } from "../solver/variants/budget.js";
import type { SteadyRequest } from "../solver/variants/steady-variant.js";
import { solveSteady } from "../solver/variants/steady-variant.js";
import type { CycleFigures } from "./circuit-figures.js";
import { lowestFiringSupplies } from "./lowest-firing-supplies.js";
import type { StartState, StateTrigger } from "./start-states.js";
import { runningState, startState, statesDiffer } from "./start-states.js";
import type { SolvedCircuit } from "./solved-variant.js";
import { withFigures } from "./solved-variant.js";

export type { SolvedCircuit };

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
    /** Lowest supply at which it keeps firing as the supply sags (while running). */
    min_supply_vrms: number | null;
    /** Lowest supply at which it starts firing from cold. */
    min_supply_cold_vrms: number | null;
    /** The trigger in the state kept while running, when that state differs from the cold start's. */
    running?: StateTrigger;
  }>;
  /** The cold-start and the running steady state, when they differ (start-states.ts); the other figures are the cold start's. */
  steady_states?: StartState[];
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

/** The triggers of a solved circuit, each with its lowest firing supply when asked for. */
interface TriggerSearch {
  triggers: CircuitAnalysis["triggers"];
  /** Both steady states, when the running one differs from the cold start's. */
  states?: StartState[];
  steps: number;
  cycles: number;
  /** Triggers whose lowest firing supply was not found, and why (a budget that ran out, a failed solve). */
  unfinished: Gap[];
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
  const choices = solverChoices(opts);
  for (const f of solved.figures.firings) {
    let lowest: { running: number; cold: number } | null = null;
    if (f.fires && opts.minSupply !== false) {
      const found = lowestFiringSupplies(rec, solved, f, choices, budget);
      if (found.ok) {
        lowest = found.value;
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
      min_supply_vrms: lowest?.running ?? null,
      min_supply_cold_vrms: lowest?.cold ?? null,
    });
  }
  // The state kept while running, beside the cold start's, for a circuit with a trigger.
  if (opts.minSupply !== false && solved.figures.firings.length > 0) {
    const run = runningState(rec, solved, choices, budget);
    if (run.ok) {
      out.steps += run.value.steps;
      out.cycles += run.value.cycles;
      const cold = startState(solved, "cold", null);
      const running = startState(run.value.state, "running", run.value.fromVrms);
      if (statesDiffer(cold, running)) {
        out.states = [cold, running];
        for (const t of out.triggers) {
          const r = running.triggers.find((q) => q.part === t.part);
          if (r) t.running = r;
        }
      }
    } else if (!strict)
      out.unfinished.push({
        part: solved.figures.firings[0]!.part,
        reason: `steady state while running not computed: ${run.error.message} (${run.error.code})`,
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
    ...(search.states ? { steady_states: search.states } : {}),
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

/** The cheap nominal part of an analysis: what can be shown before any variant runs. */
export interface NominalCircuitAnalysis {
  /** The record-format fields, each trigger's lowest firing supply still null. */
  analysis: CircuitAnalysis;
  /** The nominal solve, for the variants that start from it (bands, hints, unplug, plug-in). */
  solved: SolvedCircuit;
  linear: AcSolution;
}

/**
 * The nominal part under `opts.budgetMs`: the steady state, its figures and the linear view, the
 * triggers with their firing angles but no lowest firing supply (that search is a variant).
 */
export function analyzeNominal(
  rec: TeardownRecord,
  opts: SolveOptions,
): SolverOutcome<NominalCircuitAnalysis> {
  const supply = opts.supply ?? rec.device.rated_supply;
  const solved = solveWith(rec, supply, opts, budgetFrom(opts));
  if (!solved.ok) return solved;
  const linear = solveAcCircuit(solved.value.circuit, opts.lu ?? "sparse");
  if (!linear.ok) return linear;
  // With minSupply off the search only lists the triggers: no budget is spent.
  const listed = searchTriggers(
    rec,
    solved.value,
    { ...opts, minSupply: false },
    budgetFrom(opts),
    false,
  );
  if (!listed.ok) return listed;
  return {
    ok: true,
    value: {
      analysis: circuitAnalysis(solved.value, linear.value, listed.value),
      solved: solved.value,
      linear: linear.value,
    },
  };
}

/** The nominal analysis completed with each trigger's lowest firing supply, and what the searches left unfinished. */
export interface StagedCircuitAnalysis {
  analysis: CircuitAnalysis;
  solved: SolvedCircuit;
  /** What a variant could not finish within its budget, and why. */
  unfinished: Gap[];
}

/**
 * The lowest-firing-supply searches of a nominal analysis, under their own budget. A search
 * that runs out of it leaves that trigger's lowest supply null and says why, instead of failing
 * the whole analysis.
 */
export function searchLowestSupplies(
  rec: TeardownRecord,
  nominal: NominalCircuitAnalysis,
  opts: SolveOptions,
  budget: Budget,
): SolverOutcome<StagedCircuitAnalysis> {
  const search = searchTriggers(rec, nominal.solved, opts, budget, false);
  if (!search.ok) return search;
  return {
    ok: true,
    value: {
      analysis: circuitAnalysis(nominal.solved, nominal.linear, search.value),
      solved: nominal.solved,
      unfinished: search.value.unfinished,
    },
  };
}
