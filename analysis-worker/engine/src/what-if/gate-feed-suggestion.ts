/**
 * When a thyristor or triac that fires at the rated supply does not fire (or fires later) at a
 * what-if supply, the largest E24 value of its gate-feed resistor with which it fires, in every
 * half-cycle it fires in at the rated supply, no later than it does there.
 *
 * A smaller feed resistor drives more gate current at every instant, so the latest firing angle
 * only moves earlier as the value falls: the values that work are all those below a threshold.
 * The search halves the present value until one works (that brackets the threshold), then
 * bisects over the E24 values between, each trial one periodic steady state at the what-if supply.
 */
import { firingFigures, type FiringFigures } from "../figures/circuit-figures.js";
import type { Supply, TeardownRecord } from "../record/types.js";
import { solveCircuit } from "../solver/analyze-circuit.js";
import { E_SERIES } from "../values/e-series.js";
import { gateFeedResistor } from "./gate-feed-resistor.js";
import { withValues } from "./what-if-input.js";

/** The series suggestions are drawn from: the common stock resistor series. */
export const SUGGESTION_SERIES = "E24" as const;
/** The bracket halves the value at most this many times (2^-12: about 1/4000 of it). */
const MAX_HALVINGS = 12;
/** Firing instants come from step events: an angle this close to the rated one counts as no later. */
export const ANGLE_TOLERANCE_DEG = 0.01;

/** How a device fires: in which halves, and the later of its angles there. */
export interface FiringAt {
  fires: boolean;
  halves: FiringFigures["halves"];
  /** The later of its positive- and negative-half angles, in degrees; null when it does not fire. */
  latest_deg: number | null;
}

/** The firing of one device in a solved steady state. */
export function firingOf(f: FiringFigures | undefined): FiringAt {
  if (f === undefined || !f.fires)
    return { fires: false, halves: { positive: false, negative: false }, latest_deg: null };
  const angles = [f.angle_deg, f.angle_negative_deg].filter((a): a is number => a !== null);
  return {
    fires: true,
    halves: f.halves,
    latest_deg: angles.length > 0 ? Math.max(...angles) : 0,
  };
}

/** True when `f` fires in every half `ref` fires in, no later than `ref` does. */
export function firesAsWell(f: FiringAt, ref: FiringAt): boolean {
  if (!f.fires) return false;
  if ((ref.halves.positive && !f.halves.positive) || (ref.halves.negative && !f.halves.negative))
    return false;
  return (f.latest_deg ?? 0) <= (ref.latest_deg ?? 0) + ANGLE_TOLERANCE_DEG;
}

/** The suggestion as stored on the trigger. */
export interface GateFeedSuggestion {
  part: string;
  value: number;
  series: typeof SUGGESTION_SERIES;
  angle_deg: number | null;
}

export type SuggestionOutcome =
  | { ok: true; suggestion: GateFeedSuggestion; trials: number }
  | { ok: false; note: string; trials: number };

/** E24 values in (lo, hi), ascending. */
function e24Between(lo: number, hi: number): number[] {
  const out: number[] = [];
  for (let d = Math.floor(Math.log10(lo)) - 1; d <= Math.ceil(Math.log10(hi)); d++)
    for (const m of E_SERIES[SUGGESTION_SERIES]) {
      const v = Number(`${m}e${d}`); // through text, so 4.7e3 is exactly 4700
      if (v > lo * (1 + 1e-9) && v < hi * (1 - 1e-9)) out.push(v);
    }
  return out.sort((a, b) => a - b);
}

/** The largest E24 value ≤ v (v itself when it is one). */
function e24AtOrBelow(v: number): number {
  const below = e24Between(v / 20, v * (1 + 2e-9));
  return below[below.length - 1]!;
}

export interface SuggestionOptions {
  now?: () => number;
  /** The time the whole search may take, in ms of `now`. */
  budgetMs?: number;
}

/**
 * The gate-feed resistor value to suggest for device `ref` of `record` at `supply`, given how it
 * fires at the rated supply (`rated`). Fails with a plain note when there is no such resistor,
 * when no value down to 1/4000 of the present one fires it, or when the time runs out.
 */
export function suggestGateFeed(
  record: TeardownRecord,
  ref: string,
  supply: Supply,
  rated: FiringAt,
  opts: SuggestionOptions = {},
): SuggestionOutcome {
  let trials = 0;
  const feed = gateFeedResistor(record, ref);
  const part = feed === null ? undefined : record.parts.find((p) => p.ref === feed);
  if (part === undefined || part.value === null || !(part.value > 0))
    return {
      ok: false,
      note: `no single resistor feeds the gate of ${ref} from the supply side, so there is no value to suggest`,
      trials,
    };
  const now = opts.now;
  const deadline = now ? now() + (opts.budgetMs ?? Infinity) : Infinity;
  const tried = new Map<number, FiringAt | null>();
  // One steady state with the feed resistor at `r`; null when the solver gave up or time ran out.
  const at = (r: number): FiringAt | null | "out-of-time" => {
    if (tried.has(r)) return tried.get(r)!;
    const left = now ? deadline - now() : Infinity;
    if (left <= 0) return "out-of-time";
    trials++;
    const solved = solveCircuit(withValues(record, new Map([[part.ref, r]])), {
      supply,
      minSupply: false,
      ...(now ? { now, budgetMs: left } : {}),
    });
    if (!solved.ok && solved.error.code === "time-budget") return "out-of-time";
    const f = solved.ok
      ? firingOf(
          firingFigures(solved.value.circuit, solved.value.steady).find((g) => g.part === ref),
        )
      : null;
    tried.set(r, f);
    return f;
  };
  const works = (f: FiringAt | null) => f !== null && firesAsWell(f, rated);
  const outOfTime = {
    ok: false as const,
    note: `the time for the analysis ran out before a value of ${part.ref} was found`,
  };

  // Bracket: `bad` does not work, `good` does.
  let bad = part.value;
  let good: number | null = null;
  for (let k = 1; k <= MAX_HALVINGS && good === null; k++) {
    const r = e24AtOrBelow(part.value / 2 ** k);
    const f = at(r);
    if (f === "out-of-time") return { ...outOfTime, trials };
    if (works(f)) good = r;
    else bad = r;
  }
  if (good === null)
    return {
      ok: false,
      note: `${ref} does not fire as it does at the rated supply even with ${part.ref} at 1/${2 ** MAX_HALVINGS} of its value`,
      trials,
    };
  // Bisect over the E24 values strictly between the two.
  let between = e24Between(good, bad);
  let goodF = at(good) as FiringAt;
  while (between.length > 0) {
    const mid = between[Math.floor(between.length / 2)]!;
    const f = at(mid);
    if (f === "out-of-time") return { ...outOfTime, trials };
    if (works(f)) {
      good = mid;
      goodF = f!;
      between = between.filter((v) => v > mid);
    } else between = between.filter((v) => v < mid);
  }
  return {
    ok: true,
    suggestion: {
      part: part.ref,
      value: good,
      series: SUGGESTION_SERIES,
      angle_deg: goodF.latest_deg,
    },
    trials,
  };
}
