/**
 * Which waveforms an analysis keeps for the plots: the supply voltage and line current always,
 * then the nets and parts a reader looks at first. The solver returns every net and part; keeping
 * all of them for a 200-part board would make each stored result megabytes for no reader.
 */
import type { TeardownRecord } from "./record/types.js";

/** The most net and part series kept beside the supply voltage and input current. */
export const MAX_STORED_NET_SERIES = 6;
export const MAX_STORED_PART_SERIES = 6;
/** Significant digits kept in stored waveform samples (plots need no more). */
export const WAVEFORM_SIGNIFICANT_DIGITS = 4;

const PART_KINDS_WORTH_PLOTTING = new Set([
  "capacitor",
  "thyristor",
  "triac",
  "load",
  "led",
  "zener",
  "transformer",
  "fuse",
]);

const round = (v: number) =>
  v === 0 || !Number.isFinite(v) ? v : Number(v.toPrecision(WAVEFORM_SIGNIFICANT_DIGITS));

/** A smaller set of the solver's waveforms, rounded for storage. */
export function selectStoredWaveforms(
  record: TeardownRecord,
  waveforms: { t: number[]; series: Record<string, number[]> },
  netPeaks: Record<string, { peak: number | null }>,
  partRms: Record<string, { current_rms: number | null }>,
): { t: number[]; series: Record<string, number[]> } {
  const keep: string[] = ["supply.voltage", "input.current"].filter((k) => k in waveforms.series);
  const nets = Object.keys(record.nets)
    .filter((n) => `net.${n}` in waveforms.series && record.nets[n]!.role !== "neutral")
    .sort((a, b) => {
      const wa = record.nets[a]!.role || record.nets[a]!.accessible ? 1 : 0;
      const wb = record.nets[b]!.role || record.nets[b]!.accessible ? 1 : 0;
      return wb - wa || (netPeaks[b]?.peak ?? 0) - (netPeaks[a]?.peak ?? 0) || a.localeCompare(b);
    })
    .slice(0, MAX_STORED_NET_SERIES);
  const parts = record.parts
    .filter((p) => PART_KINDS_WORTH_PLOTTING.has(p.kind) && `${p.ref}.current` in waveforms.series)
    .sort(
      (a, b) =>
        (partRms[b.ref]?.current_rms ?? 0) - (partRms[a.ref]?.current_rms ?? 0) ||
        a.ref.localeCompare(b.ref),
    )
    .slice(0, MAX_STORED_PART_SERIES);
  keep.push(...nets.map((n) => `net.${n}`), ...parts.map((p) => `${p.ref}.current`));
  const series: Record<string, number[]> = {};
  for (const k of keep) series[k] = waveforms.series[k]!.map(round);
  return { t: waveforms.t.map(round), series };
}
