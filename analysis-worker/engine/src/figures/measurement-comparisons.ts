/**
 * Measured against predicted: each measurement's figure computed from a solved steady cycle
 * (the record's measurement kinds), its predicted band over the parts' tolerances at the
 * measurement's own supply (tolerance-bands.ts), widened by the measurement's stated
 * uncertainty, and the verdict: inside the band agrees, outside disagrees.
 */
import type { Assumption } from "../record/gaps-and-assumptions.js";
import type { Measurement, MeasurementKind, Supply, TeardownRecord } from "../record/types.js";
import type { Budget } from "../solver/transient.js";
import { GROUND } from "../solver/circuit-model.js";
import type { SolvedCircuit } from "./solved-variant.js";
import { periodMean, periodRms, peakMagnitude } from "./waveform-stats.js";
import type { BandResult } from "./tolerance-bands.js";
import { toleranceBands } from "./tolerance-bands.js";

/** One measurement against its predicted band. */
export interface Comparison {
  /** Index of the measurement in the record. */
  measurement: number;
  what: MeasurementKind;
  measured: number;
  predicted: number;
  low: number;
  high: number;
  verdict: "agrees" | "disagrees";
}

/** A figure read off a solved steady cycle, or null when it cannot be (an unknown net or part). */
export type FigureOf = (s: SolvedCircuit) => number | null;

/** Voltage of a net at each steady sample (the cycle's end point stands for t = 0), or null for an unsolved net. */
function netSeries(s: SolvedCircuit, net: string): { t: number[]; v: number[] } | null {
  const c = s.circuit;
  const node = net === c.reference ? GROUND : c.nodeNames.indexOf(net);
  if (node !== GROUND && node < 0) return null;
  const samples = s.steady.run.samples;
  const last = samples[samples.length - 1]!;
  const all = [{ t: 0, x: last.x }, ...samples];
  return { t: all.map((p) => p.t), v: all.map((p) => (node === GROUND ? 0 : p.x[node]!)) };
}

/** The function that reads a measurement's figure from a solved cycle. */
export function figureOfMeasurement(m: Measurement): FigureOf {
  switch (m.what) {
    case "input.current_rms":
      return (s) => s.figures.input.current_rms;
    case "input.power":
      return (s) => s.figures.input.power;
    case "input.apparent_power":
      return (s) => s.figures.input.apparent_power;
    case "input.power_factor":
      return (s) => s.figures.input.power_factor;
    case "voltage.dc":
    case "voltage.rms":
    case "voltage.peak":
      return (s) => {
        if (m.between === null) return null;
        const a = netSeries(s, m.between[0]);
        const b = netSeries(s, m.between[1]);
        if (a === null || b === null) return null;
        const d = a.v.map((v, k) => v - b.v[k]!);
        if (m.what === "voltage.dc") return periodMean(a.t, d);
        return m.what === "voltage.rms" ? periodRms(a.t, d) : peakMagnitude(d);
      };
    case "part.current_rms":
      return (s) => (m.part === null ? null : (s.figures.parts[m.part]?.current_rms ?? null));
    case "part.power":
      return (s) => (m.part === null ? null : (s.figures.parts[m.part]?.power ?? null));
    default: {
      const never: never = m.what;
      throw new Error(`unhandled measurement kind ${String(never)}`);
    }
  }
}

/** The measurement's stated uncertainty in its own unit (0 when none is stated). */
export function uncertaintyOf(m: Measurement): number {
  if (m.uncertainty === null) return 0;
  return "relative" in m.uncertainty
    ? Math.abs(m.uncertainty.relative * m.value)
    : Math.abs(m.uncertainty.absolute);
}

/** One compared measurement with the band behind it. */
export interface MeasurementCheck {
  comparison: Comparison;
  band: { nominal: number; low: number; high: number; uncertainty: number; samples: number };
  supply: Supply;
  figure: FigureOf;
  /** The nominal solve at the measurement's supply (for the hints). */
  nominal: SolvedCircuit;
}

/** Options of the comparison: the Monte Carlo seed and size, the shared budget, and nominal solves already made. */
export interface CompareOptions {
  seed: number;
  samples: number;
  budget: Budget;
  /** A nominal solve to reuse at a supply (the analysed one), or null. */
  reuse?: { supply: Supply; solved: SolvedCircuit } | null;
}

function sameSupply(a: Supply, b: Supply): boolean {
  return a.vrms === b.vrms && a.hz === b.hz;
}

/** Compares every measurement of the record with its predicted band; measurements whose figure cannot be read are noted and left out. */
export function compareMeasurements(
  rec: TeardownRecord,
  opts: CompareOptions,
): { checks: MeasurementCheck[]; assumptions: Assumption[]; notes: string[] } {
  const notes: string[] = [];
  const assumptions: Assumption[] = [];
  const checks: MeasurementCheck[] = [];
  const groups: Array<{ supply: Supply; members: number[] }> = [];
  rec.measurements.forEach((m, i) => {
    const g = groups.find((x) => sameSupply(x.supply, m.supply));
    if (g) g.members.push(i);
    else groups.push({ supply: m.supply, members: [i] });
  });
  for (const g of groups) {
    const figures = g.members.map((i) => figureOfMeasurement(rec.measurements[i]!));
    const reuse =
      opts.reuse && sameSupply(opts.reuse.supply, g.supply) ? opts.reuse.solved : undefined;
    const bands: BandResult = toleranceBands(rec, g.supply, figures, {
      seed: opts.seed,
      samples: opts.samples,
      budget: opts.budget,
      nominal: reuse,
    });
    notes.push(...bands.notes);
    for (const a of bands.assumptions)
      if (!assumptions.some((x) => x.part === a.part && x.field === a.field)) assumptions.push(a);
    const nominal = bands.nominalSolve;
    if (nominal === null) continue;
    g.members.forEach((i, k) => {
      const m = rec.measurements[i]!;
      const b = bands.figures[k]!;
      if (b === null) {
        notes.push(
          `measurements[${i}] (${m.what}): the figure cannot be read from the solved circuit (unknown net or part), so it was not compared`,
        );
        return;
      }
      const u = uncertaintyOf(m);
      const low = b.low - u;
      const high = b.high + u;
      checks.push({
        comparison: {
          measurement: i,
          what: m.what,
          measured: m.value,
          predicted: b.nominal,
          low,
          high,
          verdict: m.value >= low && m.value <= high ? "agrees" : "disagrees",
        },
        band: {
          nominal: b.nominal,
          low: b.low,
          high: b.high,
          uncertainty: u,
          samples: bands.samplesUsed,
        },
        supply: g.supply,
        figure: figures[k]!,
        nominal,
      });
    });
  }
  checks.sort((a, b) => a.comparison.measurement - b.comparison.measurement);
  return { checks, assumptions, notes };
}
