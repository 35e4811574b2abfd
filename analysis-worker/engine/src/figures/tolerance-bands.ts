/**
 * Predicted bands over the parts' tolerances: a seeded Monte Carlo (mulberry32) in which every
 * toleranced value is drawn uniformly within ± its tolerance (the reading of a tolerance as
 * "anywhere inside"), each sample solved to its periodic steady state from the nominal state,
 * and the band is the range of the samples together with the nominal. Parts without a stated
 * tolerance get a default by kind, reported as an assumption. Same record and seed, same band.
 */
import type { Assumption } from "../record/gaps-and-assumptions.js";
import type { Part, Supply, TeardownRecord } from "../record/types.js";
import type { Budget } from "../solver/transient.js";
import { budgetSpent } from "../solver/variants/budget.js";
import { partValueOf } from "../solver/variants/part-value.js";
import { mulberry32, uniformBetween } from "../solver/variants/seeded-random.js";
import { warmFrom } from "../solver/variants/steady-variant.js";
import type { SolvedCircuit } from "./solved-variant.js";
import {
  SAMPLE_MAX_CYCLES,
  SAMPLE_TOLERANCE_SCALE,
  solveVariant,
  solveWithFigures,
} from "./solved-variant.js";

/** Default Monte Carlo samples per supply. */
export const DEFAULT_TOLERANCE_SAMPLES = 40;
/** Default seed (fixed, so bands repeat). */
export const DEFAULT_TOLERANCE_SEED = 20_240_601;

/** Default tolerances by kind (common practice; a load's is our own assumption). */
export const DEFAULT_TOLERANCES = {
  resistor: 0.05,
  filmCapacitor: 0.1,
  electrolytic: 0.2,
  inductor: 0.1,
  zener: 0.05,
  varistor: 0.1,
  load: 0.1,
} as const;

/** A part's tolerance: the record's, else the default for its kind (with the assumption naming it), else null. */
export function toleranceOf(p: Part): { tolerance: number; assumed: Assumption | null } | null {
  if (partValueOf(p) === null) return null;
  if (p.tolerance !== null) return { tolerance: p.tolerance, assumed: null };
  const d = DEFAULT_TOLERANCES;
  const pick = (t: number, what: string) => ({
    tolerance: t,
    assumed: {
      part: p.ref,
      field: "tolerance",
      value: t,
      why: `±${Math.round(t * 100)} % for a ${what}`,
    },
  });
  switch (p.kind) {
    case "resistor":
      return pick(d.resistor, "resistor (common practice)");
    case "capacitor":
      return p.polarised
        ? pick(d.electrolytic, "electrolytic capacitor (common practice)")
        : pick(d.filmCapacitor, "film capacitor (common practice)");
    case "inductor":
      return pick(d.inductor, "inductor (common practice)");
    case "zener":
      return pick(d.zener, "zener's voltage (common practice)");
    case "varistor":
      return pick(d.varistor, "varistor's voltage (common practice)");
    case "load":
      return pick(d.load, "load (our own assumption; loads state none)");
    default:
      return null;
  }
}

/** One figure's band: nominal and the range over the samples (nominal included). */
export interface FigureBand {
  nominal: number;
  low: number;
  high: number;
}

/** Bands of several figures at one supply. */
export interface BandResult {
  figures: Array<FigureBand | null>;
  samplesUsed: number;
  nominalSolve: SolvedCircuit | null;
  /** The tolerances assumed by kind where the record states none. */
  assumptions: Assumption[];
  /** What cut the run short or was left out. */
  notes: string[];
}

/** Options of a band run. */
export interface BandOptions {
  seed: number;
  samples: number;
  budget: Budget;
  /** A nominal solve at this supply to reuse. */
  nominal?: SolvedCircuit;
  /** Scale every part's tolerance by this factor (1 by default), for what-if widths. */
  widen?: number;
}

/** Seeded Monte Carlo bands of the given figures at one supply. */
export function toleranceBands(
  rec: TeardownRecord,
  supply: Supply,
  figures: ReadonlyArray<(s: SolvedCircuit) => number | null>,
  opts: BandOptions,
): BandResult {
  const notes: string[] = [];
  let nominal = opts.nominal;
  if (nominal === undefined) {
    const s = solveVariant(rec, supply, opts.budget);
    if (!s.ok) {
      notes.push(
        `bands at ${supply.vrms} V / ${supply.hz} Hz: the nominal solve failed (${s.error.code}: ${s.error.message})`,
      );
      return {
        figures: figures.map(() => null),
        samplesUsed: 0,
        nominalSolve: null,
        assumptions: [],
        notes,
      };
    }
    nominal = s.value;
  }
  const nominalValues = figures.map((f) => f(nominal!));
  const low = nominalValues.map((v) => v);
  const high = nominalValues.map((v) => v);
  const varied = rec.parts
    .map((p) => ({ p, tol: toleranceOf(p), v: partValueOf(p) }))
    .filter((x) => x.tol !== null && x.v !== null && x.tol.tolerance > 0);
  const assumptions = varied.flatMap((x) => (x.tol!.assumed ? [x.tol!.assumed] : []));
  const random = mulberry32(opts.seed);
  const widen = opts.widen ?? 1;
  let used = 0;
  for (let k = 0; k < opts.samples && varied.length > 0; k++) {
    if (budgetSpent(opts.budget)) {
      notes.push(
        `bands at ${supply.vrms} V: the time budget ended the Monte Carlo after ${used} of ${opts.samples} samples`,
      );
      break;
    }
    const values = new Map<string, number>();
    for (const x of varied) {
      const t = Math.min(x.tol!.tolerance * widen, 0.99);
      values.set(x.p.ref, x.v!.value * uniformBetween(random, 1 - t, 1 + t));
    }
    // Every sample starts from the nominal steady state (same memory layout: only values change).
    const s = solveWithFigures(
      rec,
      {
        supply,
        values,
        warm: warmFrom(nominal),
        toleranceScale: SAMPLE_TOLERANCE_SCALE,
        maxCycles: SAMPLE_MAX_CYCLES,
      },
      opts.budget,
    );
    if (!s.ok) {
      notes.push(`bands: sample ${k} did not solve (${s.error.code}); left out`);
      continue;
    }
    used++;
    figures.forEach((f, i) => {
      const v = f(s.value);
      if (v === null || low[i] === null || high[i] === null) return;
      low[i] = Math.min(low[i]!, v);
      high[i] = Math.max(high[i]!, v);
    });
  }
  return {
    figures: nominalValues.map((v, i) =>
      v === null ? null : { nominal: v, low: low[i]!, high: high[i]! },
    ),
    samplesUsed: used,
    nominalSolve: nominal,
    assumptions,
    notes,
  };
}
