/**
 * The line current's harmonic content against an independent FFT (the fft.js package) on the
 * same uniformly resampled waveform of a steady cycle, and a square wave's THD against the
 * closed form from its Fourier series, sqrt(π²/8 − 1) ≈ 0.483426.
 */
import { describe, expect, it } from "vitest";
import FFT from "fft.js";
import {
  FFT_POINTS,
  harmonicAmplitudes,
  resampleUniform,
  solveCircuit,
  thdFromSamples,
} from "@teardown/engine";
import { smoothedRectifier, phaseControlled } from "../engine/solver/reference-circuits.js";

function independentThd(samples: Float64Array): number {
  const n = samples.length;
  const f = new FFT(n);
  const out = f.createComplexArray() as number[];
  f.realTransform(out, Array.from(samples));
  const mag = (h: number) => Math.hypot(out[2 * h]!, out[2 * h + 1]!);
  let s = 0;
  for (let h = 2; h < n / 2; h++) s += mag(h) ** 2;
  return Math.sqrt(s) / mag(1);
}

function lineCurrent(rec: Parameters<typeof solveCircuit>[0]): Float64Array {
  const r = solveCircuit(rec);
  if (!r.ok) throw new Error(r.error.message);
  const samples = r.value.steady.run.samples;
  const supply = r.value.circuit.devices.find((d) => d.type === "supply")!;
  const branch = supply.type === "supply" ? supply.branch : -1;
  const t = [0, ...samples.map((s) => s.t)];
  const i = [samples[samples.length - 1]!.x[branch]!, ...samples.map((s) => s.x[branch]!)];
  return resampleUniform(t, i, FFT_POINTS);
}

describe("THD of the line current", () => {
  for (const [name, rec] of [
    ["smoothed bridge rectifier", smoothedRectifier()],
    ["phase-controlled rectifier", phaseControlled(100_000)],
  ] as const) {
    it(`matches fft.js on the same samples for the ${name}`, () => {
      const samples = lineCurrent(rec);
      const ours = thdFromSamples(samples)!;
      // Source: the fft.js package as an independent FFT.
      expect(ours).toBeGreaterThan(0.01);
      expect(Math.abs(ours / independentThd(samples) - 1)).toBeLessThan(1e-9);
    });
  }

  it("matches fft.js harmonic by harmonic on a random signal", () => {
    let seed = 7;
    const rnd = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648 - 0.5;
    const x = Float64Array.from({ length: 256 }, rnd);
    const ours = harmonicAmplitudes(x);
    const f = new FFT(256);
    const out = f.createComplexArray() as number[];
    f.realTransform(out, Array.from(x));
    // Source: the fft.js package.
    for (let h = 1; h < 128; h++)
      expect(ours[h]!).toBeCloseTo((2 * Math.hypot(out[2 * h]!, out[2 * h + 1]!)) / 256, 12);
  });

  it("gives a square wave's THD of sqrt(π²/8 − 1) within 0.5%", () => {
    const n = 4096;
    const sq = Float64Array.from({ length: n }, (_, k) => (k < n / 2 ? 1 : -1));
    // Source: closed form from a square wave's Fourier series (odd harmonics of amplitude 4/(nπ),
    // Oppenheim & Willsky, "Signals and Systems", Fourier series examples; from memory): the
    // harmonics' RMS over the fundamental's is sqrt(π²/8 − 1) ≈ 0.483426. The sampled wave
    // carries harmonics up to n/2 only, hence 0.5%.
    expect(Math.abs(thdFromSamples(sq)! / Math.sqrt(Math.PI ** 2 / 8 - 1) - 1)).toBeLessThan(0.005);
  });
});
