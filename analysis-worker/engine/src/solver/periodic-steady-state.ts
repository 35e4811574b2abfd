/**
 * Periodic steady state: the cycle-start state (capacitor voltages, winding currents, latch
 * states) that the one-cycle map sends back to itself. Plain cycling when it settles fast;
 * shooting (Newton on the start state with a finite-difference Jacobian of the one-cycle map,
 * Broyden updates and step halving) when a large capacitor settles over many cycles.
 */
import type { CircuitDevice } from "./circuit-model.js";
import { DenseLu } from "./dense-lu.js";
import type { SolverError } from "./solver-error.js";
import type { Budget, CycleRun, TransientSolver } from "./transient.js";

/**
 * A state is settled when its cycle-to-cycle change is below this fraction of its size (the
 * one-cycle map itself carries Newton and step-control noise of about 1e-7 of a state)...
 */
export const PSS_RELTOL = 1e-5;
/** ...plus these floors: a fraction of the supply peak for voltages, amps for currents. */
export const PSS_VOLT_ABSTOL_PER_VPK = 1e-6;
export const PSS_AMP_ABSTOL_A = 1e-8;
/** Cap on plain cycles. */
export const PSS_MAX_CYCLES = 300;
/** Plain cycles before deciding whether shooting is worth it. */
export const PSS_WARMUP_CYCLES = 3;
/** Cap on shooting (Newton) iterations. */
export const SHOOTING_MAX_ITERATIONS = 25;
/** Relative finite-difference perturbation of a state for the Jacobian (well above the map's noise). */
export const SHOOTING_FD_RELATIVE = 1e-4;

/** How the steady state was reached and the recorded steady cycle. */
export interface SteadyState {
  method: "cycles" | "shooting";
  /** Cycles simulated in all (including the Jacobian's). */
  cycles: number;
  /** The recorded steady cycle. */
  run: CycleRun;
  startMem: Float64Array;
  /** Largest normalised cycle-to-cycle change of the final cycle (1 = at tolerance). */
  residual: number;
}

interface Slot {
  index: number;
  kind: "volt" | "amp" | "latch";
}

function layout(devices: CircuitDevice[]): Slot[] {
  const slots: Slot[] = [];
  for (const d of devices) {
    if (d.type === "capacitor") slots.push({ index: d.mem, kind: "volt" });
    if (d.type === "coupled") d.branches.forEach((_, w) => slots.push({ index: d.mem + 2 * w, kind: "amp" }));
    if (d.type === "switching") slots.push({ index: d.mem, kind: "latch" });
  }
  return slots;
}

/** Finds the periodic steady state, starting from `initialMem` (zeros: a power-on start); shooting may be turned off. */
export function periodicSteadyState(
  solver: TransientSolver,
  budget: Budget,
  initialMem?: Float64Array,
  opts: { shooting?: boolean; maxCycles?: number; toleranceScale?: number } = {},
): { ok: true; value: SteadyState } | { ok: false; error: SolverError } {
  const c = solver.circuit;
  const vpk = c.supply.vrms * Math.SQRT2;
  const slots = layout(c.devices);
  const cont = slots.filter((s) => s.kind !== "latch");
  let mem: Float64Array = initialMem ? initialMem.slice() : new Float64Array(c.memSize);
  let x: Float64Array = new Float64Array(c.size);
  let cycles = 0;

  // A looser tolerance (scale > 1) is enough where only a yes/no figure is wanted.
  const scale = opts.toleranceScale ?? 1;
  const change = (a: Float64Array, b: Float64Array): number => {
    let worst = 0;
    for (const s of slots) {
      const d = Math.abs(a[s.index]! - b[s.index]!);
      if (s.kind === "latch") {
        if (d > 0.5) return Infinity;
        continue;
      }
      const tol = PSS_RELTOL * Math.max(Math.abs(a[s.index]!), Math.abs(b[s.index]!)) + (s.kind === "volt" ? PSS_VOLT_ABSTOL_PER_VPK * vpk : PSS_AMP_ABSTOL_A);
      worst = Math.max(worst, d / (tol * scale));
    }
    return worst;
  };
  const cycle = (start: Float64Array, record: boolean) => {
    cycles++;
    return solver.runCycle(start, x, record, budget);
  };

  const history: number[] = [];
  let method: SteadyState["method"] = "cycles";
  let shootTried = opts.shooting === false;
  for (;;) {
    const r = cycle(mem, false);
    if (!r.ok) return r;
    const d = change(mem, r.run.endMem);
    history.push(d);
    x = r.run.endX;
    mem = r.run.endMem;
    if (d <= 1) break;
    if (cycles >= (opts.maxCycles ?? PSS_MAX_CYCLES)) break;
    if (cycles >= PSS_WARMUP_CYCLES && cont.length > 0 && Number.isFinite(d)) {
      const prev = history[history.length - 2]!;
      const rho = Number.isFinite(prev) && prev > 0 ? d / prev : 1;
      const predicted = rho < 1 ? Math.log(d) / -Math.log(rho) : Infinity;
      if (predicted > cont.length + 4 && !shootTried) {
        shootTried = true;
        const shot = shoot(vpk, cycle, mem, cont, change);
        if (!shot.ok) return shot;
        if (shot.mem !== null) {
          mem = shot.mem;
          method = "shooting";
          break;
        }
        mem = shot.best;
      }
    }
  }
  const final = cycle(mem, true);
  if (!final.ok) return final;
  return { ok: true, value: { method, cycles, run: final.run, startMem: mem, residual: change(mem, final.run.endMem) } };
}

type CycleFn = (start: Float64Array, record: boolean) => { ok: true; run: CycleRun } | { ok: false; error: SolverError };

/** Newton on F(s) = Phi(s) - s over the continuous states; null mem when it does not succeed. */
function shoot(
  vpk: number,
  cycle: CycleFn,
  base: Float64Array,
  cont: Slot[],
  change: (a: Float64Array, b: Float64Array) => number,
): { ok: true; mem: Float64Array | null; best: Float64Array } | { ok: false; error: SolverError } {
  const m = cont.length;
  let latches = base.slice();
  const inject = (s: Float64Array): Float64Array => {
    const mem = latches.slice();
    cont.forEach((slot, k) => (mem[slot.index] = s[k]!));
    return mem;
  };
  type Eval = { ok: true; f: Float64Array; end: Float64Array; start: Float64Array };
  const evalF = (s: Float64Array): Eval | { ok: false; error: SolverError } => {
    const r = cycle(inject(s), false);
    if (!r.ok) return r;
    const f = Float64Array.from(cont, (slot, k) => r.run.endMem[slot.index]! - s[k]!);
    return { ok: true as const, f, end: r.run.endMem, start: inject(s) };
  };
  let s: Float64Array = Float64Array.from(cont, (slot) => base[slot.index]!);
  const first = evalF(s);
  if (!first.ok) return first;
  let cur: Eval = first;
  // Finite-difference Jacobian of F, once; Broyden rank-one updates afterwards.
  const jac = new Float64Array(m * m);
  for (let k = 0; k < m; k++) {
    const delta = SHOOTING_FD_RELATIVE * Math.max(Math.abs(s[k]!), cont[k]!.kind === "volt" ? 0.01 * vpk : 1e-3);
    const sp = s.slice();
    sp[k]! += delta;
    const fp = evalF(sp);
    if (!fp.ok) return fp;
    for (let i = 0; i < m; i++) jac[i * m + k] = (fp.f[i]! - cur.f[i]!) / delta;
  }
  const rows = Int32Array.from({ length: m * m }, (_, q) => Math.floor(q / m));
  const cols = Int32Array.from({ length: m * m }, (_, q) => q % m);
  const lu = new DenseLu(m, rows, cols);
  for (let iter = 0; iter < SHOOTING_MAX_ITERATIONS; iter++) {
    if (change(cur.start, cur.end) <= 1) return { ok: true, mem: cur.start, best: cur.end };
    if (change(cur.start, cur.end) === Infinity) {
      // A latch ends the cycle in another state than it started: start from the end's latches.
      latches = cur.end.slice();
      const again = evalF(s);
      if (!again.ok) return again;
      cur = again;
      continue;
    }
    if (!lu.factor(jac).ok) return { ok: true, mem: null, best: cur.end };
    const step = lu.solve(cur.f.map((v: number) => -v));
    let lambda = 1;
    let next: Eval | null = null;
    let sNext = s;
    const norm = (f: Float64Array) => Math.hypot(...f);
    for (let tries = 0; tries < 6; tries++) {
      sNext = s.map((v, k) => v + lambda * step[k]!);
      const trial = evalF(sNext);
      if (!trial.ok) return trial;
      if (norm(trial.f) < norm(cur.f) || tries === 5) {
        next = trial;
        break;
      }
      lambda /= 2;
    }
    if (next === null) return { ok: true, mem: null, best: cur.end };
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
  return { ok: true, mem: change(cur.start, cur.end) <= 1 ? cur.start : null, best: cur.end };
}
