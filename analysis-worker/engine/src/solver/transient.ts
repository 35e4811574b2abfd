/**
 * Time domain over one mains cycle: trapezoidal companion models with a backward-Euler step at
 * the start and after every switching event, Newton-Raphson at each step, an adaptive step from
 * the local truncation error of the storage states, breakpoints at the supply's zero crossings
 * and peaks, and thyristor/triac events located in time by bisection on the step.
 */
import type { Circuit, CircuitDevice } from "./circuit-model.js";
import type { LuChoice, MnaPattern } from "./mna.js";
import { GMIN_SIEMENS, reserveTransientPattern } from "./mna.js";
import type { LinearSolver } from "./sparse-lu.js";
import type { SolverError } from "./solver-error.js";
import { solverFailure } from "./solver-error.js";
import type { StampContext } from "./transient-stamps.js";
import {
  commitDevice,
  deviceSlots,
  isNonlinear,
  latchEvent,
  stampLinearMatrix,
  stampLinearRhs,
  stampNonlinear,
} from "./transient-stamps.js";

/** Newton iterations per step before the step is cut. */
export const MAX_NEWTON_ITERATIONS = 60;
/** Newton convergence: relative change and absolute floor of the node voltages. */
export const NEWTON_RELTOL = 1e-6;
export const NEWTON_VOLT_ABSTOL_V = 1e-6;
/** Newton also stops when every KCL residual is this small against the row's own terms... */
export const NEWTON_RESIDUAL_RELTOL = 1e-9;
/** ...plus this floor in amps. */
export const NEWTON_RESIDUAL_ABSTOL_A = 1e-12;
/** Local truncation error allowed, relative to the state's magnitude. */
export const LTE_RELTOL = 1e-3;
/** Absolute LTE floors, as fractions of the supply peak voltage (volts) and in amps. */
export const LTE_VOLT_ABSTOL_PER_VPK = 1e-5;
export const LTE_AMP_ABSTOL_A = 1e-7;
/** Largest step, as a fraction of the supply period (3.6 degrees); the LTE control sets the rest. */
export const MAX_STEP_PER_PERIOD = 1 / 100;
/** First step after the cycle start, as a fraction of the period. */
export const DAMPED_STEP_PER_PERIOD = 1e-5;
/**
 * First step after a thyristor/triac switches, as a fraction of the period (0.2 ns at 50 Hz): a
 * capacitor across the switch discharges through its on-resistance within nanoseconds, and the
 * step control can only follow that decay if the first steps are shorter than it.
 */
export const EVENT_STEP_PER_PERIOD = 1e-8;
/**
 * After a switching event, steps shorter than this fraction of the period (2 µs at 50 Hz) may
 * grow by up to FAST_GROWTH from one step to the next while the error allows; others by 2. The
 * short steps after an event follow a decay that is over within a few of them.
 */
export const FAST_GROWTH_BELOW_PER_PERIOD = 1e-4;
export const FAST_GROWTH = 8;
/** Backward-Euler steps taken after the cycle start, a failed step or a switching event. */
export const DAMPED_STEPS = 1;
/** Smallest step before Newton failure is reported, as a fraction of the period. */
export const MIN_STEP_PER_PERIOD = 1e-10;
/** Switching events are located to this many degrees of the supply cycle (the goal is 0.05). */
export const EVENT_TOL_DEG = 0.01;

/**
 * A latch change is held for at least this many degrees of the supply cycle: it stands for the
 * device's switching time and keeps a gate current that hovers at igt (on and off states that
 * are each inconsistent) from toggling the latch at every step.
 */
export const LATCH_MIN_DWELL_DEG = 1;

/** Shared limits of one analysis: a clock deadline (when a clock is passed) and a step cap. */
export interface Budget {
  now: (() => number) | null;
  deadlineMs: number;
  stepsLeft: number;
}

/** Solver choices. */
export interface TransientOptions {
  lu: LuChoice;
  maxNewtonIterations: number;
  /**
   * Thyristors and triacs keep the latch state they start the cycle in: the circuit as it runs
   * from power-on before its first firing, whose gate drive says whether it would ever fire.
   */
  holdLatches?: boolean;
}

/** One recorded point of a cycle. */
export interface CycleSample {
  t: number;
  x: Float64Array;
  mem: Float64Array;
  /**
   * True when the step ending here was backward Euler: its quantities hold over the whole step
   * (right-endpoint rule) rather than varying linearly from the previous point (trapezoid).
   */
  damped: boolean;
}

/** Result of simulating one cycle from a start memory. */
export interface CycleRun {
  endMem: Float64Array;
  endX: Float64Array;
  samples: CycleSample[];
  /** Firing events: device ref, time in the cycle (s), turned on (true) or off. */
  events: Array<{ ref: string; t: number; on: boolean }>;
  steps: number;
  /** For a run joined from several cycles: the end state of each. */
  cycleEnds?: Float64Array[];
}

type StepOutcome =
  | { ok: true; x: Float64Array; work: Float64Array }
  | { ok: false; kind: "newton"; part: string | null }
  | { ok: false; kind: "singular"; unknown: number };

/** A prepared transient solver for one circuit (pattern and LU order kept across steps). */
export class TransientSolver {
  readonly circuit: Circuit;
  private readonly pattern: MnaPattern;
  private readonly lu: LinearSolver;
  private readonly vals: Float64Array;
  private readonly rhs: Float64Array;
  private readonly rhsBase: Float64Array;
  private readonly opts: TransientOptions;
  private readonly diagSlots: number[];
  private readonly nonlinear: CircuitDevice[];
  private readonly switching: Array<Extract<CircuitDevice, { type: "switching" }>>;
  private readonly storage: Array<{ index: number; isVolt: boolean }>;
  private readonly ddWork = new Float64Array(4);
  /** The memory and the two Newton iterates of a step (see step). */
  private workBuf: Float64Array;
  private readonly iterA: Float64Array;
  private readonly iterB: Float64Array;
  /** Pattern slots of each device (same order as circuit.devices). */
  private readonly slots: Int32Array[];
  private readonly linear: CircuitDevice[];
  private readonly nonlinearSlots: Int32Array[];
  /** Matrix of the step-only entries (gmin, linear devices) for the step size it was built for. */
  private readonly baseVals: Float64Array;
  private baseH = NaN;
  private baseTrap = false;
  totalSteps = 0;
  newtonIterations = 0;

  /** Prepares the pattern and the LU for a circuit. */
  constructor(circuit: Circuit, opts: TransientOptions) {
    this.circuit = circuit;
    this.opts = opts;
    this.pattern = reserveTransientPattern(circuit);
    this.lu = this.pattern.solver(opts.lu);
    this.vals = new Float64Array(this.pattern.count);
    this.rhs = new Float64Array(circuit.size);
    this.rhsBase = new Float64Array(circuit.size);
    this.workBuf = new Float64Array(circuit.memSize);
    this.iterA = new Float64Array(circuit.size);
    this.iterB = new Float64Array(circuit.size);
    this.diagSlots = Array.from({ length: circuit.nodeCount }, (_, i) => this.pattern.slot(i, i));
    this.nonlinear = circuit.devices.filter(isNonlinear);
    this.linear = circuit.devices.filter((d) => !isNonlinear(d));
    this.slots = circuit.devices.map((d) => deviceSlots(this.pattern, d));
    this.nonlinearSlots = this.nonlinear.map((d) => this.slots[circuit.devices.indexOf(d)]!);
    this.baseVals = new Float64Array(this.pattern.count);
    this.switching = circuit.devices.filter(
      (d): d is Extract<CircuitDevice, { type: "switching" }> => d.type === "switching",
    );
    this.storage = [];
    for (const d of circuit.devices) {
      if (d.type === "capacitor") this.storage.push({ index: d.mem, isVolt: true });
      if (d.type === "coupled")
        d.branches.forEach((_, w) => this.storage.push({ index: d.mem + 2 * w, isVolt: false }));
    }
  }

  /** The step-only matrix entries for (h, trap), rebuilt only when the step changes. */
  private baseFor(h: number, trap: boolean): Float64Array {
    if (h === this.baseH && trap === this.baseTrap) return this.baseVals;
    const b = this.baseVals;
    b.fill(0);
    for (const s of this.diagSlots) b[s]! += GMIN_SIEMENS;
    const devices = this.circuit.devices;
    for (let k = 0; k < devices.length; k++)
      stampLinearMatrix(devices[k]!, this.slots[k]!, b, h, trap);
    this.baseH = h;
    this.baseTrap = trap;
    return b;
  }

  /** One step from (x, mem) at time t - h to time t. */
  step(t: number, h: number, trap: boolean, xGuess: Float64Array, mem: Float64Array): StepOutcome {
    const c = this.circuit;
    // The step's memory and its two Newton iterates (used in turn) are solver-owned buffers;
    // only a converged step copies them out (callers keep them), so a step that fails
    // allocates nothing and one that converges two vectors instead of three.
    if (this.workBuf.length !== mem.length) this.workBuf = new Float64Array(mem.length);
    const work = this.workBuf;
    work.set(mem);
    let x = this.iterA;
    x.set(xGuess);
    let next = this.iterB;
    const ctx: StampContext = {
      p: this.pattern,
      vals: this.vals,
      rhs: this.rhs,
      x,
      mem,
      work,
      h,
      trap,
      t,
    };
    const base = this.baseFor(h, trap);
    // The right-hand side of the linear devices is the same for every Newton iteration.
    const rhsBase = this.rhsBase;
    rhsBase.fill(0);
    for (const d of this.linear) stampLinearRhs(d, rhsBase, mem, h, trap, t);
    const nonlinear = this.nonlinear;
    const maxIt = nonlinear.length === 0 ? 1 : this.opts.maxNewtonIterations;
    for (let it = 0; it < maxIt; it++) {
      this.newtonIterations++;
      this.vals.set(base);
      this.rhs.set(rhsBase);
      ctx.x = x;
      let limited = false;
      for (let k = 0; k < nonlinear.length; k++)
        if (stampNonlinear(nonlinear[k]!, this.nonlinearSlots[k]!, ctx)) limited = true;
      if (
        it > 0 &&
        !limited &&
        this.pattern.residualSmall(
          this.vals,
          x,
          this.rhs,
          c.nodeCount,
          NEWTON_RESIDUAL_RELTOL,
          NEWTON_RESIDUAL_ABSTOL_A,
        )
      ) {
        for (const d of c.devices) commitDevice(d, ctx);
        return { ok: true, x: x.slice(), work: work.slice() };
      }
      const status = this.lu.factor(this.vals);
      if (!status.ok) return { ok: false, kind: "singular", unknown: status.singularUnknown };
      this.lu.solveInto(this.rhs, next);
      if (!allFinite(next)) return { ok: false, kind: "newton", part: this.worstPart(next, x) };
      const prev = x;
      x = next;
      next = prev;
      if (nonlinear.length === 0 || (!limited && it > 0 && this.converged(prev, x))) {
        ctx.x = x;
        for (const d of c.devices) commitDevice(d, ctx);
        return { ok: true, x: x.slice(), work: work.slice() };
      }
    }
    return { ok: false, kind: "newton", part: this.worstPart(x, next) };
  }

  private converged(a: Float64Array, b: Float64Array): boolean {
    // Node voltages only: branch currents follow from them through linear rows, and behind a
    // large companion conductance they amplify round-off far past any absolute current floor.
    const nodes = this.circuit.nodeCount;
    for (let i = 0; i < nodes; i++) {
      const tol = NEWTON_RELTOL * Math.max(Math.abs(a[i]!), Math.abs(b[i]!)) + NEWTON_VOLT_ABSTOL_V;
      if (Math.abs(a[i]! - b[i]!) > tol) return false;
    }
    return true;
  }

  /** The nonlinear part whose terminal voltages moved most in the last iteration. */
  private worstPart(a: Float64Array, b: Float64Array): string | null {
    let best: string | null = this.nonlinear[0]?.ref ?? null;
    let most = -1;
    for (const d of this.nonlinear) {
      let m = 0;
      for (const n of d.terminals) if (n >= 0) m = Math.max(m, Math.abs((a[n] ?? 0) - (b[n] ?? 0)));
      if (!Number.isFinite(m)) m = Infinity;
      if (m > most) {
        most = m;
        best = d.ref;
      }
    }
    return best;
  }

  /** The LTE ratio over the points of `hist` followed by the trial point (tNew, sNew). */
  private lteRatio(
    hist: Array<{ t: number; s: Float64Array }>,
    tNew: number,
    sNew: Float64Array,
    trap: boolean,
    vpk: number,
  ): number {
    // Divided differences of the storage states over the last points estimate x'' (or x''').
    const need = trap ? 4 : 3;
    const count = hist.length + 1;
    if (count < need) return 0;
    const base = count - need;
    // Point q of the window, the trial point last (no array is built per step).
    const tAt = (q: number) => (q === hist.length ? tNew : hist[q]!.t);
    const sAt = (q: number) => (q === hist.length ? sNew : hist[q]!.s);
    const dd = this.ddWork;
    const h = tNew - hist[hist.length - 1]!.t;
    let worst = 0;
    for (let k = 0; k < this.storage.length; k++) {
      let mag = 0;
      for (let q = 0; q < need; q++) {
        dd[q] = sAt(base + q)[k]!;
        mag = Math.max(mag, Math.abs(dd[q]!));
      }
      for (let order = 1; order < need; order++) {
        for (let q = 0; q + order < need; q++)
          dd[q] = (dd[q + 1]! - dd[q]!) / (tAt(base + q + order) - tAt(base + q));
      }
      const lte = trap ? (h ** 3 / 12) * 6 * Math.abs(dd[0]!) : (h ** 2 / 2) * 2 * Math.abs(dd[0]!);
      const tol =
        LTE_RELTOL * mag +
        (this.storage[k]!.isVolt ? LTE_VOLT_ABSTOL_PER_VPK * vpk : LTE_AMP_ABSTOL_A);
      worst = Math.max(worst, lte / tol);
    }
    return worst;
  }

  private storageOf(mem: Float64Array): Float64Array {
    const out = new Float64Array(this.storage.length);
    for (let k = 0; k < out.length; k++) out[k] = mem[this.storage[k]!.index]!;
    return out;
  }

  /** Simulates one supply cycle [0, T] from a start memory; records samples when asked. */
  runCycle(
    startMem: Float64Array,
    xGuess: Float64Array,
    record: boolean,
    budget: Budget,
  ): { ok: true; run: CycleRun } | { ok: false; error: SolverError } {
    const c = this.circuit;
    const period = 1 / c.supply.hz;
    const vpk = c.supply.vrms * Math.SQRT2;
    const hMax = period * MAX_STEP_PER_PERIOD;
    const hDamped = period * DAMPED_STEP_PER_PERIOD;
    const hEvent = period * EVENT_STEP_PER_PERIOD;
    const hFast = period * FAST_GROWTH_BELOW_PER_PERIOD;
    const hMin = period * MIN_STEP_PER_PERIOD;
    const eventTol = (EVENT_TOL_DEG / 360) * period;
    const breaks = [0.25, 0.5, 0.75, 1].map((f) => f * period);
    let mem: Float64Array = startMem.slice();
    let x: Float64Array = xGuess.slice();
    let t = 0;
    let h = hDamped;
    // Backward-Euler steps still to take before the trapezoidal rule resumes.
    let dampedLeft = DAMPED_STEPS;
    // True from a switching event until the step has grown back to hFast.
    let afterEvent = false;
    let hist: Array<{ t: number; s: Float64Array }> = [{ t: 0, s: this.storageOf(mem) }];
    const samples: CycleSample[] = [];
    const events: CycleRun["events"] = [];
    let steps = 0;
    const dwell = (LATCH_MIN_DWELL_DEG / 360) * period;
    const lastFlip = new Map<string, number>();
    const mayFlip = (d: { ref: string }, at: number) =>
      at - (lastFlip.get(d.ref) ?? -Infinity) >= dwell;
    while (t < period * (1 - 1e-12)) {
      if (budget.stepsLeft-- <= 0)
        return solverFailure("step-limit", "the step limit of the analysis was reached", {
          time_s: t,
        });
      if (budget.now && budget.now() > budget.deadlineMs)
        return solverFailure("time-budget", "the analysis ran out of its time budget", {
          time_s: t,
        });
      const nextBreak = breaks.find((b) => b > t * (1 + 1e-12) + 1e-15) ?? period;
      const hTry = Math.min(h, hMax, nextBreak - t);
      const trap = dampedLeft === 0;
      const out = this.step(t + hTry, hTry, trap, x, mem);
      if (!out.ok) {
        if (out.kind === "singular") {
          const owner = c.unknownOwner[out.unknown] ?? `unknown ${out.unknown}`;
          return solverFailure("singular-matrix", `the circuit matrix is singular at ${owner}`, {
            nets: c.nodeNames.includes(owner) ? [owner] : [],
            parts: c.nodeNames.includes(owner) ? [] : [owner],
            time_s: t,
          });
        }
        h = hTry / 4;
        dampedLeft = DAMPED_STEPS;
        if (h < hMin) {
          return solverFailure(
            "no-convergence",
            `Newton-Raphson did not converge at ${out.part ?? "a part"} at t = ${t.toExponential(4)} s`,
            {
              parts: out.part ? [out.part] : [],
              time_s: t,
            },
          );
        }
        continue;
      }
      const s = this.storageOf(out.work);
      const ratio = this.lteRatio(hist, t + hTry, s, trap, vpk);
      if (ratio > 1.5 && hTry > 4 * (afterEvent ? hEvent : hDamped)) {
        h = hTry * Math.max(0.2, 0.9 * Math.cbrt(1 / ratio));
        continue;
      }
      // Switching events in this step: locate the earliest crossing by bisection on the step.
      let accepted = out;
      let hAcc = hTry;
      let flips =
        this.switching.length === 0 || this.opts.holdLatches === true
          ? NO_FLIPS
          : this.switching.filter((d) => latchEvent(d, out.x, mem).flip && mayFlip(d, t + hTry));
      if (flips.length > 0) {
        const startValues = this.switching.map((d) => latchEvent(d, x, mem).value);
        const crossesInside = flips.some((d) => startValues[this.switching.indexOf(d)]! < 0);
        if (crossesInside && hTry > eventTol) {
          let lo = 0;
          let hi = hTry;
          let eLo = Math.max(...flips.map((d) => startValues[this.switching.indexOf(d)]!));
          let eHi = Math.max(...flips.map((d) => latchEvent(d, out.x, mem).value));
          let best = out;
          while (hi - lo > eventTol) {
            const mid = 0.5 * (lo + hi);
            const trial = this.step(t + mid, mid, trap, x, mem);
            if (!trial.ok) break;
            const e = Math.max(...flips.map((d) => latchEvent(d, trial.x, mem).value));
            if (flips.some((d) => latchEvent(d, trial.x, mem).flip)) {
              hi = mid;
              eHi = e;
              best = trial;
            } else {
              lo = mid;
              eLo = e;
            }
          }
          // End on the interpolated crossing, so the event time (and the cycle map) moves
          // continuously with the state instead of in bisection quanta.
          const frac = eHi > eLo ? Math.min(1, Math.max(0, -eLo / (eHi - eLo))) : 1;
          const hStar = Math.max(lo + frac * (hi - lo), hTry * 1e-9);
          const atStar = hStar < hi ? this.step(t + hStar, hStar, trap, x, mem) : best;
          accepted = atStar.ok ? atStar : best;
          hAcc = atStar.ok ? hStar : hi;
          const flipNow = flips.filter((d) => latchEvent(d, accepted.x, mem).flip);
          flips = flipNow.length > 0 ? flipNow : flips;
        }
      }
      t += hAcc;
      x = accepted.x;
      mem = accepted.work;
      steps++;
      // Recorded before a latch flips: the point was solved with the old latch state.
      if (record) samples.push({ t, x, mem: mem.slice(), damped: !trap });
      if (flips.length > 0) {
        for (const d of flips) {
          const on = mem[d.mem]! < 0.5;
          mem[d.mem] = on ? 1 : 0;
          lastFlip.set(d.ref, t);
          events.push({ ref: d.ref, t, on });
        }
        dampedLeft = DAMPED_STEPS;
        h = hEvent;
        afterEvent = true;
        hist = [{ t, s: this.storageOf(mem) }];
      } else {
        hist.push({ t, s });
        if (hist.length > 4) hist.shift();
        if (hAcc >= hFast) afterEvent = false;
        const most = afterEvent ? FAST_GROWTH : 2;
        const grow = ratio > 0 ? Math.min(most, Math.max(0.3, 0.9 * Math.cbrt(1 / ratio))) : 2;
        h = hAcc * grow;
        if (dampedLeft > 0) dampedLeft--;
      }
    }
    this.totalSteps += steps;
    return { ok: true, run: { endMem: mem, endX: x, samples, events, steps } };
  }
}

/** No latch flips in a step (one shared empty list, not one per step). */
const NO_FLIPS: Array<Extract<CircuitDevice, { type: "switching" }>> = [];

function allFinite(x: Float64Array): boolean {
  for (let i = 0; i < x.length; i++) if (!Number.isFinite(x[i]!)) return false;
  return true;
}
