/**
 * The harmonic magnitudes of the line current, kept with the analysis so the entry page can draw
 * them as bars. A window of k mains cycles (a subharmonic orbit) holds the mains harmonic n in FFT
 * bin n·k; the bins between are not mains harmonics and are not kept.
 */
import { harmonicAmplitudes } from "./fft.js";

/** Orders kept: 1 (the fundamental) to 40, the range mains harmonic limits are usually written for. */
export const STORED_HARMONIC_ORDERS = 40;

/** One harmonic of the line current: its order (1 = the mains frequency) and RMS magnitude in amps. */
export interface LineHarmonic {
  order: number;
  rms: number;
}

/**
 * Harmonics 1..`orders` of a window of `cycles` mains cycles given as uniform samples (a power of
 * two of them). Orders the sampling cannot resolve are left out rather than aliased.
 */
export function lineHarmonics(
  uniform: ArrayLike<number>,
  cycles = 1,
  orders = STORED_HARMONIC_ORDERS,
): LineHarmonic[] {
  const peaks = harmonicAmplitudes(uniform);
  const out: LineHarmonic[] = [];
  for (let n = 1; n <= orders && n * cycles < peaks.length; n++)
    out.push({ order: n, rms: peaks[n * cycles]! / Math.SQRT2 });
  return out;
}
