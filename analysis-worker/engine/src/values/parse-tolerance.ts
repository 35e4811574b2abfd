/**
 * Tolerances and measurement uncertainties: a percentage (`5%`), an IEC 60062 tolerance letter
 * (`F G J K M`), a plain fraction below one (`0.05`), or for uncertainty an absolute value in the
 * measurement's unit (`0.5m`). Relative results are fractions (0.05 for 5%).
 */
import type { Uncertainty } from "../record/types.js";
import { parseValue, type ExpectedUnit } from "./parse-value.js";
import type { ValueNotation } from "./notation-tables.js";

/** IEC 60062 symmetric tolerance letters as fractions (IEC 60062:2016, clause 5). */
export const TOLERANCE_LETTER_FRACTIONS: Readonly<Record<string, number>> = {
  F: 0.01,
  G: 0.02,
  J: 0.05,
  K: 0.1,
  M: 0.2,
};

/** A relative tolerance as a fraction, or why it could not be read. */
export type ToleranceResult =
  { ok: true; value: number } | { ok: false; code: "bad-tolerance"; message: string };

/** A measurement uncertainty, or why it could not be read. */
export type UncertaintyResult =
  { ok: true; value: Uncertainty } | { ok: false; code: "bad-uncertainty"; message: string };

const PERCENT_PATTERN = /^([+-]?\d*\.?\d+(?:[eE][+-]?\d+)?)\s*%$/;
const TOLERANCE_HINT = "write a percentage such as 5%, or a tolerance letter F, G, J, K or M";

/** The fraction a percentage text stands for, or null when the text is not a percentage. */
function percentFraction(text: string): number | null {
  const m = PERCENT_PATTERN.exec(text.trim().replace(/^±/, ""));
  return m === null ? null : Number(m[1]) / 100;
}

/** Reads a tolerance (`10%`, `K`, `0.1`, `±5%`) as a fraction in [0, 1). */
export function parseTolerance(input: string | number): ToleranceResult {
  let fraction: number | null = null;
  if (typeof input === "number") {
    fraction = input;
  } else if (typeof input === "string") {
    const text = input.trim();
    const letter = TOLERANCE_LETTER_FRACTIONS[text];
    if (letter !== undefined) fraction = letter;
    else fraction = percentFraction(text) ?? (/^\d*\.?\d+$/.test(text) ? Number(text) : null);
  }
  if (fraction === null || !Number.isFinite(fraction)) {
    return {
      ok: false,
      code: "bad-tolerance",
      message: `cannot read tolerance ${JSON.stringify(input)}; ${TOLERANCE_HINT}`,
    };
  }
  if (fraction < 0 || fraction >= 1) {
    const hint =
      typeof input === "number" && input >= 1
        ? ` (a plain number is a fraction; for ${input} percent write ${input}%)`
        : "";
    return {
      ok: false,
      code: "bad-tolerance",
      message: `a tolerance must be at least 0 and below 100%${hint}`,
    };
  }
  return { ok: true, value: fraction };
}

/** Reads an uncertainty: relative (`2%`) or absolute in the measurement's unit (`0.5m`). */
export function parseUncertainty(
  input: string | number,
  unit: ExpectedUnit,
  notation: ValueNotation = "record",
): UncertaintyResult {
  if (typeof input === "string") {
    const fraction = percentFraction(input);
    if (fraction !== null) {
      if (!Number.isFinite(fraction) || fraction < 0) {
        return {
          ok: false,
          code: "bad-uncertainty",
          message: "a relative uncertainty must be a percentage of at least 0",
        };
      }
      return { ok: true, value: { relative: fraction } };
    }
  }
  const read = parseValue(input, { unit, notation });
  if (!read.ok)
    return {
      ok: false,
      code: "bad-uncertainty",
      message: `cannot read uncertainty: ${read.message}`,
    };
  if (read.value < 0)
    return { ok: false, code: "bad-uncertainty", message: "an uncertainty must be at least 0" };
  return { ok: true, value: { absolute: read.value } };
}

/**
 * The shortest percentage text that reads back to exactly this fraction, so that a written
 * record reads back equal; null when no percentage text does (then write the fraction).
 */
export function percentText(fraction: number): string | null {
  for (let digits = 1; digits <= 17; digits++) {
    const text = `${Number((fraction * 100).toPrecision(digits))}%`;
    if (percentFraction(text) === fraction) return text;
  }
  return null;
}
