/**
 * The worst plug-in: switched on at the supply crest with every capacitor discharged and every
 * winding at rest. The circuit is the compiled one with its supply's phase set to start at the
 * crest (v = V̂·cos ωt from t = 0); the run steps it with backward Euler (the damped method the
 * solver uses after a switching event), steps that start small and grow, and records the peak
 * current of the parts that take the surge. The cycle runner is not used: it places its
 * breakpoints at a zero-phase supply's zero crossings, and this window has none.
 */
import type { Circuit, CircuitDevice } from "../circuit-model.js";
import type { SolverOutcome } from "../solver-error.js";
import { solverFailure } from "../solver-error.js";
import type { Budget } from "../transient.js";
import { MAX_NEWTON_ITERATIONS, TransientSolver } from "../transient.js";
import { terminalCurrents } from "../transient-stamps.js";
import type { SteadyCircuit } from "./steady-variant.js";

/** First step after the switch-on, in seconds (short against any RC of a surge path). */
export const SURGE_FIRST_STEP_S = 1e-7;
/** Step growth per accepted step. */
export const SURGE_STEP_GROWTH = 1.5;
/** Largest step, as a fraction of the supply period. */
export const SURGE_MAX_STEP_PER_PERIOD = 1 / 400;
/** Smallest step before the run is given up, in seconds. */
export const SURGE_MIN_STEP_S = 1e-13;

/** Peak current of each watched part during the first quarter cycle after a crest switch-on. */
export interface SurgeRun {
  peak_a: Record<string, number>;
  /** Time of each peak after switch-on (s). */
  at_s: Record<string, number>;
  window_s: number;
}

/** The compiled circuit with its supply starting at the positive crest at t = 0. */
export function crestStartCircuit(c: Circuit): Circuit {
  return {
    ...c,
    devices: c.devices.map((d) => (d.type === "supply" ? { ...d, phase: Math.PI / 2 } : d)),
  };
}

/** Simulates the crest switch-on for a quarter period and returns the watched parts' peak currents. */
export function simulateCrestSwitchOn(
  solved: SteadyCircuit,
  watch: ReadonlySet<string>,
  budget: Budget,
): SolverOutcome<SurgeRun> {
  const c = crestStartCircuit(solved.circuit);
  const solver = new TransientSolver(c, {
    lu: "sparse",
    maxNewtonIterations: MAX_NEWTON_ITERATIONS,
  });
  const period = 1 / c.supply.hz;
  const window = period / 4;
  const hMax = period * SURGE_MAX_STEP_PER_PERIOD;
  const devices = c.devices.filter((d): d is CircuitDevice => watch.has(d.ref));
  let x: Float64Array = new Float64Array(c.size);
  let mem: Float64Array = new Float64Array(c.memSize);
  const peak: Record<string, number> = {};
  const at: Record<string, number> = {};
  for (const d of devices) {
    peak[d.ref] = 0;
    at[d.ref] = 0;
  }
  let t = 0;
  let h = SURGE_FIRST_STEP_S;
  while (t < window * (1 - 1e-12)) {
    if (budget.stepsLeft-- <= 0)
      return solverFailure("step-limit", "the step limit was reached in the plug-in run", {
        time_s: t,
      });
    if (budget.now && budget.now() > budget.deadlineMs)
      return solverFailure("time-budget", "the plug-in run ran out of time", { time_s: t });
    const hTry = Math.min(h, window - t);
    const out = solver.step(t + hTry, hTry, false, x, mem);
    if (!out.ok) {
      h = hTry / 4;
      if (h < SURGE_MIN_STEP_S)
        return solverFailure(
          "no-convergence",
          "Newton-Raphson did not converge in the plug-in run",
          { time_s: t },
        );
      continue;
    }
    t += hTry;
    x = out.x;
    mem = out.work;
    for (const d of devices) {
      const i = Math.abs(terminalCurrents(d, x, mem)[0]!);
      if (i > peak[d.ref]!) {
        peak[d.ref] = i;
        at[d.ref] = t;
      }
    }
    h = Math.min(hTry * SURGE_STEP_GROWTH, hMax);
  }
  return { ok: true, value: { peak_a: peak, at_s: at, window_s: window } };
}
