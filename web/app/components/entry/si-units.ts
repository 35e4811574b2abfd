/**
 * Numbers for people: engineering notation with SI prefixes and a unit (`24.1 mA`, `330 nF`),
 * and "not computed" for a figure the analysis did not give (the result grows with the engine,
 * so any field may be missing or null).
 */

/** What a missing figure reads as. */
export const NOT_COMPUTED = "not computed";

const PREFIXES: Readonly<Record<number, string>> = {
  [-15]: "f",
  [-12]: "p",
  [-9]: "n",
  [-6]: "µ",
  [-3]: "m",
  0: "",
  3: "k",
  6: "M",
  9: "G",
  12: "T",
};
const MIN_EXPONENT = -15;
const MAX_EXPONENT = 12;
/** Significant digits shown for computed figures. */
export const DISPLAY_DIGITS = 3;

/** A finite number, or null for anything else (missing, null, text, NaN). */
export function finite(x: unknown): number | null {
  return typeof x === "number" && Number.isFinite(x) ? x : null;
}

/** Engineering notation: si(0.0241, "A") is `24.1 mA`; a missing value is "not computed". */
export function si(x: unknown, unit: string, digits = DISPLAY_DIGITS): string {
  const v = finite(x);
  if (v === null) return NOT_COMPUTED;
  if (v === 0) return `0 ${unit}`.trim();
  let exp = Math.min(
    MAX_EXPONENT,
    Math.max(MIN_EXPONENT, 3 * Math.floor(Math.log10(Math.abs(v)) / 3)),
  );
  let mantissa = Number((v / 10 ** exp).toPrecision(digits));
  // 999.7 m rounds to 1000 m: carry to the next prefix
  if (Math.abs(mantissa) >= 1000 && exp < MAX_EXPONENT) {
    exp += 3;
    mantissa = Number((v / 10 ** exp).toPrecision(digits));
  }
  return `${mantissa} ${PREFIXES[exp]}${unit}`.trim();
}

/** A plain ratio (power factor) to a few digits, or "not computed". */
export function ratio(x: unknown, digits = DISPLAY_DIGITS): string {
  const v = finite(x);
  return v === null ? NOT_COMPUTED : String(Number(v.toPrecision(digits)));
}

/** A fraction as a percentage (THD 0.031 is `3.1 %`), or "not computed". */
export function percent(x: unknown, digits = DISPLAY_DIGITS): string {
  const v = finite(x);
  return v === null ? NOT_COMPUTED : `${Number((v * 100).toPrecision(digits))} %`;
}

/** An angle in degrees, one decimal, or "not computed". */
export function degrees(x: unknown): string {
  const v = finite(x);
  return v === null ? NOT_COMPUTED : `${v.toFixed(1)}°`;
}

// Evidence keys carry their unit in the name (`voltage_peak_v`, `creepage_mm`): the suffixes we read.
const KEY_UNITS: readonly [RegExp, string][] = [
  [/(_mm)$/, "mm"],
  [/(_vrms|_volts|_v)$/i, "V"],
  [/(_amps|_a)$/i, "A"],
  [/(_watts|_w)$/i, "W"],
  [/(_va)$/i, "VA"],
  [/(_ohms|_ohm)$/i, "Ω"],
  [/(_farads|_f)$/i, "F"],
  [/(_henries|_h)$/i, "H"],
  [/(_hz)$/i, "Hz"],
  [/(_seconds|_s)$/i, "s"],
  [/(_joules|_j)$/i, "J"],
];

/** An evidence value for display, with the unit its key names when it is a number. */
export function evidenceText(key: string, value: unknown): string {
  if (value === null || value === undefined) return NOT_COMPUTED;
  if (typeof value === "number") {
    if (/_deg$/.test(key)) return degrees(value);
    if (/(_ratio|_fraction)$/.test(key)) return ratio(value);
    if (/_(pct|percent)$/.test(key)) return `${Number(value.toPrecision(DISPLAY_DIGITS))} %`;
    const unit = KEY_UNITS.find(([re]) => re.test(key))?.[1];
    if (unit === "mm") return `${Number(value.toPrecision(DISPLAY_DIGITS))} mm`;
    return unit ? si(value, unit) : String(Number(value.toPrecision(4)));
  }
  if (typeof value === "boolean") return value ? "yes" : "no";
  if (typeof value === "string") return value;
  if (Array.isArray(value)) {
    if (value.length === 0) return "none";
    return value
      .map((v) =>
        typeof v === "object" && v !== null
          ? recordText(v as Record<string, unknown>)
          : evidenceText(key, v),
      )
      .join(value.some((v) => typeof v === "object" && v !== null) ? "; " : ", ");
  }
  return JSON.stringify(value);
}

// One evidence row ({ part: "R1", sensitivity: -0.65 }) as "part R1, sensitivity -0.65".
function recordText(row: Record<string, unknown>): string {
  return Object.entries(row)
    .map(([k, v]) => `${k.replace(/_/g, " ")} ${evidenceText(k, v)}`)
    .join(", ");
}

/** A date for people (UTC, to the minute). */
export function when(x: unknown): string {
  if (typeof x !== "string" && !(x instanceof Date)) return "";
  const d = new Date(x);
  return Number.isNaN(d.getTime()) ? "" : `${d.toISOString().slice(0, 16).replace("T", " ")} UTC`;
}
