/**
 * The letters of the value notation: SI prefixes, the IEC 60062 decimal-point letters and the
 * unit symbols a value may end with. Two notations share them: the record's (case matters,
 * `M` is mega and `m` is milli) and the classic netlist deck's (case does not matter, `meg` is
 * mega and `m` or `M` is milli).
 */

/** Which spelling rules apply: the record file's, or the netlist deck's. */
export type ValueNotation = "record" | "deck";

/**
 * Record notation prefixes, as powers of ten. `K` and `R` are the IEC 60062 letters (kilo, and
 * the bare decimal point); `µ` (micro sign) and `μ` (Greek mu) are both seen in pasted text.
 */
export const RECORD_PREFIX_EXPONENTS: Readonly<Record<string, number>> = {
  p: -12,
  n: -9,
  u: -6,
  µ: -6,
  μ: -6,
  m: -3,
  R: 0,
  k: 3,
  K: 3,
  M: 6,
  G: 9,
  T: 12,
};

/** IEC 60062 `L` (milli) only for resistance, where `m` would otherwise be the only spelling. */
export const RESISTANCE_ONLY_PREFIX_EXPONENTS: Readonly<Record<string, number>> = { L: -3 };

/**
 * Deck notation prefixes, matched case-insensitively, longest first (`meg` before `m`). The
 * deck convention reads `M` as milli; femto is left out so that a trailing `F` stays a farad.
 */
export const DECK_PREFIX_EXPONENTS: ReadonlyArray<readonly [string, number]> = [
  ["meg", 6],
  ["t", 12],
  ["g", 9],
  ["k", 3],
  ["r", 0],
  ["m", -3],
  ["u", -6],
  ["µ", -6],
  ["μ", -6],
  ["n", -9],
  ["p", -12],
];

/** Spellings accepted for each canonical unit symbol. */
export const UNIT_SPELLINGS: Readonly<Record<string, readonly string[]>> = {
  Ω: ["Ω", "\u2126", "ohm", "ohms", "Ohm", "Ohms"],
  F: ["F"],
  H: ["H"],
  V: ["V"],
  A: ["A"],
  W: ["W"],
  VA: ["VA"],
  Hz: ["Hz"],
};

/** The canonical unit a spelling stands for, or null. Deck notation ignores case. */
export function canonicalUnit(spelling: string, notation: ValueNotation): string | null {
  for (const [unit, spellings] of Object.entries(UNIT_SPELLINGS)) {
    for (const s of spellings) {
      if (notation === "deck" ? s.toLowerCase() === spelling.toLowerCase() : s === spelling)
        return unit;
    }
  }
  return null;
}

/** Readable names for unit symbols, used in error messages. */
export const UNIT_NAMES: Readonly<Record<string, string>> = {
  Ω: "ohms (Ω)",
  F: "farads (F)",
  H: "henries (H)",
  V: "volts (V)",
  A: "amps (A)",
  W: "watts (W)",
  VA: "volt-amperes (VA)",
  Hz: "hertz (Hz)",
  "1": "a plain number (no unit)",
};
