/**
 * The IEC 60063 preferred-number series. E3..E24 are historical two-digit values that do not
 * follow round(10·10^(i/n)) (IEC 60063:2015, from memory), so they are written out; E48, E96 and
 * E192 are three-digit values computed as round(100·10^(i/n)), with the one published
 * exception that E192 lists 920 where the formula gives 919.
 */

/** Series names, smallest first. */
export const E_SERIES_NAMES = ["E3", "E6", "E12", "E24", "E48", "E96", "E192"] as const;
/** One of the IEC 60063 series names. */
export type ESeriesName = (typeof E_SERIES_NAMES)[number];

/** The series `eSeriesOf` reports, smallest first (E3 is a subset of E6 and reported as E6). */
export const REPORTED_E_SERIES: readonly ESeriesName[] = ["E6", "E12", "E24", "E48", "E96", "E192"];

/** Relative tolerance when comparing a value's mantissa with a series value. */
export const SERIES_MATCH_RELATIVE_TOLERANCE = 1e-9;

const E24_MANTISSAS = [
  1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6,
  6.2, 6.8, 7.5, 8.2, 9.1,
];

/** Every `step`-th entry of a list, starting with the first. */
function everyNth(values: readonly number[], step: number): number[] {
  return values.filter((_, i) => i % step === 0);
}

/** round(100·10^(i/n)) for i = 0..n-1, in the decade 1..10 (three significant digits). */
function computedThreeDigitSeries(n: number): number[] {
  const values: number[] = [];
  for (let i = 0; i < n; i++) {
    let hundredths = Math.round(100 * 10 ** (i / n));
    // IEC 60063 publishes 920 in E192 where the formula gives 919 (IEC 60063:2015, from memory).
    if (n === 192 && hundredths === 919) hundredths = 920;
    values.push(hundredths / 100);
  }
  return values;
}

/** Each series' values in the decade [1, 10). */
export const E_SERIES: Readonly<Record<ESeriesName, readonly number[]>> = {
  E3: everyNth(E24_MANTISSAS, 8),
  E6: everyNth(E24_MANTISSAS, 4),
  E12: everyNth(E24_MANTISSAS, 2),
  E24: E24_MANTISSAS,
  E48: computedThreeDigitSeries(48),
  E96: computedThreeDigitSeries(96),
  E192: computedThreeDigitSeries(192),
};

/** Kinds whose values are conventionally chosen from the E-series (common practice). */
export const E_SERIES_KINDS: readonly string[] = ["resistor", "capacitor", "inductor", "zener"];

/** The value's decade exponent and mantissa in [1, 10), or null for zero, negatives, non-finite. */
function mantissaOf(value: number): { mantissa: number; decade: number } | null {
  if (!Number.isFinite(value) || value <= 0) return null;
  let decade = Math.floor(Math.log10(value));
  let mantissa = value / 10 ** decade;
  // log10 can land one decade off near powers of ten (0.001 → 9.999...e-4)
  if (mantissa >= 10 * (1 - SERIES_MATCH_RELATIVE_TOLERANCE)) {
    decade += 1;
    mantissa /= 10;
  } else if (mantissa < 1 * (1 - SERIES_MATCH_RELATIVE_TOLERANCE)) {
    decade -= 1;
    mantissa *= 10;
  }
  return { mantissa, decade };
}

function close(a: number, b: number): boolean {
  return Math.abs(a - b) <= SERIES_MATCH_RELATIVE_TOLERANCE * Math.max(Math.abs(a), Math.abs(b));
}

/** True when the value (any decade) is a member of the series. */
export function isInSeries(value: number, series: ESeriesName): boolean {
  const m = mantissaOf(value);
  if (m === null) return false;
  return E_SERIES[series].some((v) => close(v, m.mantissa) || close(v * 10, m.mantissa));
}

/**
 * The smallest IEC 60063 series (E6..E192) that holds the value, or null. With a kind whose
 * values are not chosen from the E-series (a fuse, a diode), the answer is null.
 */
export function eSeriesOf(value: number, kind?: string): ESeriesName | null {
  if (kind !== undefined && !E_SERIES_KINDS.includes(kind)) return null;
  for (const name of REPORTED_E_SERIES) if (isInSeries(value, name)) return name;
  return null;
}

/**
 * The series value nearest to `value` on a logarithmic scale (the scale the series are spaced
 * on), in the same decade or the neighbouring one (9.3 → 10 in E12). Null for values ≤ 0.
 */
export function nearestInSeries(value: number, series: ESeriesName): number | null {
  const m = mantissaOf(value);
  if (m === null) return null;
  const candidates = [...E_SERIES[series].map((v) => v), 10];
  let best = candidates[0]!;
  for (const c of candidates) {
    if (Math.abs(Math.log(c / m.mantissa)) < Math.abs(Math.log(best / m.mantissa))) best = c;
  }
  // Rebuild through a decimal string so that 4.7 in decade -9 is exactly 4.7e-9.
  return Number(`${best}e${m.decade}`);
}
