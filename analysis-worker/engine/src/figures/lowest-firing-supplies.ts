/**
 * The lowest firing supply of a thyristor or triac, in two values, because a trigger stage can
 * have a memory: a capacitor that a firing leaves charged (a diac-triac dimmer's timing
 * capacitor) or discharged (a capacitor-dump pulse stage) starts its next half-cycle elsewhere
 * than it would from rest.
 *
 * - From cold: the lowest supply at which the circuit, switched on from rest, fires at all in
 *   every half it fires in at the analysed supply. Before its first firing the circuit runs with
 *   its latches held off; it fires when the gate drive of that circuit reaches igt, either in
 *   the start transient (the first cycles from rest, recorded) or in its periodic steady state.
 *   The held circuit has no switching events, so its steady state is reached by Newton shooting
 *   on a smooth one-cycle map in a few cycles, and the gate margin is smooth in the supply: the
 *   secant steers the bracket (min-firing-supply.ts).
 * - While running: the lowest supply at which it keeps firing as the supply sags from the
 *   analysed one. Each trial supply is warm-started from the firing steady state of the nearest
 *   supply above it already solved (a continuation downwards: the state the circuit is in when
 *   the supply reaches that value), its state scaled by the amplitude ratio, with that solve's
 *   shooting Jacobian.
 */
import type { TeardownRecord } from "../record/types.js";
import type { LuChoice } from "../solver/mna.js";
import { gateMargin, gateMarginOver, lowestFiringSupply } from "../solver/min-firing-supply.js";
import type { SolverOutcome } from "../solver/solver-error.js";
import type { Budget } from "../solver/transient.js";
import type { WarmStart } from "../solver/variants/steady-variant.js";
import { solveSteady, warmFrom } from "../solver/variants/steady-variant.js";
import type { FiringFigures } from "./circuit-figures.js";
import { firingFigures } from "./circuit-figures.js";
import type { SolvedCircuit } from "./solved-variant.js";

/** The lowest firing supply is bracketed to this many volts RMS. */
export const MIN_SUPPLY_RESOLUTION_V = 0.5;
/** The bisection's steady states only decide fires / does not fire: 100 times the usual tolerance (1e-3 of a state). */
export const MIN_SUPPLY_TOLERANCE_SCALE = 100;
/** Cycle cap of each bisection solve: a firing pattern that has not settled by then is judged on its last window. */
export const MIN_SUPPLY_MAX_CYCLES = 60;
/**
 * Cycles from rest whose gate drive is watched before the held circuit's steady state: a
 * network whose start transient overshoots its steady swing (a DC offset decaying through an
 * RC) fires from cold on the first cycles even where its steady swing stays short of igt.
 */
export const COLD_START_WATCH_CYCLES = 2;

/** The two lowest firing supplies of one trigger, and what the searches cost. */
export interface LowestSupplies {
  /** Lowest supply at which it keeps firing as the supply sags from the analysed one. */
  running: number;
  /** Lowest supply at which it starts firing from cold. */
  cold: number;
  steps: number;
  cycles: number;
}

/** Solver choices shared by every steady state of one analysis. */
export interface SearchChoices {
  lu?: LuChoice;
  maxNewtonIterations?: number;
}

/** True when `f` fires in every half-cycle that `ref` fires in. */
export function coversHalves(f: FiringFigures | undefined, ref: FiringFigures): boolean {
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

/**
 * True when the last cycles of a search stopped at its cap fire `f` in every half it must
 * (a pattern too long to settle within the cap still fires).
 */
function firesLate(
  events: SolvedCircuit["steady"]["lateEvents"],
  f: FiringFigures,
  period: number,
): boolean {
  const ons = (events ?? []).filter((e) => e.ref === f.part && e.on);
  const pos = ons.some((e) => e.t < period / 2);
  const neg = ons.some((e) => e.t >= period / 2);
  return ons.length > 0 && (!f.halves.positive || pos) && (!f.halves.negative || neg);
}

/** A solved supply and the warm start a trial near it takes (see warmFrom). */
interface SolvedStart {
  vrms: number;
  warm: WarmStart;
}

/** Both lowest firing supplies of the trigger `f` of a solved circuit (see the file comment). */
export function lowestFiringSupplies(
  rec: TeardownRecord,
  solved: SolvedCircuit,
  f: FiringFigures,
  choices: SearchChoices,
  budget: Budget,
): SolverOutcome<LowestSupplies> {
  const supply = solved.circuit.supply;
  const guess = firstGuess(supply.vrms, f);
  let steps = 0;
  let cycles = 0;

  // While running: continuation downwards from the firing states already solved.
  const firing: SolvedStart[] = [{ vrms: supply.vrms, warm: warmFrom(solved) }];
  const running = lowestFiringSupply(
    supply.vrms,
    MIN_SUPPLY_RESOLUTION_V,
    (v) => {
      let near = firing[0]!;
      for (const s of firing) if (s.vrms >= v && s.vrms < near.vrms) near = s;
      const r = solveSteady(
        rec,
        {
          supply: { vrms: v, hz: supply.hz },
          warm: { ...near.warm, scale: v / near.vrms },
          // A pattern that fires every k-th cycle changes its firing count under a Newton
          // step, and the k-cycle map jumps with it: shooting there can land on a state the
          // running circuit never reaches. Such a stage is followed by plain cycles.
          shooting: (near.warm.periodCycles ?? 1) === 1,
          toleranceScale: MIN_SUPPLY_TOLERANCE_SCALE,
          maxCycles: MIN_SUPPLY_MAX_CYCLES,
          ...choices,
        },
        budget,
      );
      if (!r.ok) return r;
      steps += r.value.steps;
      cycles += r.value.steady.cycles;
      const steady = r.value.steady;
      const fires =
        coversHalves(
          firingFigures(r.value.circuit, steady).find((g) => g.part === f.part),
          f,
        ) || firesLate(steady.lateEvents, f, 1 / supply.hz);
      if (fires) firing.push({ vrms: v, warm: warmFrom(r.value) });
      return {
        ok: true,
        value: {
          fires,
          margin: fires ? null : gateMargin(r.value.circuit, r.value.steady, f.part, f.halves),
        },
      };
    },
    guess,
  );
  if (!running.ok) return running;

  // From cold: the held circuit's gate drive, over its start transient and its steady state.
  // Its steady state is unique, so each trial's search starts from the nearest one solved; the
  // first from the analysed state with its latches off (the storage states are mostly those of
  // the held circuit, and its one-cycle Jacobian nearly so).
  const latchesOff = solved.steady.startMem.slice();
  for (const d of solved.circuit.devices) if (d.type === "switching") latchesOff[d.mem] = 0;
  const analysed = warmFrom(solved);
  const held: SolvedStart[] = [
    {
      vrms: supply.vrms,
      warm: {
        mem: latchesOff,
        ...(analysed.jacobianCycles === 1 ? { jacobian: analysed.jacobian } : {}),
      },
    },
  ];
  const cold = lowestFiringSupply(
    supply.vrms,
    MIN_SUPPLY_RESOLUTION_V,
    (v) => {
      let near = held[0]!;
      for (const s of held) if (Math.abs(s.vrms - v) < Math.abs(near.vrms - v)) near = s;
      const r = solveSteady(
        rec,
        {
          supply: { vrms: v, hz: supply.hz },
          holdLatches: true,
          watchStartCycles: COLD_START_WATCH_CYCLES,
          warm: { ...near.warm, scale: v / near.vrms },
          toleranceScale: MIN_SUPPLY_TOLERANCE_SCALE,
          maxCycles: MIN_SUPPLY_MAX_CYCLES,
          ...choices,
        },
        budget,
      );
      if (!r.ok) return r;
      steps += r.value.steps;
      cycles += r.value.steady.cycles + COLD_START_WATCH_CYCLES;
      held.push({ vrms: v, warm: warmFrom(r.value) });
      const c = r.value.circuit;
      const margins = [
        gateMargin(c, r.value.steady, f.part, f.halves),
        ...(r.value.startRuns ?? []).map((run) => gateMarginOver(c, run.samples, f.part, f.halves)),
      ].filter((m): m is number => m !== null);
      const margin = margins.length > 0 ? Math.max(...margins) : null;
      return { ok: true, value: { fires: margin !== null && margin >= 0, margin } };
    },
    guess,
  );
  if (!cold.ok) return cold;
  return {
    ok: true,
    value: { running: running.value.vrms, cold: cold.value.vrms, steps, cycles },
  };
}
