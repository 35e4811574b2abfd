/**
 * Figures of one steady cycle: input current RMS, real and apparent power, power factor and
 * THD of the line current; per part peak voltage, RMS and mean current and mean dissipation; per net
 * DC, RMS and peak against the reference; per thyristor/triac whether and where it fires;
 * and the downsampled waveforms. Also the largest KCL residual over the cycle, as a check.
 */
import type { Circuit, CircuitDevice } from "../solver/circuit-model.js";
import { GMIN_SIEMENS, nodeV } from "../solver/mna.js";
import type { FiringHalves } from "../solver/min-firing-supply.js";
import type { SteadyState } from "../solver/periodic-steady-state.js";
import { terminalCurrents } from "../solver/transient-stamps.js";
import { thdFromSamples } from "./fft.js";
import { lineHarmonics, type LineHarmonic } from "./line-harmonics.js";
import {
  peakMagnitude,
  periodMean,
  periodMeanPower,
  periodRms,
  resampleForPlot,
  resampleUniform,
} from "./waveform-stats.js";

/** Uniform points per cycle for the line-current FFT (2^10). */
export const FFT_POINTS = 1024;
/** Most points per waveform series. */
export const MAX_WAVEFORM_POINTS = 1000;
/**
 * A capacitor's or inductor's mean power over a periodic state is zero (its stored energy ends
 * where it started); the figures hold it to within this fraction of the input power. Anything
 * larger would be numerical dissipation, and the tests check against this bound.
 */
export const STORAGE_POWER_TOLERANCE = 1e-3;

/** The record-format input figures. */
export interface InputFigures {
  current_rms: number;
  power: number;
  apparent_power: number;
  power_factor: number | null;
  thd: number | null;
  /** RMS magnitude of each harmonic of the line current, order 1 up (see line-harmonics.ts). */
  harmonics: LineHarmonic[];
}

/** Per-part figures. */
export interface PartFigures {
  voltage_peak: number;
  current_rms: number;
  /** Mean (DC) current, A, into the part's first terminal (same sign as its current waveform). */
  current_dc: number;
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
  halves: FiringHalves;
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

/**
 * Computes the figures of the recorded steady cycle (the whole window of a k-cycle orbit).
 * Each section (input, parts with the KCL check, nets, firings, waveforms) is computed on first
 * read and kept: a tolerance sample or a sensitivity that reads the input power never pays for
 * every part's currents, the nets and the plotted waveforms.
 */
export function cycleFigures(c: Circuit, steady: SteadyState): CycleFigures {
  const cyclesInWindow = steady.periodCycles ?? 1;
  const window = cyclesInWindow / c.supply.hz;
  const run = steady.run;
  const last = run.samples[run.samples.length - 1]!;
  // The window repeats: its end point stands for t = 0 as well.
  const samples = [{ t: 0, x: last.x, mem: last.mem, damped: false }, ...run.samples];
  const ns = samples.length;
  const t = Float64Array.from(samples, (s) => s.t);
  // Each step is integrated by the rule the solver took it with (see waveform-stats).
  const damped = samples.map((s) => s.damped);
  const supply = c.devices.find(
    (d): d is Extract<CircuitDevice, { type: "supply" }> => d.type === "supply",
  )!;
  const vIn = Float64Array.from(samples, (s) => nodeV(s.x, supply.terminals[0]!));
  const iIn = Float64Array.from(samples, (s) => s.x[supply.branch]!);
  const netNodes = c.nodeNames.map((n, i) => ({ n, i })).filter(({ n }) => !n.includes("#"));

  const inputFigures = (): InputFigures => {
    const currentRms = periodRms(t, iIn, damped);
    const power = periodMeanPower(t, vIn, iIn, 1, damped);
    const apparent = periodRms(t, vIn, damped) * currentRms;
    const fftPoints = FFT_POINTS * 2 ** Math.ceil(Math.log2(cyclesInWindow));
    const uniformCurrent = resampleUniform(t, iIn, fftPoints);
    return {
      current_rms: currentRms,
      power,
      apparent_power: apparent,
      power_factor: apparent > 0 ? power / apparent : null,
      thd: thdFromSamples(uniformCurrent, cyclesInWindow),
      harmonics: lineHarmonics(uniformCurrent, cyclesInWindow),
    };
  };

  // Every part's figures and current series, and the largest KCL residual (which needs every
  // part's currents anyway).
  const partFigures = () => {
    const parts: Record<string, PartFigures> = {};
    const series: Record<string, Float64Array> = {};
    // KCL sums per sample and node, filled device by device.
    const kclSum = new Float64Array(ns * c.nodeCount);
    for (const d of c.devices) {
      const nt = d.terminals.length;
      const volts = new Float64Array(ns * nt);
      const amps = new Float64Array(ns * nt);
      for (let k = 0; k < ns; k++) {
        const s = samples[k]!;
        const i = terminalCurrents(d, s.x, s.mem);
        for (let q = 0; q < nt; q++) {
          const node = d.terminals[q]!;
          volts[k * nt + q] = nodeV(s.x, node);
          amps[k * nt + q] = i[q]!;
          if (node >= 0) kclSum[k * c.nodeCount + node]! += i[q]!;
        }
      }
      if (d.type === "supply") continue;
      let vPeak = 0;
      for (let k = 0; k < ns; k++)
        for (let a = 0; a < nt; a++)
          for (let b = a + 1; b < nt; b++)
            vPeak = Math.max(vPeak, Math.abs(volts[k * nt + a]! - volts[k * nt + b]!));
      const main = new Float64Array(ns);
      for (let k = 0; k < ns; k++) main[k] = amps[k * nt]!;
      const storage = d.type === "capacitor" || d.type === "coupled";
      parts[d.ref] = {
        voltage_peak: vPeak,
        current_rms: periodRms(t, main, damped),
        current_dc: periodMean(t, main, damped),
        power: periodMeanPower(t, volts, amps, nt, damped, storage),
      };
      series[`${d.ref}.current`] = main;
    }
    // KCL at every net and sample: currents into the parts' pins plus the gmin leak.
    let kcl = 0;
    for (let k = 0; k < ns; k++)
      for (const { i } of netNodes)
        kcl = Math.max(
          kcl,
          Math.abs(kclSum[k * c.nodeCount + i]! + GMIN_SIEMENS * samples[k]!.x[i]!),
        );
    return { parts, series, kcl };
  };

  const netFigures = () => {
    const nets: Record<string, NetFigures> = { [c.reference]: { dc: 0, rms: 0, peak: 0 } };
    const series: Record<string, Float64Array> = {};
    for (const { n, i } of netNodes) {
      const v = Float64Array.from(samples, (s) => s.x[i]!);
      nets[n] = {
        dc: periodMean(t, v, damped),
        rms: periodRms(t, v, damped),
        peak: peakMagnitude(v),
      };
      series[`net.${n}`] = v;
    }
    return { nets, series };
  };

  const waveforms = (): CycleFigures["waveforms"] => {
    const series: Record<string, Float64Array> = {
      "supply.voltage": vIn,
      "input.current": iIn,
      ...partsOnce().series,
      ...netsOnce().series,
    };
    const nOut = Math.min(MAX_WAVEFORM_POINTS, t.length);
    const tOut = Array.from({ length: nOut }, (_, k) => (window * k) / nOut);
    const names = Object.keys(series);
    const plotted = resampleForPlot(
      t,
      names.map((name) => series[name]!),
      nOut,
    );
    const out: Record<string, number[]> = {};
    names.forEach((name, k) => (out[name] = Array.from(plotted[k]!)));
    return { t: tOut, series: out };
  };

  const partsOnce = once(partFigures);
  const netsOnce = once(netFigures);
  const inputOnce = once(inputFigures);
  const firingsOnce = once(() => firingFigures(c, steady));
  const waveformsOnce = once(waveforms);
  return {
    get input() {
      return inputOnce();
    },
    get parts() {
      return partsOnce().parts;
    },
    get nets() {
      return netsOnce().nets;
    },
    get firings() {
      return firingsOnce();
    },
    get waveforms() {
      return waveformsOnce();
    },
    get kclResidualAmps() {
      return partsOnce().kcl;
    },
  };
}

/** The value of `f`, computed on the first call and kept. */
function once<T>(f: () => T): () => T {
  let done = false;
  let value: T;
  return () => {
    if (!done) {
      value = f();
      done = true;
    }
    return value;
  };
}

/** Whether and where each thyristor/triac fires in the steady cycle (cheap: events and latches only). */
export function firingFigures(c: Circuit, steady: SteadyState): FiringFigures[] {
  const period = 1 / c.supply.hz;
  const run = steady.run;
  const samples = run.samples;
  // Event times within their own mains cycle (a k-cycle window holds k cycles).
  const inCycle = (t: number) => t - Math.floor(t / period + 1e-9) * period;
  return c.devices
    .filter((d) => d.type === "switching")
    .map((d) => {
      const ons = run.events
        .filter((e) => e.ref === d.ref && e.on)
        .map((e) => ({ ...e, t: Math.max(0, inCycle(e.t)) }));
      const pos = ons.find((e) => e.t < period / 2);
      const neg = ons.find((e) => e.t >= period / 2);
      const latchedAll = ons.length === 0 && samples.every((s) => s.mem[d.mem]! > 0.5);
      return {
        part: d.ref,
        fires: ons.length > 0 || latchedAll,
        angle_deg: pos ? (pos.t / period) * 360 : null,
        angle_negative_deg: neg ? (neg.t / period) * 360 - 180 : null,
        halves: {
          positive: pos !== undefined || latchedAll,
          negative: neg !== undefined || latchedAll,
        },
      };
    });
}
