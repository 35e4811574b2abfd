/**
 * The one steady-state search of the engine: the periodic steady state of a record (or of a
 * variant of it: another supply, changed part values) over its supply cycle. Every caller, the
 * nominal analysis, the lowest-firing-supply search, tolerance samples, sensitivities and
 * what-if runs, comes through `solveSteady`, so they share one budget type, one way of changing
 * a value (part-value.ts) and one warm-start rule: a variant that only changes values has the
 * nominal memory layout, and starting there settles in a few cycles instead of many.
 */
import type { Supply, TeardownRecord } from "../../record/types.js";
import { windingStartMem } from "../ac-phasor.js";
import type { Circuit } from "../circuit-model.js";
import { compileCircuit } from "../circuit-model.js";
import type { LuChoice } from "../mna.js";
import type { SteadyState } from "../periodic-steady-state.js";
import { periodicSteadyState } from "../periodic-steady-state.js";
import type { SolverOutcome } from "../solver-error.js";
import type { Budget, CycleRun } from "../transient.js";
import { MAX_NEWTON_ITERATIONS, TransientSolver } from "../transient.js";
import { withPartValues } from "./part-value.js";

/** A solved steady state: the compiled circuit, its steady cycle and the steps it took. */
export interface SteadyCircuit {
  circuit: Circuit;
  steady: SteadyState;
  steps: number;
  /** The recorded cycles of the start transient, when asked for (`watchStartCycles`). */
  startRuns?: CycleRun[];
}

/** A warm start: a cycle-start memory of the same circuit, optionally scaled to a new supply. */
export interface WarmStart {
  mem: Float64Array;
  /** Continuous states are multiplied by this (new supply / old supply); latch states are kept. */
  scale?: number;
  /** Repeat length (mains cycles) of the orbit the memory came from. */
  periodCycles?: number;
  /** Jacobian of a nearby solve's shooting map, tried before a finite-difference one... */
  jacobian?: Float64Array;
  /** ...and the cycles of that map (1 when not given). */
  jacobianCycles?: number;
}

/** What to solve besides the record: the supply, changed values, how close to settle. */
export interface SteadyRequest {
  supply: Supply;
  /** Part values to change (ref -> new value), through the one value-change rule. */
  values?: ReadonlyMap<string, number>;
  warm?: WarmStart;
  /** Loosens the settling test (> 1) where only a coarse or yes/no figure is wanted. */
  toleranceScale?: number;
  maxCycles?: number;
  lu?: LuChoice;
  maxNewtonIterations?: number;
  /** False: plain cycles only, no Newton shooting (default true). */
  shooting?: boolean;
  /** Thyristors and triacs never switch (the circuit before its first firing). */
  holdLatches?: boolean;
  /**
   * Record this many cycles from rest (a cold start, the start transient) before the
   * steady-state search, which then starts from the warm state when one is given, else from
   * where these cycles end.
   */
  watchStartCycles?: number;
}

/** The start memory: the warm state when it fits the circuit, else windings on their AC orbit, else rest. */
function startMemory(
  circuit: Circuit,
  req: SteadyRequest,
): SolverOutcome<Float64Array | undefined> {
  const warm = req.warm;
  if (warm !== undefined && warm.mem.length === circuit.memSize) {
    const scale = warm.scale ?? 1;
    if (scale === 1) return { ok: true, value: warm.mem };
    const start = warm.mem.map((v) => v * scale);
    for (const d of circuit.devices) if (d.type === "switching") start[d.mem] = warm.mem[d.mem]!;
    return { ok: true, value: start };
  }
  // Windings start on their AC orbit, not at zero current (see windingStartMem).
  if (circuit.devices.some((d) => d.type === "coupled"))
    return windingStartMem(circuit, req.lu ?? "sparse");
  return { ok: true, value: undefined };
}

/** Periodic steady state of a record, or of a variant of it, under `budget`. */
export function solveSteady(
  rec: TeardownRecord,
  req: SteadyRequest,
  budget: Budget,
): SolverOutcome<SteadyCircuit> {
  const compiled = compileCircuit(withPartValues(rec, req.values ?? new Map()), req.supply);
  if (!compiled.ok) return compiled;
  const circuit = compiled.value;
  const solver = new TransientSolver(circuit, {
    lu: req.lu ?? "sparse",
    maxNewtonIterations: req.maxNewtonIterations ?? MAX_NEWTON_ITERATIONS,
    holdLatches: req.holdLatches === true,
  });
  const start = startMemory(circuit, req);
  if (!start.ok) return start;
  // The start transient from rest, recorded cycle by cycle.
  const startRuns: CycleRun[] = [];
  let from: Float64Array | undefined = start.value;
  const watch = req.watchStartCycles ?? 0;
  if (watch > 0) {
    const rest = req.warm === undefined ? start : startMemory(circuit, { ...req, warm: undefined });
    if (!rest.ok) return rest;
    let mem = rest.value ?? new Float64Array(circuit.memSize);
    let x: Float64Array = new Float64Array(circuit.size);
    for (let k = 0; k < watch; k++) {
      const r = solver.runCycle(mem, x, true, budget);
      if (!r.ok) return r;
      startRuns.push(r.run);
      mem = r.run.endMem;
      x = r.run.endX;
    }
    if (req.warm === undefined) from = mem;
  }
  const steady = periodicSteadyState(solver, budget, from, {
    shooting: req.shooting,
    toleranceScale: req.toleranceScale,
    maxCycles: req.maxCycles,
    periodHint: req.warm?.periodCycles,
    ...(req.warm?.jacobian
      ? { jacobian: req.warm.jacobian, jacobianCycles: req.warm.jacobianCycles ?? 1 }
      : {}),
  });
  if (!steady.ok) return steady;
  return {
    ok: true,
    value: {
      circuit,
      steady: steady.value,
      steps: solver.totalSteps,
      ...(startRuns.length > 0 ? { startRuns } : {}),
    },
  };
}

/**
 * The warm start a variant of `nominal` takes: its cycle-start state, orbit length and shooting
 * Jacobian (a changed value moves the fixed point a little and the Jacobian less: Broyden
 * updates correct it, and a borrowed Jacobian that gives no step is replaced by differences).
 */
export function warmFrom(nominal: SteadyCircuit): WarmStart {
  const { startMem, periodCycles, jacobian, jacobianCycles } = nominal.steady;
  return {
    mem: startMem,
    periodCycles,
    ...(jacobian ? { jacobian, jacobianCycles: jacobianCycles ?? 1 } : {}),
  };
}
