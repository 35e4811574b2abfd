/**
 * Two steady states of one circuit at one supply. A pulse stage (a capacitor dumped through a
 * thyristor into a transformer, a bug zapper's trigger) or a trigger with hysteresis can settle
 * into different firing patterns depending on where it starts: the figures of the analysis are
 * those of a cold start (from rest at the analysed supply), and the state kept while running is
 * reached by continuation: the circuit runs at the top of the usual mains range
 * (RUNNING_FROM_FRACTION above the rated supply, or above the analysed one when that is
 * higher), and the supply sags to the analysed one, the state carried along. When the two differ in their firing
 * rate, or in their input power by more than STATE_POWER_DIFFERENCE, both are reported.
 */
import type { Supply, TeardownRecord } from "../record/types.js";
import type { SolverOutcome } from "../solver/solver-error.js";
import type { Budget } from "../solver/transient.js";
import { solveSteady, warmFrom } from "../solver/variants/steady-variant.js";
import type { InputFigures } from "./circuit-figures.js";
import type { SearchChoices } from "./lowest-firing-supplies.js";
import type { SolvedCircuit } from "./solved-variant.js";
import { withFigures } from "./solved-variant.js";

/** The running state comes down from this fraction above the rated supply (the usual +10 % mains tolerance, common practice). */
export const RUNNING_FROM_FRACTION = 0.1;
/** Two states whose firing rates agree still differ when their input powers differ by more than this fraction. */
export const STATE_POWER_DIFFERENCE = 0.05;

/** One trigger in one steady state. */
export interface StateTrigger {
  part: string;
  fires: boolean;
  angle_deg: number | null;
  angle_negative_deg: number | null;
  /** Firings per mains cycle over the repeating window (1/3: once every three cycles). */
  firings_per_cycle: number;
}

/** One steady state, named by where it started. */
export interface StartState {
  start: "cold" | "running";
  /** The supply the running state came down from (null for the cold start). */
  from_vrms: number | null;
  /** Mains cycles in its repeating window. */
  period_cycles: number;
  input: InputFigures;
  triggers: StateTrigger[];
}

/** The triggers of a solved state with their firing rates. */
export function stateTriggers(s: SolvedCircuit): StateTrigger[] {
  const period = s.steady.periodCycles;
  return s.figures.firings.map((f) => ({
    part: f.part,
    fires: f.fires,
    angle_deg: f.angle_deg,
    angle_negative_deg: f.angle_negative_deg,
    firings_per_cycle:
      s.steady.run.events.filter((e) => e.ref === f.part && e.on).length / Math.max(1, period),
  }));
}

/** A solved state as a named start state. */
export function startState(
  s: SolvedCircuit,
  start: StartState["start"],
  fromVrms: number | null,
): StartState {
  return {
    start,
    from_vrms: fromVrms,
    period_cycles: s.steady.periodCycles,
    input: s.figures.input,
    triggers: stateTriggers(s),
  };
}

/** True when a trigger fires in one state and not the other or at another rate, or the input powers are further apart than STATE_POWER_DIFFERENCE. */
export function statesDiffer(a: StartState, b: StartState): boolean {
  for (const t of b.triggers) {
    const u = a.triggers.find((q) => q.part === t.part);
    if (u === undefined || u.fires !== t.fires) return true;
    // Rates are counts over whole windows: equal ones agree to rounding.
    if (Math.abs(u.firings_per_cycle - t.firings_per_cycle) > 1e-9) return true;
  }
  const pa = a.input.power;
  const pb = b.input.power;
  const scale = Math.max(Math.abs(pa), Math.abs(pb));
  return scale > 0 && Math.abs(pa - pb) > STATE_POWER_DIFFERENCE * scale;
}

/**
 * The state kept while running at the supply of `cold` (see the file comment): a solve at the
 * top of the range, then one at the analysed supply warm-started from it. Only circuits with a
 * thyristor or triac can have it differ.
 */
export function runningState(
  rec: TeardownRecord,
  cold: SolvedCircuit,
  choices: SearchChoices,
  budget: Budget,
): SolverOutcome<{ state: SolvedCircuit; fromVrms: number; steps: number; cycles: number }> {
  const supply: Supply = cold.circuit.supply;
  const top = Math.max(rec.device.rated_supply.vrms, supply.vrms);
  const high: Supply = { vrms: top * (1 + RUNNING_FROM_FRACTION), hz: supply.hz };
  // Warm-started from the cold state (scaled, with its shooting Jacobian): at the top of the
  // range a trigger fires from any state it would fire from at rest, and the start costs a few
  // cycles instead of a whole power-on.
  const up = solveSteady(
    rec,
    { supply: high, warm: { ...warmFrom(cold), scale: high.vrms / supply.vrms }, ...choices },
    budget,
  );
  if (!up.ok) return up;
  const down = solveSteady(
    rec,
    { supply, warm: { ...warmFrom(up.value), scale: supply.vrms / high.vrms }, ...choices },
    budget,
  );
  if (!down.ok) return down;
  return {
    ok: true,
    value: {
      state: withFigures(down.value),
      fromVrms: high.vrms,
      steps: up.value.steps + down.value.steps,
      cycles: up.value.steady.cycles + down.value.steady.cycles,
    },
  };
}
