/**
 * What-if runs: a sweep of one part's value, and the nearest IEC 60063 (E12/E24) value of a
 * trigger resistor that makes a thyristor or triac fire at a wanted angle at a given supply.
 */
import type { Supply, TeardownRecord } from "../record/types.js";
import { nearestInSeries } from "../values/e-series.js";
import type { SolverOutcome } from "../solver/solver-error.js";
import { solverFailure } from "../solver/solver-error.js";
import { partValueOf, withPartValues } from "../solver/variants/part-value.js";
import type { CircuitAnalysis, SolveOptions } from "./analyze-circuit.js";
import { analyzeCircuit, solveCircuit } from "./analyze-circuit.js";

/** The search for a trigger resistor widens its bracket by this factor per try... */
const BRACKET_FACTOR = 2;
/** ...at most this many times each way (2^24, about 1.6e7). */
const BRACKET_TRIES = 24;
/** The continuous resistor value is found to this relative precision. */
const RESISTOR_RELATIVE_PRECISION = 1e-4;
/** A thyristor that does not fire counts as firing at the end of the half-cycle. */
const NO_FIRING_ANGLE_DEG = 180;

/** The record with part `ref`'s value changed, by the one value-change rule (a load's lives in its model). */
function withValue(rec: TeardownRecord, ref: string, value: number): TeardownRecord {
  return withPartValues(rec, new Map([[ref, value]]));
}

/** One point of a sweep. */
export interface SweepPoint {
  value: number;
  result: SolverOutcome<CircuitAnalysis>;
}

/**
 * Analyses the record once per value of part `ref` (its changeable value replaced: a load's
 * resistance or capacitance, else its main value). A part with no value a variant can change
 * is refused, since sweeping it would change nothing.
 */
export function sweepPartValue(
  rec: TeardownRecord,
  ref: string,
  values: number[],
  opts: SolveOptions = {},
): SolverOutcome<SweepPoint[]> {
  const p = rec.parts.find((q) => q.ref === ref);
  if (p === undefined)
    return solverFailure("unknown-part", `no part ${ref} in the record`, { parts: [ref] });
  if (partValueOf(p) === null)
    return solverFailure("unknown-part", `${ref} has no value a sweep can change`, {
      parts: [ref],
    });
  return {
    ok: true,
    value: values.map((value) => ({
      value,
      result: analyzeCircuit(withValue(rec, ref, value), opts),
    })),
  };
}

/** What to look for: which thyristor/triac, which resistor to change, the wanted angle, the supply and the series. */
export interface TriggerRequest {
  thyristor: string;
  resistor: string;
  wantedAngleDeg: number;
  supply?: Supply;
  series: "E12" | "E24";
}

/** The suggestion: the continuous value, the nearest series value and the angle that value gives. */
export interface TriggerSuggestion {
  continuous_ohms: number;
  suggested_ohms: number;
  series: "E12" | "E24";
  angle_deg: number | null;
  wanted_angle_deg: number;
}

/** Nearest E12/E24 value of `resistor` making `thyristor` fire at the wanted angle (positive half-cycle). */
export function suggestTriggerResistor(
  rec: TeardownRecord,
  req: TriggerRequest,
  opts: SolveOptions = {},
): SolverOutcome<TriggerSuggestion> {
  const r0 = rec.parts.find((p) => p.ref === req.resistor);
  if (!r0 || r0.kind !== "resistor" || r0.value === null || !(r0.value > 0))
    return solverFailure("unknown-part", `${req.resistor} is not a resistor with a value`, {
      parts: [req.resistor],
    });
  if (
    !rec.parts.some(
      (p) => p.ref === req.thyristor && (p.kind === "thyristor" || p.kind === "triac"),
    )
  )
    return solverFailure("unknown-part", `${req.thyristor} is not a thyristor or triac`, {
      parts: [req.thyristor],
    });
  const run = { ...opts, supply: req.supply ?? opts.supply ?? rec.device.rated_supply };
  const angleAt = (r: number): SolverOutcome<number> => {
    const s = solveCircuit(withValue(rec, req.resistor, r), run);
    if (!s.ok) return s;
    const f = s.value.figures.firings.find((g) => g.part === req.thyristor);
    return { ok: true, value: f?.angle_deg ?? NO_FIRING_ANGLE_DEG };
  };
  const g = (r: number): SolverOutcome<number> => {
    const a = angleAt(r);
    return a.ok ? { ok: true, value: a.value - req.wantedAngleDeg } : a;
  };
  // Bracket a sign change of g in log(R) around the present value, then bisect.
  const g0 = g(r0.value);
  if (!g0.ok) return g0;
  let lo = r0.value;
  const glo = g0.value;
  let hi = r0.value;
  let found = glo === 0;
  for (let k = 1; k <= BRACKET_TRIES && !found; k++) {
    for (const cand of [r0.value * BRACKET_FACTOR ** k, r0.value / BRACKET_FACTOR ** k]) {
      const gc = g(cand);
      if (!gc.ok) return gc;
      if (Math.sign(gc.value) !== Math.sign(glo)) {
        hi = cand;
        found = true;
        break;
      }
    }
  }
  if (!found)
    return solverFailure(
      "no-convergence",
      `no value of ${req.resistor} gives a firing angle of ${req.wantedAngleDeg}°`,
      { parts: [req.resistor, req.thyristor] },
    );
  let a = Math.min(lo, hi);
  let b = Math.max(lo, hi);
  const ga = g(a);
  if (!ga.ok) return ga;
  let gaV = ga.value;
  while (b / a - 1 > RESISTOR_RELATIVE_PRECISION && gaV !== 0) {
    const mid = Math.sqrt(a * b);
    const gm = g(mid);
    if (!gm.ok) return gm;
    if (Math.sign(gm.value) === Math.sign(gaV)) {
      a = mid;
      gaV = gm.value;
    } else b = mid;
  }
  lo = gaV === 0 ? a : Math.sqrt(a * b);
  const suggested = nearestInSeries(lo, req.series)!;
  const final = angleAt(suggested);
  if (!final.ok) return final;
  return {
    ok: true,
    value: {
      continuous_ohms: lo,
      suggested_ohms: suggested,
      series: req.series,
      angle_deg: final.value >= NO_FIRING_ANGLE_DEG ? null : final.value,
      wanted_angle_deg: req.wantedAngleDeg,
    },
  };
}
