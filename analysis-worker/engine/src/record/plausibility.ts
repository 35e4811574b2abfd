/**
 * Whether a part's numbers can be what the record says: one table of bounds per kind and per
 * model parameter, read by the record validation (which refuses the impossible and warns on
 * the implausible) and by the circuit checks (which name the implausible, so the analysis result
 * says what its figures stand on).
 *
 * The split, and why:
 * - IMPOSSIBLE (refused at validation as an error at the field): a number no part of that kind
 *   can have. Either physics forbids it (a coupling factor k outside (0, 1], a turns ratio,
 *   inductance, saturation current or emission coefficient at or below zero, a negative
 *   resistance inside a model), or it lies so many orders of magnitude beyond the largest or
 *   smallest part ever made that it can only be a slip of prefix or exponent (a 1e30 F
 *   capacitor; the largest single capacitors are thousands of farads). Solving such a record
 *   would print figures that look computed and mean nothing, so we stop at the field.
 * - IMPLAUSIBLE (kept, with a warning `implausible-value` at the field): a number a part could
 *   have but a mains gadget's board almost never holds, such as a capacitor above 1 F or below
 *   1 pF, a resistor below 1 mΩ, a zener below 1.8 V. A supercapacitor or a current shunt is
 *   real, so the record stands; the warning and the circuit check make sure nobody reads the
 *   figures without seeing it.
 * A negative main value or rating, and a zero value of a kind that cannot be zero, are already
 * refused where they are read (normalise-part.ts); the bounds here add the rest (a rating of 0,
 * which limits nothing, is refused here). The supply's volts and hertz are only ever named.
 */
import { formatValue } from "../values/format-value.js";
import type { Part } from "./types.js";

/** How bad a number is: refused, or kept and named. */
export type PlausibilityLevel = "impossible" | "implausible";

/** One number outside what its part can be. `field` is relative to the part (`value`, `model.k`). */
export interface PlausibilityFinding {
  field: string[];
  level: PlausibilityLevel;
  message: string;
}

/** Bounds of one number: impossible outside [min, max] (or at/below `above`), implausible outside [low, high]. */
interface Bounds {
  /** Impossible at or below this (exclusive lower bound), e.g. 0 for "must be above 0". */
  above?: number;
  /** Impossible below this (inclusive lower bound), e.g. 0 for "cannot be negative". */
  min?: number;
  /** Impossible above this. */
  max?: number;
  /** Implausible below this (values of exactly 0 are left to `above`/`min`). */
  low?: number;
  /** Implausible above this. */
  high?: number;
  unit: string;
  /** What the quantity is, in words, for the message. */
  what: string;
  /** Why the implausible range is what it is (plain words, shown to the user). */
  typical?: string;
}

/** Main values by kind. A 0 Ω resistor is a jumper and is allowed (zero is never "implausible"). */
const VALUE_BOUNDS: Readonly<Record<string, Bounds>> = {
  resistor: {
    min: 0,
    max: 1e16,
    low: 1e-3,
    high: 1e10,
    unit: "Ω",
    what: "resistance",
    typical: "board resistors run from about 1 mΩ (current shunts) to about 10 GΩ",
  },
  capacitor: {
    above: 0,
    min: 1e-15,
    max: 1e5,
    low: 1e-12,
    high: 1,
    unit: "F",
    what: "capacitance",
    typical: "capacitors on a mains board run from about 1 pF to well under 1 F",
  },
  inductor: {
    above: 0,
    max: 1e5,
    low: 1e-8,
    high: 100,
    unit: "H",
    what: "inductance",
    typical: "inductors on a mains board run from about 10 nH to 100 H",
  },
  fuse: {
    above: 0,
    max: 1e5,
    low: 1e-3,
    high: 100,
    unit: "A",
    what: "fuse rating",
    typical: "fuses for appliances run from about 1 mA to 100 A",
  },
  zener: {
    above: 0,
    max: 1e4,
    low: 1.8,
    high: 400,
    unit: "V",
    what: "zener voltage",
    typical: "zener diodes are made from about 1.8 V to a few hundred volts",
  },
  varistor: {
    above: 0,
    max: 1e5,
    low: 5,
    high: 2000,
    unit: "V",
    what: "varistor voltage",
    typical: "varistors are made from a few volts to about 2 kV",
  },
};

/** Model parameters by key (the same key means the same quantity whatever the kind). */
const MODEL_BOUNDS: Readonly<Record<string, Bounds>> = {
  k: { above: 0, max: 1, unit: "1", what: "coupling factor k (energy bounds it to (0, 1])" },
  ratio: {
    above: 0,
    low: 1e-4,
    high: 1e4,
    unit: "1",
    what: "turns ratio",
    typical: "transformer ratios run from about 1:10 000 to 10 000:1",
  },
  lp: {
    above: 0,
    high: 1000,
    unit: "H",
    what: "primary inductance",
    typical: "mains transformer primaries are at most some hundreds of henries",
  },
  is: {
    above: 0,
    high: 1e-3,
    unit: "A",
    what: "saturation current",
    typical: "junction saturation currents are far below 1 mA",
  },
  n: {
    above: 0,
    low: 0.5,
    high: 10,
    unit: "1",
    what: "emission coefficient",
    typical: "emission coefficients of real junctions lie between about 0.5 and 10",
  },
  bv: { above: 0, unit: "V", what: "breakdown voltage" },
  vf: {
    above: 0,
    high: 100,
    unit: "V",
    what: "forward voltage",
    typical: "even long LED strings stay below 100 V",
  },
  if: {
    above: 0,
    high: 10,
    unit: "A",
    what: "forward test current",
    typical: "indicator and lighting LEDs are tested below 10 A",
  },
  vgt: {
    min: 0,
    high: 5,
    unit: "V",
    what: "gate trigger voltage",
    typical: "gate trigger voltages are below about 5 V",
  },
  igt: {
    above: 0,
    high: 1,
    unit: "A",
    what: "gate trigger current",
    typical: "gate trigger currents are below about 1 A",
  },
  ih: { min: 0, unit: "A", what: "holding current" },
  von: {
    min: 0,
    high: 5,
    unit: "V",
    what: "on-state voltage",
    typical: "on-state voltages are a few volts at most",
  },
  rs: { min: 0, unit: "Ω", what: "series resistance" },
  rz: { min: 0, unit: "Ω", what: "zener resistance" },
  rp: { min: 0, unit: "Ω", what: "winding resistance" },
  ron: { min: 0, unit: "Ω", what: "on-resistance" },
  alpha: {
    above: 0,
    low: 5,
    high: 100,
    unit: "1",
    what: "varistor exponent",
    typical: "metal-oxide varistor exponents lie between about 5 and 100",
  },
  r: { min: 0, unit: "Ω", what: "resistance" },
  c: { min: 0, high: 1, unit: "F", what: "capacitance", typical: "loads act as well under 1 F" },
};

/** A load stands for a heater, a lamp, a motor: its resistance is above 0 and rarely below 1 Ω. */
const LOAD_RESISTANCE: Bounds = {
  above: 0,
  low: 1,
  unit: "Ω",
  what: "load resistance",
  typical: "1 Ω on the mains would draw tens of kilowatts",
};

/** Ratings: a rating of 0 limits nothing; huge ones are a prefix slip. */
const RATING_BOUNDS: Readonly<Record<string, Bounds>> = {
  volts: { above: 0, high: 1e5, unit: "V", what: "voltage rating" },
  amps: { above: 0, high: 1e3, unit: "A", what: "current rating" },
  watts: { above: 0, high: 1e4, unit: "W", what: "power rating" },
  surge_amps: { above: 0, high: 1e5, unit: "A", what: "surge current rating" },
};

/** A value in engineering notation where that reads well, else in exponent form. */
function shown(value: number, unit: string): string {
  const u = unit === "1" ? "" : ` ${unit}`;
  if (value !== 0 && (Math.abs(value) < 1e-12 || Math.abs(value) >= 1e15))
    return `${value.toExponential()}${u}`;
  return formatValue(value, unit === "1" ? null : unit);
}

/** The finding for one number against its bounds, or null when it is fine. */
export function judgeNumber(
  value: number,
  b: Bounds,
  field: string[],
  ratingOrParameter = false,
): PlausibilityFinding | null {
  const v = shown(value, b.unit);
  const impossible = (why: string): PlausibilityFinding => ({
    field,
    level: "impossible",
    message: `${v} is not a possible ${b.what}: ${why}`,
  });
  if (b.above !== undefined && !(value > b.above))
    return impossible(`it must be above ${shown(b.above, b.unit)}`);
  if (b.min !== undefined && value < b.min)
    return impossible(
      b.min === 0 ? "it cannot be negative" : `no part is below ${shown(b.min, b.unit)}`,
    );
  if (b.max !== undefined && value > b.max)
    return impossible(
      ratingOrParameter || b.max <= 1
        ? `it cannot exceed ${shown(b.max, b.unit)}`
        : `no part comes near ${shown(b.max, b.unit)}; check the prefix or exponent`,
    );
  const tooLow = b.low !== undefined && value !== 0 && value < b.low;
  const tooHigh = b.high !== undefined && value > b.high;
  if (tooLow || tooHigh) {
    const side = tooLow ? `below ${shown(b.low!, b.unit)}` : `above ${shown(b.high!, b.unit)}`;
    const why = b.typical === undefined ? "" : ` (${b.typical})`;
    return {
      field,
      level: "implausible",
      message: `${v} is an unlikely ${b.what}, ${side}${why}; check the prefix or exponent`,
    };
  }
  return null;
}

/** The part's fields as the checks read them (a normalised part, or one being normalised). */
export type CheckedPart = Pick<Part, "kind" | "value" | "model" | "rating">;

/** The bounds of one field of a part of this kind (`["value"]`, `["model", "k"]`, ...), if any. */
function boundsOf(kind: string, field: readonly string[]): Bounds | undefined {
  const [head, key] = field;
  if (head === "value" && field.length === 1) return VALUE_BOUNDS[kind];
  if (head === "rating" && key !== undefined) return RATING_BOUNDS[key];
  if (head === "model" && key !== undefined)
    return kind === "load" && key === "r" ? LOAD_RESISTANCE : MODEL_BOUNDS[key];
  return undefined;
}

/** One number of a part of this kind against its field's bounds; null when fine or unbounded. */
export function fieldPlausibility(
  kind: string,
  field: readonly string[],
  value: number,
): PlausibilityFinding | null {
  const b = boundsOf(kind, field);
  return b === undefined ? null : judgeNumber(value, b, [...field], field[0] !== "value");
}

/** Every number of a part outside what a part of its kind can be, in field order. */
export function partPlausibility(part: CheckedPart): PlausibilityFinding[] {
  const numbers: Array<[string[], unknown]> = [
    [["value"], part.value],
    ...Object.entries(part.rating).map(([k, n]): [string[], unknown] => [["rating", k], n]),
    ...Object.entries(part.model).map(([k, n]): [string[], unknown] => [["model", k], n]),
  ];
  return numbers.flatMap(([field, n]) => {
    const f = typeof n === "number" ? fieldPlausibility(part.kind, field, n) : null;
    return f === null ? [] : [f];
  });
}

/** Supply bounds: mains is 100–240 V at 50 or 60 Hz; others are named, never refused. */
export const SUPPLY_BOUNDS: Readonly<Record<"vrms" | "hz", Bounds>> = {
  vrms: {
    above: 0,
    low: 50,
    high: 1000,
    unit: "V",
    what: "mains voltage",
    typical: "mains supplies are 100 V to 400 V",
  },
  hz: {
    above: 0,
    low: 16,
    high: 1000,
    unit: "Hz",
    what: "mains frequency",
    typical: "mains is 50 Hz or 60 Hz (16.7 Hz and 400 Hz in special networks)",
  },
};
