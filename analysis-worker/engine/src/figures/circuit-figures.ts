/**
 * Figures of one steady cycle: input current RMS, real and apparent power, power factor and
 * THD of the line current; per part peak voltage, RMS current and mean dissipation; per net
 * DC, RMS and peak against the reference; per thyristor/triac whether and where it fires;
 * and the downsampled waveforms. Also the largest KCL residual over the cycle, as a check.
 */
import type { Circuit, CircuitDevice } from "../solver/circuit-model.js";
import { GMIN_SIEMENS, nodeV } from "../solver/mna.js";
import type { SteadyState } from "../solver/periodic-steady-state.js";
import { terminalCurrents } from "../solver/transient-stamps.js";
import { thdFromSamples } from "./fft.js";
import { peakMagnitude, periodMean, periodMeanProduct, periodRms, resampleUniform } from "./waveform-stats.js";

/** Uniform points per cycle for the line-current FFT (2^10). */
export const FFT_POINTS = 1024;
/** Most points per waveform series. */
export const MAX_WAVEFORM_POINTS = 1000;

/** The record-format input figures. */
export interface InputFigures {
  current_rms: number;
  power: number;
  apparent_power: number;
  power_factor: number | null;
  thd: number | null;
}

/** Per-part figures. */
export interface PartFigures {
  voltage_peak: number;
  current_rms: number;
  power: number;
}

/** Per-net figures against the reference. */
export interface NetFigures {
  dc: number;
  rms: number;
  peak: number;
}

/** Firing of one thyristor or triac in the steady cycle. */
export interface FiringFigures {
  part: string;
  fires: boolean;
  /** Degrees from the supply's positive-going zero crossing; null when it does not fire there. */
  angle_deg: number | null;
  /** Degrees from the negative-going zero crossing, when it fires in the negative half-cycle. */
  angle_negative_deg: number | null;
  /** Half-cycles with a firing. */
  halves: { positive: boolean; negative: boolean };
}

/** All figures of a steady cycle. */
export interface CycleFigures {
  input: InputFigures;
  parts: Record<string, PartFigures>;
  nets: Record<string, NetFigures>;
  firings: FiringFigures[];
  waveforms: { t: number[]; series: Record<string, number[]> };
  kclResidualAmps: number;
}

/** Computes the figures of the recorded steady cycle. */
export function cycleFigures(c: Circuit, steady: SteadyState): CycleFigures {
  const period = 1 / c.supply.hz;
  const run = steady.run;
  const last = run.samples[run.samples.length - 1]!;
  // The cycle is periodic: the end point stands for t = 0 as well.
  const samples = [{ t: 0, x: last.x, mem: last.mem }, ...run.samples];
  const t = samples.map((s) => s.t);
  const supply = c.devices.find((d): d is Extract<CircuitDevice, { type: "supply" }> => d.type === "supply")!;
  const vIn = samples.map((s) => nodeV(s.x, supply.terminals[0]!));
  const iIn = samples.map((s) => s.x[supply.branch]!);

  const currents = c.devices.map((d) => samples.map((s) => terminalCurrents(d, s.x, s.mem)));
  const parts: Record<string, PartFigures> = {};
  const series: Record<string, Float64Array | number[]> = { "supply.voltage": vIn, "input.current": iIn };
  c.devices.forEach((d, di) => {
    if (d.type === "supply") return;
    const volts = samples.map((s) => d.terminals.map((n) => nodeV(s.x, n)));
    let vPeak = 0;
    for (const v of volts) for (let a = 0; a < v.length; a++) for (let b = a + 1; b < v.length; b++) vPeak = Math.max(vPeak, Math.abs(v[a]! - v[b]!));
    const main = currents[di]!.map((i) => i[0]!);
    const power = samples.map((_, k) => volts[k]!.reduce((acc, v, q) => acc + v * currents[di]![k]![q]!, 0));
    parts[d.ref] = { voltage_peak: vPeak, current_rms: periodRms(t, main), power: periodMean(t, power) };
    series[`${d.ref}.current`] = main;
  });

  const nets: Record<string, NetFigures> = { [c.reference]: { dc: 0, rms: 0, peak: 0 } };
  const netNodes = c.nodeNames.map((n, i) => ({ n, i })).filter(({ n }) => !n.includes("#"));
  for (const { n, i } of netNodes) {
    const v = samples.map((s) => s.x[i]!);
    nets[n] = { dc: periodMean(t, v), rms: periodRms(t, v), peak: peakMagnitude(v) };
    series[`net.${n}`] = v;
  }

  // KCL at every net and sample: currents into the parts' pins plus the gmin leak.
  let kcl = 0;
  for (let k = 0; k < samples.length; k++) {
    const sum = new Float64Array(c.nodeCount);
    c.devices.forEach((d, di) => d.terminals.forEach((node, q) => { if (node >= 0) sum[node]! += currents[di]![k]![q]!; }));
    for (const { i } of netNodes) kcl = Math.max(kcl, Math.abs(sum[i]! + GMIN_SIEMENS * samples[k]!.x[i]!));
  }

  const currentRms = periodRms(t, iIn);
  const power = periodMeanProduct(t, vIn, iIn);
  const apparent = periodRms(t, vIn) * currentRms;
  const input: InputFigures = {
    current_rms: currentRms,
    power,
    apparent_power: apparent,
    power_factor: apparent > 0 ? power / apparent : null,
    thd: thdFromSamples(resampleUniform(t, iIn, FFT_POINTS)),
  };

  const firings = firingFigures(c, steady);

  const nOut = Math.min(MAX_WAVEFORM_POINTS, t.length);
  const tOut = Array.from({ length: nOut }, (_, k) => (period * k) / nOut);
  const out: Record<string, number[]> = {};
  for (const [name, y] of Object.entries(series)) out[name] = Array.from(resampleUniform(t, y, nOut));
  return { input, parts, nets, firings, waveforms: { t: tOut, series: out }, kclResidualAmps: kcl };
}

/** Whether and where each thyristor/triac fires in the steady cycle (cheap: events and latches only). */
export function firingFigures(c: Circuit, steady: SteadyState): FiringFigures[] {
  const period = 1 / c.supply.hz;
  const run = steady.run;
  const samples = run.samples;
  return c.devices
    .filter((d) => d.type === "switching")
    .map((d) => {
      const ons = run.events.filter((e) => e.ref === d.ref && e.on);
      const pos = ons.find((e) => e.t < period / 2);
      const neg = ons.find((e) => e.t >= period / 2);
      const latchedAll = ons.length === 0 && samples.every((s) => s.mem[d.mem]! > 0.5);
      return {
        part: d.ref,
        fires: ons.length > 0 || latchedAll,
        angle_deg: pos ? (pos.t / period) * 360 : null,
        angle_negative_deg: neg ? (neg.t / period) * 360 - 180 : null,
        halves: { positive: pos !== undefined || latchedAll, negative: neg !== undefined || latchedAll },
      };
    });
}
