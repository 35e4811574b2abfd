/**
 * Statistics of one period of an adaptively stepped waveform: mean, RMS and mean power on the
 * uneven time points, peaks, and uniform resampling (for the FFT and the plots).
 *
 * Each step is integrated by the rule the solver stepped it with. A trapezoidal step varies
 * linearly between its end points; a backward-Euler step (`damped[k]` true for the step ending at
 * sample k) holds its end value over the whole step. The point before a damped step may belong to
 * another state (a thyristor not yet latched on), so it must not weigh in that step.
 */

/** Per sample: true when the step ending there was backward Euler (omitted: all trapezoidal). */
export type DampedSteps = ArrayLike<boolean> | undefined;

/** Integral of y over [t0, tN] by each step's own rule. */
function stepIntegral(t: ArrayLike<number>, y: (k: number) => number, damped: DampedSteps): number {
  let s = 0;
  let before = y(0);
  for (let k = 1; k < t.length; k++) {
    const now = y(k);
    const h = t[k]! - t[k - 1]!;
    s += damped?.[k] ? h * now : 0.5 * h * (now + before);
    before = now;
  }
  return s;
}

function span(t: ArrayLike<number>): number {
  return t.length > 1 ? t[t.length - 1]! - t[0]! : 0;
}

/** Mean over [t0, tN]. */
export function periodMean(
  t: ArrayLike<number>,
  y: ArrayLike<number>,
  damped?: DampedSteps,
): number {
  const T = span(t);
  return T > 0 ? stepIntegral(t, (k) => y[k]!, damped) / T : (y[0] ?? 0);
}

/** RMS over [t0, tN]. */
export function periodRms(
  t: ArrayLike<number>,
  y: ArrayLike<number>,
  damped?: DampedSteps,
): number {
  const T = span(t);
  return T > 0 ? Math.sqrt(stepIntegral(t, (k) => y[k]! * y[k]!, damped) / T) : Math.abs(y[0] ?? 0);
}

/**
 * Mean power into a part over [t0, tN]: terminal voltages `volts[k·nt + q]` and currents into
 * the terminals `amps[k·nt + q]`, nt terminals per sample. A damped step takes the product at
 * its end. A trapezoidal step takes the trapezoid of the products, which for a smooth periodic
 * waveform is exact to high order; but for an energy-storing part (`storage`) it takes the
 * product of the step averages instead: the trapezoidal companion model of a capacitor or
 * inductor makes that exactly its stored-energy change, so storage comes out at zero over a
 * window that repeats (the trapezoid of the products would leave a spurious h/4·Δv·Δi per step,
 * large where a fast decay is stepped across).
 */
export function periodMeanPower(
  t: ArrayLike<number>,
  volts: ArrayLike<number>,
  amps: ArrayLike<number>,
  nt = 1,
  damped?: DampedSteps,
  storage = false,
): number {
  const T = span(t);
  const at = (k: number) => {
    let p = 0;
    for (let q = 0; q < nt; q++) p += volts[k * nt + q]! * amps[k * nt + q]!;
    return p;
  };
  if (!(T > 0)) return volts.length >= nt ? at(0) : 0;
  if (!storage) return stepIntegral(t, at, damped) / T;
  let e = 0;
  for (let k = 1; k < t.length; k++) {
    let p = 0;
    if (damped?.[k]) p = at(k);
    else
      for (let q = 0; q < nt; q++)
        p +=
          0.25 *
          (volts[(k - 1) * nt + q]! + volts[k * nt + q]!) *
          (amps[(k - 1) * nt + q]! + amps[k * nt + q]!);
    e += (t[k]! - t[k - 1]!) * p;
  }
  return e / T;
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
  const T = span(t);
  let j = 0;
  for (let k = 0; k < n; k++) {
    const tk = t0 + (T * k) / n;
    while (j < t.length - 2 && t[j + 1]! <= tk) j++;
    const dt = t[j + 1]! - t[j]!;
    const f = dt > 0 ? (tk - t[j]!) / dt : 0;
    out[k] = y[j]! + f * (y[j + 1]! - y[j]!);
  }
  return out;
}

/** A computed point stands in for a plot point when some series there departs from the plot by this fraction of its peak. */
export const PLOT_PULSE_FRACTION = 0.01;

/**
 * n uniform points for a plot of several series over the same time points: each plot point is
 * the linear interpolation at its time, unless a computed point before the next plot point
 * departs from it by more than PLOT_PULSE_FRACTION of some series' peak. Then the most departing
 * computed point stands for it, in every series alike (so sums and differences of series stay
 * true). A short pulse (a capacitor discharging as a switch closes) then shows at its height
 * instead of vanishing between plot points while it still counts in the RMS.
 */
export function resampleForPlot(
  t: ArrayLike<number>,
  series: ArrayLike<number>[],
  n: number,
): Float64Array[] {
  const out = series.map((y) => resampleUniform(t, y, n));
  const t0 = t[0]!;
  const T = span(t);
  if (!(T > 0)) return out;
  const scale = series.map((y) => 1 / Math.max(peakMagnitude(y), 1e-300));
  let j = 0;
  for (let k = 0; k < n; k++) {
    const lo = t0 + (T * k) / n;
    const hi = t0 + (T * (k + 1)) / n;
    while (j < t.length && t[j]! < lo) j++;
    let best = -1;
    let most = PLOT_PULSE_FRACTION;
    for (let q = j; q < t.length && t[q]! < hi; q++) {
      for (let s = 0; s < series.length; s++) {
        const d = Math.abs(series[s]![q]! - out[s]![k]!) * scale[s]!;
        if (d > most) {
          most = d;
          best = q;
        }
      }
    }
    if (best >= 0) for (let s = 0; s < series.length; s++) out[s]![k] = series[s]![best]!;
  }
  return out;
}
