/**
 * Which traced value would explain a measurement that disagrees: each valued part's normalised
 * sensitivity of the figure (finite difference: (Δf/f)/(Δv/v) for a 5 % change), the parts
 * ranked by it, and for the top part the value that makes the prediction match, by the secant
 * method on log(value). For a capacitor the nearest E6 and E12 values (a misread marking?),
 * for a resistor the nearest E12 and E24 values.
 */
import type { Part, Supply, TeardownRecord } from "../record/types.js";
import { kindInfo } from "../graph/kinds.js";
import type { Budget } from "../solver/transient.js";
import { budgetSpent } from "../solver/variants/budget.js";
import { partValueOf } from "../solver/variants/part-value.js";
import { warmFrom } from "../solver/variants/steady-variant.js";
import { nearestInSeries } from "../values/e-series.js";
import type { SolvedCircuit } from "./solved-variant.js";
import { solveWithFigures } from "./solved-variant.js";

/** Relative change of a value for the finite-difference sensitivity. */
export const SENSITIVITY_STEP = 0.05;
/** Secant iterations at most. */
export const SECANT_MAX_ITERATIONS = 10;
/** The explaining value is accepted when the figure is this close to the measurement (relative). */
export const SECANT_RELATIVE_TOLERANCE = 0.002;
/** One secant step may change the value by at most this factor either way. */
const SECANT_MAX_FACTOR_PER_STEP = 4;
/** Sensitivities smaller than this are not worth ranking. */
const MIN_SENSITIVITY = 1e-4;

/** One ranked part. */
export interface PartSensitivity {
  part: string;
  /** (Δf/f)/(Δv/v). */
  sensitivity: number;
}

/** The hint for one disagreeing measurement. */
export interface MismatchHint {
  ranking: PartSensitivity[];
  /** The top part's value that explains the measurement, or null when none was found in the budget. */
  explaining: {
    part: string;
    nominal_value: number;
    explaining_value: number;
    factor: number;
    achieved: number;
    nearest: Record<string, number | null>;
  } | null;
}

/** The unit of the value a hint varies: a load's resistance or capacitance, else the kind's unit. */
export function valueUnitOf(p: Part): string {
  const slot = partValueOf(p)?.slot;
  if (slot === "model.r") return "Ω";
  if (slot === "model.c") return "F";
  return kindInfo(p.kind)?.unit ?? "";
}

/** Ranks the parts by sensitivity of `figure` and solves the top part's explaining value. */
export function mismatchHint(
  rec: TeardownRecord,
  supply: Supply,
  nominal: SolvedCircuit,
  figure: (s: SolvedCircuit) => number | null,
  target: number,
  budget: Budget,
): MismatchHint {
  const f0 = figure(nominal);
  if (f0 === null) return { ranking: [], explaining: null };
  const at = (ref: string, value: number): number | null => {
    const s = solveWithFigures(
      rec,
      { supply, values: new Map([[ref, value]]), warm: warmFrom(nominal) },
      budget,
    );
    return s.ok ? figure(s.value) : null;
  };
  const ranking: PartSensitivity[] = [];
  const firstStep = new Map<string, number>();
  for (const p of rec.parts) {
    const v = partValueOf(p);
    if (v === null) continue;
    if (budgetSpent(budget)) break;
    const f1 = at(p.ref, v.value * (1 + SENSITIVITY_STEP));
    if (f1 === null) continue;
    firstStep.set(p.ref, f1);
    const scale = Math.abs(f0) > 0 ? Math.abs(f0) : 1;
    const sens = (f1 - f0) / scale / SENSITIVITY_STEP;
    if (Math.abs(sens) >= MIN_SENSITIVITY) ranking.push({ part: p.ref, sensitivity: sens });
  }
  ranking.sort(
    (a, b) => Math.abs(b.sensitivity) - Math.abs(a.sensitivity) || (a.part < b.part ? -1 : 1),
  );
  const top = ranking[0];
  if (top === undefined) return { ranking, explaining: null };
  const part = rec.parts.find((p) => p.ref === top.part)!;
  const v0 = partValueOf(part)!.value;
  // Secant on u = ln(value): g(u) = figure - target.
  let ua = Math.log(v0);
  let ga = f0 - target;
  let ub = Math.log(v0 * (1 + SENSITIVITY_STEP));
  let gb = firstStep.get(top.part)! - target;
  let best = Math.abs(ga) < Math.abs(gb) ? { u: ua, g: ga } : { u: ub, g: gb };
  for (
    let k = 0;
    k < SECANT_MAX_ITERATIONS &&
    Math.abs(best.g) > SECANT_RELATIVE_TOLERANCE * Math.abs(target) &&
    !budgetSpent(budget);
    k++
  ) {
    if (gb === ga) break;
    let un = ub - (gb * (ub - ua)) / (gb - ga);
    const maxStep = Math.log(SECANT_MAX_FACTOR_PER_STEP);
    un = Math.min(ub + maxStep, Math.max(ub - maxStep, un));
    const fn = at(top.part, Math.exp(un));
    if (fn === null) break;
    ua = ub;
    ga = gb;
    ub = un;
    gb = fn - target;
    if (Math.abs(gb) < Math.abs(best.g)) best = { u: ub, g: gb };
  }
  const value = Math.exp(best.u);
  const found = Math.abs(best.g) <= 10 * SECANT_RELATIVE_TOLERANCE * Math.abs(target);
  const series = part.kind === "capacitor" ? (["E6", "E12"] as const) : (["E12", "E24"] as const);
  const nearest: Record<string, number | null> = {};
  for (const s of series) nearest[s] = nearestInSeries(value, s);
  return {
    ranking,
    explaining: found
      ? {
          part: top.part,
          nominal_value: v0,
          explaining_value: value,
          factor: value / v0,
          achieved: best.g + target,
          nearest,
        }
      : null,
  };
}
