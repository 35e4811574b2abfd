/**
 * The lowest supply at which a thyristor or triac still fires in every half-cycle it fires in at
 * the rated supply. A bracket [does not fire, fires] on the supply voltage is narrowed to
 * MIN_SUPPLY_RESOLUTION_V, like a bisection, but the next supply is not always the midpoint:
 * a steady state that does not fire still says how far its gate current stays below igt (the
 * gate margin, smooth in the supply), and a secant on that margin points close to the threshold,
 * so a few steady states do the work of the bisection's nine. A first guess (from the firing
 * angle at the rated supply) is tried first as a pair just above and below it, which closes the
 * bracket in two steady states when the guess is good. The bracket is what decides; the guess
 * and the secant only choose where to look, and the midpoint is taken whenever they would not help.
 */
import type { Circuit, CircuitDevice } from "./circuit-model.js";
import type { SteadyState } from "./periodic-steady-state.js";
import type { SolverOutcome } from "./solver-error.js";
import type { CycleSample } from "./transient.js";
import { switchingCurrents } from "./transient-stamps.js";

/** The half-cycles a switching device fires in. */
export interface FiringHalves {
  positive: boolean;
  negative: boolean;
}

/** Most steady states one search may take (the bisection over 0..rated at 0.5 V takes nine). */
export const MIN_SUPPLY_MAX_TRIES = 16;

/** One steady state at a trial supply: whether it fires as required, and its gate margin when it does not. */
export interface FiringTrial {
  fires: boolean;
  /** Peak gate current over igt, less one, in the required half-cycles (< 0: short of firing); null when unknown. */
  margin: number | null;
}

/**
 * Gate margin of a switching device in a steady state that does not fire: the smallest, over
 * the half-cycles it must fire in, of (peak off-state gate drive / igt − 1). A thyristor's
 * gate only counts while its anode is positive, as in the latch rule.
 */
export function gateMargin(
  c: Circuit,
  steady: SteadyState,
  ref: string,
  halves: FiringHalves,
): number | null {
  return gateMarginOver(c, steady.run.samples, ref, halves);
}

/** The gate margin (see gateMargin) over any recorded samples of whole cycles: a start transient, a steady window. */
export function gateMarginOver(
  c: Circuit,
  samples: ReadonlyArray<CycleSample>,
  ref: string,
  halves: FiringHalves,
): number | null {
  const d = c.devices.find(
    (q): q is Extract<CircuitDevice, { type: "switching" }> =>
      q.type === "switching" && q.ref === ref,
  );
  if (d === undefined) return null;
  const period = 1 / c.supply.hz;
  let posPeak = -Infinity;
  let negPeak = -Infinity;
  for (const s of samples) {
    if (s.mem[d.mem]! > 0.5) continue;
    const { gate, vMain } = switchingCurrents(d, s.x, s.mem);
    if (!d.triac && vMain <= 0) continue;
    const g = d.triac ? Math.abs(gate) : gate;
    const inCycle = s.t - Math.floor(s.t / period) * period;
    if (inCycle < period / 2) posPeak = Math.max(posPeak, g);
    else negPeak = Math.max(negPeak, g);
  }
  let peak = Infinity;
  if (halves.positive) peak = Math.min(peak, posPeak);
  if (halves.negative) peak = Math.min(peak, negPeak);
  return Number.isFinite(peak) ? peak / d.p.igt - 1 : null;
}

/** The next trial supply inside (lo, hi): the secant's estimate, nudged to close the bracket, or the midpoint. */
function nextTrial(
  lo: number,
  hi: number,
  misses: Array<{ v: number; m: number }>,
  resolution: number,
  secantUseful: boolean,
): number {
  const mid = 0.5 * (lo + hi);
  if (!secantUseful || misses.length === 0) return mid;
  const [a, b] = misses.length >= 2 ? misses.slice(-2) : [{ v: 0, m: -1 }, misses[0]!];
  // Two misses (or one and the origin, where the gate drive is zero): the margin's zero.
  const est = b!.m !== a!.m ? b!.v - (b!.m * (b!.v - a!.v)) / (b!.m - a!.m) : NaN;
  if (!(est > lo && est < hi)) return mid;
  // Close enough to an end: step just past the estimate, so one trial can end the search.
  let p = est;
  if (est - lo < resolution / 2) p = lo + 0.99 * resolution;
  else if (hi - est < resolution / 2) p = hi - 0.99 * resolution;
  return Math.min(Math.max(p, lo + 0.01 * resolution), hi - 0.01 * resolution);
}

/**
 * Narrows [0, rated] to the lowest firing supply within `resolution` volts; `trial` solves one
 * supply, `guess` (optional) is where to look first. The answer is the lowest supply that was seen to fire (the bracket's upper end).
 */
export function lowestFiringSupply(
  rated: number,
  resolution: number,
  trial: (vrms: number) => SolverOutcome<FiringTrial>,
  guess?: number,
): SolverOutcome<{ vrms: number; trials: number }> {
  let lo = 0;
  let hi = rated;
  const misses: Array<{ v: number; m: number }> = [];
  const widths: number[] = [];
  let trials = 0;
  // A first guess inside the bracket is tried as a pair just above and just below it: when
  // the threshold lies between them the bracket closes in two trials.
  const pair =
    guess !== undefined && guess > resolution && guess < rated - resolution
      ? [guess + 0.49 * resolution, guess - 0.49 * resolution]
      : [];
  while (hi - lo > resolution && trials < MIN_SUPPLY_MAX_TRIES) {
    // The secant has to halve the bracket every two trials, or the midpoint takes over.
    const stalled = widths.length >= 2 && hi - lo > 0.5 * widths[widths.length - 2]!;
    let v = nextTrial(lo, hi, misses, resolution, !stalled);
    const planned = pair.shift();
    if (planned !== undefined && planned > lo && planned < hi) v = planned;
    widths.push(hi - lo);
    const r = trial(v);
    trials++;
    if (!r.ok) return r;
    if (r.value.fires) hi = v;
    else {
      lo = v;
      if (r.value.margin !== null && r.value.margin < 0) misses.push({ v, m: r.value.margin });
    }
  }
  return { ok: true, value: { vrms: hi, trials } };
}
