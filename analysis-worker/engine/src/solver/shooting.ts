/**
 * Shooting for the periodic steady state: Newton on F(s) = Phi(s) - s, s the continuous
 * cycle-start states and Phi the one-cycle (or k-cycle) map, with a finite-difference Jacobian,
 * Broyden updates and step halving. The caller measures changes and steps in its tolerances.
 */
import { DenseLu } from "./dense-lu.js";
import type { SolverError } from "./solver-error.js";
import type { CycleRun } from "./transient.js";

/** Cap on shooting (Newton) iterations. */
export const SHOOTING_MAX_ITERATIONS = 25;
/** Relative finite-difference perturbation of a state for the Jacobian (well above the map's noise). */
export const SHOOTING_FD_RELATIVE = 1e-4;
/**
 * The same for a winding current, larger: a winding's DC (flux) offset decays only through its
 * resistance, by a fraction R·T/L per cycle (2e-4 for 10 H and 0.1 Ω), and the one-cycle map
 * shows so small a decay above its noise only for a perturbation of about 1% of the current.
 * The offset is linear (the winding is), so the larger step costs no accuracy.
 */
export const SHOOTING_FD_RELATIVE_AMP = 1e-2;
/** Halvings of a shooting step before the try is given up. */
export const SHOOTING_LINE_SEARCH_TRIES = 6;

/** A slot of the cycle-start state: a capacitor voltage, a winding current or a latch. */
export interface Slot {
  index: number;
  kind: "volt" | "amp" | "latch";
}

/** One run of the cycle map from a start state. */
export type CycleFn = (
  start: Float64Array,
  record: boolean,
) => { ok: true; run: CycleRun } | { ok: false; error: SolverError };

/**
 * Newton on F(s) = Phi(s) - s over the continuous states; null mem when it does not succeed.
 * A given Jacobian `jac0` saves the finite-difference one; when its step fails, the
 * finite-difference Jacobian is taken after all.
 */
export function shoot(
  vpk: number,
  cycle: CycleFn,
  base: Float64Array,
  cont: Slot[],
  change: (a: Float64Array, b: Float64Array) => number,
  stepSize: (at: Float64Array, step: Float64Array) => number,
  jac0: Float64Array | null,
):
  | {
      ok: true;
      mem: Float64Array | null;
      best: Float64Array;
      jac: Float64Array;
      /** Normalised size of the Newton step still left at the returned state. */
      distance: number;
      /** The recorded run from `mem`, when there is one. */
      run?: CycleRun | null;
    }
  | { ok: false; error: SolverError } {
  const m = cont.length;
  let latches = base.slice();
  const inject = (s: Float64Array): Float64Array => {
    const mem = latches.slice();
    cont.forEach((slot, k) => (mem[slot.index] = s[k]!));
    return mem;
  };
  type Eval = {
    ok: true;
    f: Float64Array;
    end: Float64Array;
    start: Float64Array;
    /** The run itself, when recorded: the state Newton accepts is then the steady window as it stands. */
    run: CycleRun | null;
  };
  // Candidate states are recorded (the last one is the steady window, so it is not run again);
  // the finite-difference columns are not.
  const evalF = (s: Float64Array, record = true): Eval | { ok: false; error: SolverError } => {
    const r = cycle(inject(s), record);
    if (!r.ok) return r;
    const f = Float64Array.from(cont, (slot, k) => r.run.endMem[slot.index]! - s[k]!);
    return {
      ok: true as const,
      f,
      end: r.run.endMem,
      start: inject(s),
      run: record ? r.run : null,
    };
  };
  let s: Float64Array = Float64Array.from(cont, (slot) => base[slot.index]!);
  const first = evalF(s);
  if (!first.ok) return first;
  let cur: Eval = first;
  // Finite-difference Jacobian of F, once; Broyden rank-one updates afterwards.
  const jac = new Float64Array(m * m);
  const differences = (): { ok: true } | { ok: false; error: SolverError } => {
    for (let k = 0; k < m; k++) {
      const delta =
        cont[k]!.kind === "volt"
          ? SHOOTING_FD_RELATIVE * Math.max(Math.abs(s[k]!), 0.01 * vpk)
          : SHOOTING_FD_RELATIVE_AMP * Math.max(Math.abs(s[k]!), 1e-3);
      const sp = s.slice();
      sp[k]! += delta;
      const fp = evalF(sp, false);
      if (!fp.ok) return fp;
      for (let i = 0; i < m; i++) jac[i * m + k] = (fp.f[i]! - cur.f[i]!) / delta;
    }
    return { ok: true };
  };
  let borrowed = jac0 !== null && jac0.length === m * m;
  if (borrowed) jac.set(jac0!);
  else {
    const fd = differences();
    if (!fd.ok) return fd;
  }
  // A borrowed Jacobian that gives no useful step is replaced by finite differences, once.
  const replace = (): { ok: true } | { ok: false; error: SolverError } => {
    borrowed = false;
    return differences();
  };
  const rows = Int32Array.from({ length: m * m }, (_, q) => Math.floor(q / m));
  const cols = Int32Array.from({ length: m * m }, (_, q) => q % m);
  const lu = new DenseLu(m, rows, cols);
  let distance = Infinity;
  for (let iter = 0; iter < SHOOTING_MAX_ITERATIONS; iter++) {
    const settled = change(cur.start, cur.end);
    if (settled === Infinity) {
      // A latch ends the cycle in another state than it started: start from the end's latches.
      latches = cur.end.slice();
      const again = evalF(s);
      if (!again.ok) return again;
      cur = again;
      continue;
    }
    if (!lu.factor(jac).ok) {
      // No Newton step to measure: a cycle within tolerance is taken as it stands.
      if (settled <= 1)
        return { ok: true, mem: cur.start, best: cur.end, jac, distance: settled, run: cur.run };
      if (!borrowed) return { ok: true, mem: null, best: cur.end, jac, distance };
      const fd = replace();
      if (!fd.ok) return fd;
      continue;
    }
    const step = lu.solve(cur.f.map((v: number) => -v));
    // Settled when the cycle changes within tolerance and Newton has no step left to take: a
    // slow mode changes little per cycle yet may still be far from its fixed point.
    distance = Math.max(settled, stepSize(s, step));
    if (distance <= 1)
      return { ok: true, mem: cur.start, best: cur.end, jac, distance, run: cur.run };
    let lambda = 1;
    let next: Eval | null = null;
    let sNext = s;
    const norm = (f: Float64Array) => Math.hypot(...f);
    for (let tries = 0; tries < SHOOTING_LINE_SEARCH_TRIES; tries++) {
      sNext = s.map((v, k) => v + lambda * step[k]!);
      const trial = evalF(sNext);
      if (!trial.ok) return trial;
      // Near the fixed point the mismatch is at the map's noise and need not fall; a step
      // that keeps the cycle within tolerance still closes in on the slow mode.
      if (norm(trial.f) < norm(cur.f) || (settled <= 1 && change(trial.start, trial.end) <= 1)) {
        next = trial;
        break;
      }
      lambda /= 2;
    }
    // No step along the Newton direction reduces the mismatch: the map has no fixed point
    // near here (often a subharmonic orbit); plain cycling takes over.
    if (next === null) {
      if (!borrowed) return { ok: true, mem: null, best: cur.end, jac, distance };
      const fd = replace();
      if (!fd.ok) return fd;
      continue;
    }
    // Broyden: J += (dF - J ds) ds^T / (ds^T ds).
    const ds = sNext.map((v, k) => v - s[k]!);
    const df = next.f.map((v, k) => v - cur.f[k]!);
    const dsds = ds.reduce((a, v) => a + v * v, 0);
    if (dsds > 0) {
      for (let i = 0; i < m; i++) {
        let jds = 0;
        for (let k = 0; k < m; k++) jds += jac[i * m + k]! * ds[k]!;
        const u = (df[i]! - jds) / dsds;
        for (let k = 0; k < m; k++) jac[i * m + k]! += u * ds[k]!;
      }
    }
    s = sNext;
    cur = next;
  }
  // Out of iterations: the last state counts only when it also leaves no step to take.
  return {
    ok: true,
    mem: distance <= 1 ? cur.start : null,
    best: cur.end,
    jac,
    distance,
    run: distance <= 1 ? cur.run : null,
  };
}
