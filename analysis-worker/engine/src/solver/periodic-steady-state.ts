/**
 * Periodic steady state: the cycle-start state (capacitor voltages, winding currents, latch
 * states) that the one-cycle map sends back to itself. Plain cycling when it settles fast;
 * shooting (Newton on the start state with a finite-difference Jacobian of the one-cycle map,
 * Broyden updates and step halving) when a large capacitor settles over many cycles.
 * Some circuits have no one-cycle steady state at all: a relaxation trigger that charges a
 * capacitor over several mains cycles and fires every k-th cycle repeats only every k cycles
 * (a subharmonic orbit). Such an orbit is recognised by comparing each cycle's end state with
 * the states up to PSS_MAX_SUBHARMONIC cycles back, reached by shooting on the k-cycle map,
 * and its whole k-cycle window is recorded, so every figure (mean powers above all) is taken
 * over a window that truly repeats.
 */
import type { CircuitDevice } from "./circuit-model.js";
import type { SolverError } from "./solver-error.js";
import type { Budget, CycleRun, TransientSolver } from "./transient.js";
import { firstCycles, joinCycles, splitEnds } from "./cycle-window.js";
import type { CycleFn, Slot } from "./shooting.js";
import { shoot } from "./shooting.js";

export {
  SHOOTING_FD_RELATIVE,
  SHOOTING_FD_RELATIVE_AMP,
  SHOOTING_LINE_SEARCH_TRIES,
  SHOOTING_MAX_ITERATIONS,
} from "./shooting.js";

/**
 * A state is settled when its cycle-to-cycle change is below this fraction of its size (the
 * one-cycle map itself carries Newton and step-control noise of about 1e-7 of a state)...
 */
export const PSS_RELTOL = 1e-5;
/** ...plus these floors: a fraction of the supply peak for voltages, amps for currents. */
export const PSS_VOLT_ABSTOL_PER_VPK = 1e-6;
export const PSS_AMP_ABSTOL_A = 1e-8;
/**
 * Below this normalised change (1% of the tolerance) a cycle-to-cycle change is the map's own
 * noise, and the ratio of two such changes says nothing about a slow mode.
 */
export const PSS_NOISE_CHANGE = 0.01;
/** Cap on plain cycles. */
export const PSS_MAX_CYCLES = 300;
/** Plain cycles before deciding whether shooting is worth it. */
export const PSS_WARMUP_CYCLES = 3;
/** A one-cycle shot waits at most this many cycles (three times the longest repeat looked for) for a varying firing pattern to show its repeat. */
export const PSS_SUBHARMONIC_WAIT_CYCLES = 24;
/** Cycles a shot with a borrowed Jacobian is reckoned to take (one evaluation per Newton step). */
export const BORROWED_SHOT_CYCLES = 3;
/** Longest repeat, in mains cycles, that is looked for when the one-cycle map has no fixed point. */
export const PSS_MAX_SUBHARMONIC = 8;
/**
 * A k-cycle repeat is taken as the likely orbit when the state k cycles back is this much closer
 * than the state one cycle back (a converging one-cycle orbit gives a ratio of about k or more).
 */
export const SUBHARMONIC_EVIDENCE_RATIO = 0.1;

/** How the steady state was reached and the recorded steady cycle. */
export interface SteadyState {
  method: "cycles" | "shooting";
  /** Cycles simulated in all (including the Jacobian's). */
  cycles: number;
  /** The recorded steady cycle. */
  run: CycleRun;
  startMem: Float64Array;
  /**
   * Estimated distance of the start state from the periodic steady state, normalised (1 = at
   * tolerance): the Newton step that shooting would still take, or for plain cycles the last
   * change over (1 − its contraction per cycle), since a slowly decaying mode (a winding's DC
   * offset) changes little per cycle while far from settled.
   */
  residual: number;
  /** True when the residual is within tolerance; false: the figures are not a steady state. */
  converged: boolean;
  /** Mains cycles in the repeating window (1, or k for an orbit that repeats every k cycles); the run spans them all. */
  periodCycles: number;
  /**
   * Jacobian of the k-cycle mismatch over the continuous states (row-major), k =
   * `jacobianCycles`, when shooting ran: a variant warm-started from this state (a tolerance
   * sample, a sensitivity, a nearby supply) borrows it instead of building its own by finite
   * differences, one k-cycle map per state.
   */
  jacobian?: Float64Array;
  /** Cycles of the map the Jacobian belongs to (1 for the one-cycle map). */
  jacobianCycles?: number;
  /**
   * When the search stopped at its cycle cap: the switching events of its last
   * PSS_MAX_SUBHARMONIC plain cycles, each timed within its own cycle. A firing pattern longer
   * than any window looked for (a pulse stage near its lowest supply fires every tenth cycle)
   * shows here that it still fires.
   */
  lateEvents?: CycleRun["events"];
}

function layout(devices: CircuitDevice[]): Slot[] {
  const slots: Slot[] = [];
  for (const d of devices) {
    if (d.type === "capacitor") slots.push({ index: d.mem, kind: "volt" });
    if (d.type === "coupled")
      d.branches.forEach((_, w) => slots.push({ index: d.mem + 2 * w, kind: "amp" }));
    if (d.type === "switching") slots.push({ index: d.mem, kind: "latch" });
  }
  return slots;
}

/**
 * Finds the periodic steady state, starting from `initialMem` (zeros: a power-on start); shooting
 * may be turned off. `periodHint`: the repeat length of the orbit the start state came from (a
 * warm start from a k-cycle orbit shoots on the k-cycle map straight away).
 */
export function periodicSteadyState(
  solver: TransientSolver,
  budget: Budget,
  initialMem?: Float64Array,
  opts: {
    shooting?: boolean;
    maxCycles?: number;
    toleranceScale?: number;
    periodHint?: number;
    /** A Jacobian from a nearby solve (row-major, continuous states), tried before a finite-difference one... */
    jacobian?: Float64Array;
    /** ...for the map of this many cycles (1 when not given). */
    jacobianCycles?: number;
  } = {},
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
      const tol =
        PSS_RELTOL * Math.max(Math.abs(a[s.index]!), Math.abs(b[s.index]!)) +
        (s.kind === "volt" ? PSS_VOLT_ABSTOL_PER_VPK * vpk : PSS_AMP_ABSTOL_A);
      worst = Math.max(worst, d / (tol * scale));
    }
    return worst;
  };
  // The size of a shooting step in tolerances, as `change` measures a cycle's change.
  const stepSize = (at: Float64Array, step: Float64Array): number => {
    let worst = 0;
    cont.forEach((slot, k) => {
      const tol =
        PSS_RELTOL * Math.abs(at[k]!) +
        (slot.kind === "volt" ? PSS_VOLT_ABSTOL_PER_VPK * vpk : PSS_AMP_ABSTOL_A);
      worst = Math.max(worst, Math.abs(step[k]!) / (tol * scale));
    });
    return worst;
  };
  const cycle = (start: Float64Array, record: boolean) => {
    cycles++;
    return solver.runCycle(start, x, record, budget);
  };
  // k consecutive cycles as one map (the repeat of a subharmonic orbit), x carried along.
  const cyclesOf =
    (k: number): CycleFn =>
    (start, record) => {
      const parts: CycleRun[] = [];
      let m = start;
      for (let j = 0; j < k; j++) {
        const r = cycle(m, record);
        if (!r.ok) return r;
        parts.push(r.run);
        x = r.run.endX;
        m = r.run.endMem;
      }
      return { ok: true, run: joinCycles(parts, 1 / c.supply.hz) };
    };

  // states[j] is the cycle-start state after j cycles of the present plain run.
  let states: Float64Array[] = [mem];
  // The recorded run of each of the last cycles (recent[j] goes from states[j] to states[j + 1]):
  // the window that settles is then already recorded and needs no extra cycle.
  let recent: CycleRun[] = [];
  const history: number[] = [];
  let method: SteadyState["method"] = "cycles";
  // Shooting is tried at most once per repeat length (a one-cycle try fails on a subharmonic orbit).
  const tried = new Set<number>();
  const hint = Math.min(Math.max(1, Math.round(opts.periodHint ?? 1)), PSS_MAX_SUBHARMONIC);
  let period = 1;
  let shot = false;
  // The recorded run of the state shooting settled on, when it has one (no cycle run again).
  let shotRun: CycleRun | null = null;
  let jacobian: Float64Array | undefined;
  let jacobianCycles = 1;
  // With a borrowed Jacobian a shot costs a few cycles instead of one per state: it is tried
  // after a single plain cycle, and whenever plain cycling would take longer than that.
  const borrowed = opts.jacobian !== undefined && opts.jacobian.length === cont.length ** 2;
  const borrowedCycles = Math.round(opts.jacobianCycles ?? 1);
  const borrowedFor = (k: number): Float64Array | null =>
    borrowed && borrowedCycles === k ? opts.jacobian! : null;
  const warmup = borrowed ? 1 : PSS_WARMUP_CYCLES;
  const shotCost = borrowed ? BORROWED_SHOT_CYCLES : cont.length + 4;
  // Distance to the steady state from the latest changes (see SteadyState.residual).
  const distance = (): number => {
    const d = history[history.length - 1]!;
    const prev = history[history.length - 2];
    if (d <= PSS_NOISE_CHANGE || !Number.isFinite(d)) return d;
    // One cycle alone shows no contraction: it is taken as slow until a second cycle says otherwise.
    if (prev === undefined || !Number.isFinite(prev) || prev <= 0) return Infinity;
    const rho = d / prev;
    return rho < 1 ? d / (1 - rho) : Infinity;
  };
  let residual = Infinity;
  let capped = false;
  for (;;) {
    const r = cycle(mem, true);
    if (!r.ok) return r;
    const d = change(mem, r.run.endMem);
    history.push(d);
    residual = distance();
    x = r.run.endX;
    mem = r.run.endMem;
    states.push(mem);
    recent.push(r.run);
    if (states.length > PSS_MAX_SUBHARMONIC + 1) {
      states.shift();
      recent.shift();
    }
    if (d <= 1 && residual <= 1) break;
    // A repeat after k > 1 cycles, at tolerance: a subharmonic orbit.
    const back = (k: number) =>
      states.length > k ? change(states[states.length - 1 - k]!, mem) : Infinity;
    let repeat = 0;
    for (let k = 2; k <= PSS_MAX_SUBHARMONIC && repeat === 0; k++) if (back(k) <= 1) repeat = k;
    if (repeat > 0) {
      period = repeat;
      residual = back(repeat);
      break;
    }
    if (cycles >= (opts.maxCycles ?? PSS_MAX_CYCLES)) {
      capped = true;
      // Not settled (a long or irregular firing pattern): record the repeat length that came
      // closest, so the means are at least taken over the window nearest to repeating.
      let best = d;
      for (let k = 2; k <= PSS_MAX_SUBHARMONIC; k++) {
        const b = back(k);
        if (b < best) {
          best = b;
          period = k;
        }
      }
      break;
    }
    if (cycles >= warmup && cont.length > 0 && Number.isFinite(d) && opts.shooting !== false) {
      let likely = hint > 1 && !tried.has(hint) ? hint : 1;
      for (let k = 2; k <= PSS_MAX_SUBHARMONIC && likely === 1; k++)
        if (states.length > k + 1 && back(k) < SUBHARMONIC_EVIDENCE_RATIO * d) likely = k;
      // Cycles that differ in their switching events point to a subharmonic orbit still taking
      // shape: a one-cycle shot would fail, so wait until the repeat shows.
      const eventsVary =
        recent.length >= 2 &&
        recent.some((r) => r.events.length !== recent[recent.length - 1]!.events.length);
      if (likely === 1 && eventsVary && cycles < PSS_SUBHARMONIC_WAIT_CYCLES) continue;
      const prev = history[history.length - 2]!;
      const rho = Number.isFinite(prev) && prev > 0 ? d / prev : 1;
      // Cycles until the distance (not merely the change) is within tolerance.
      const predicted = rho < 1 ? Math.log(residual) / -Math.log(rho) : Infinity;
      if (!tried.has(likely) && (likely > 1 || predicted > shotCost)) {
        tried.add(likely);
        const found = shoot(
          vpk,
          likely === 1 ? cycle : cyclesOf(likely),
          mem,
          cont,
          change,
          stepSize,
          borrowedFor(likely),
        );
        if (!found.ok) return found;
        jacobian = found.jac;
        jacobianCycles = likely;
        if (found.mem !== null) {
          mem = found.mem;
          shotRun = found.run ?? null;
          residual = found.distance;
          method = "shooting";
          period = likely;
          shot = true;
          break;
        }
        mem = found.best;
        states = [mem];
        recent = [];
      }
    }
  }
  let run: CycleRun;
  if (shot && shotRun !== null) run = shotRun;
  else if (shot) {
    const final = cyclesOf(period)(mem, true);
    if (!final.ok) return final;
    run = final.run;
  } else {
    // The last `period` plain cycles are the window; it starts `period` states back.
    mem = states[states.length - 1 - period]!;
    run = joinCycles(recent.slice(-period), 1 / c.supply.hz);
  }
  // A k-cycle orbit may repeat sooner (shooting on the k-cycle map also finds shorter orbits).
  const cycleStarts = [mem, ...splitEnds(run, period)];
  for (let p = 1; p < period; p++) {
    if (period % p === 0 && change(mem, cycleStarts[p]!) <= 1) {
      run = firstCycles(run, p, 1 / c.supply.hz, cycleStarts[p]!);
      period = p;
      break;
    }
  }
  const final = Math.max(residual, change(mem, run.endMem));
  return {
    ok: true,
    value: {
      method,
      cycles,
      run,
      startMem: mem,
      residual: final,
      converged: !capped && final <= 1,
      periodCycles: period,
      ...(jacobian ? { jacobian, jacobianCycles } : {}),
      ...(capped ? { lateEvents: recent.flatMap((r) => r.events) } : {}),
    },
  };
}
