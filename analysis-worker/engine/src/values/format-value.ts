/**
 * Writing values back as text: engineering notation for people (`330n`, `4.7k`) and an exact
 * form for files, whose text reads back to the very same number.
 */
import { parseValue } from "./parse-value.js";
import type { ValueNotation } from "./notation-tables.js";

/** Significant digits shown by default. */
export const DEFAULT_DISPLAY_SIGNIFICANT_DIGITS = 4;

/** Engineering prefixes by power of a thousand, from 10^-12 to 10^12 (ASCII `u` for micro). */
const RECORD_PREFIXES: Readonly<Record<number, string>> = {
  [-12]: "p",
  [-9]: "n",
  [-6]: "u",
  [-3]: "m",
  0: "",
  3: "k",
  6: "M",
  9: "G",
  12: "T",
};
/** The deck reads `M` as milli, so mega is `meg` there. */
const DECK_PREFIXES: Readonly<Record<number, string>> = { ...RECORD_PREFIXES, 6: "meg" };

const MIN_PREFIX_EXPONENT = -12;
const MAX_PREFIX_EXPONENT = 12;

/** The power-of-a-thousand exponent for engineering notation, clamped to the prefixes we have. */
function engineeringExponent(value: number): number {
  if (value === 0 || !Number.isFinite(value)) return 0;
  const exp = 3 * Math.floor(Math.log10(Math.abs(value)) / 3);
  return Math.min(MAX_PREFIX_EXPONENT, Math.max(MIN_PREFIX_EXPONENT, exp));
}

/** Trims a toPrecision result to its plain decimal form without trailing zeros. */
function plainDigits(x: number, digits: number): string {
  return String(Number(x.toPrecision(digits)));
}

/** Engineering notation with an optional unit: formatValue(3.3e-7, "F") gives `330nF`. */
export function formatValue(
  value: number,
  unit: string | null = null,
  digits = DEFAULT_DISPLAY_SIGNIFICANT_DIGITS,
): string {
  const suffix = unit === null || unit === "1" ? "" : unit;
  if (!Number.isFinite(value)) return `${value}${suffix}`;
  let exp = engineeringExponent(value);
  let mantissa = Number((value / 10 ** exp).toPrecision(digits));
  // rounding can carry 999.96 up to 1000: move to the next prefix
  if (Math.abs(mantissa) >= 1000 && exp < MAX_PREFIX_EXPONENT) {
    exp += 3;
    mantissa = Number((value / 10 ** exp).toPrecision(digits));
  }
  return `${plainDigits(mantissa, digits)}${RECORD_PREFIXES[exp]}${suffix}`;
}

/**
 * The shortest engineering text that reads back (in the given notation) to exactly `value`;
 * falls back to JavaScript's own shortest round-trip form (`2.2e-7`), which always reads back.
 */
export function exactValueText(value: number, notation: ValueNotation = "record"): string {
  if (!Number.isFinite(value)) return String(value);
  const exp = engineeringExponent(value);
  const prefixes = notation === "deck" ? DECK_PREFIXES : RECORD_PREFIXES;
  for (let digits = 1; digits <= 15; digits++) {
    const digitsText = plainDigits(value / 10 ** exp, digits);
    if (/e/i.test(digitsText)) break;
    const text = `${digitsText}${prefixes[exp]}`;
    const read = parseValue(text, { notation });
    if (read.ok && read.value === value) return text;
  }
  return String(value);
}
