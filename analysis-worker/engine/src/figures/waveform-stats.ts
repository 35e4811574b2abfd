/**
 * Statistics of one period of an adaptively stepped waveform: mean and RMS by the trapezoidal
 * rule on the uneven time points, peaks, and uniform resampling (for the FFT and the plots).
 */

/** Mean over [t0, tN] by the trapezoidal rule. */
export function periodMean(t: ArrayLike<number>, y: ArrayLike<number>): number {
  let s = 0;
  for (let k = 1; k < t.length; k++) s += 0.5 * (t[k]! - t[k - 1]!) * (y[k]! + y[k - 1]!);
  const span = t[t.length - 1]! - t[0]!;
  return span > 0 ? s / span : (y[0] ?? 0);
}

/** RMS over [t0, tN] (trapezoidal rule on y²). */
export function periodRms(t: ArrayLike<number>, y: ArrayLike<number>): number {
  let s = 0;
  for (let k = 1; k < t.length; k++)
    s += 0.5 * (t[k]! - t[k - 1]!) * (y[k]! * y[k]! + y[k - 1]! * y[k - 1]!);
  const span = t[t.length - 1]! - t[0]!;
  return span > 0 ? Math.sqrt(s / span) : Math.abs(y[0] ?? 0);
}

/** Mean of the product of two series (real power from v and i). */
export function periodMeanProduct(
  t: ArrayLike<number>,
  a: ArrayLike<number>,
  b: ArrayLike<number>,
): number {
  const p = Float64Array.from({ length: t.length }, (_, k) => a[k]! * b[k]!);
  return periodMean(t, p);
}

/** Largest magnitude. */
export function peakMagnitude(y: ArrayLike<number>): number {
  let m = 0;
  for (let k = 0; k < y.length; k++) m = Math.max(m, Math.abs(y[k]!));
  return m;
}

/** n uniform samples at t0 + k·span/n (k = 0..n-1) by linear interpolation; t must be ascending. */
export function resampleUniform(
  t: ArrayLike<number>,
  y: ArrayLike<number>,
  n: number,
): Float64Array {
  const out = new Float64Array(n);
  const t0 = t[0]!;
  const span = t[t.length - 1]! - t0;
  let j = 0;
  for (let k = 0; k < n; k++) {
    const tk = t0 + (span * k) / n;
    while (j < t.length - 2 && t[j + 1]! <= tk) j++;
    const dt = t[j + 1]! - t[j]!;
    const f = dt > 0 ? (tk - t[j]!) / dt : 0;
    out[k] = y[j]! + f * (y[j + 1]! - y[j]!);
  }
  return out;
}
