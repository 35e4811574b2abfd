/**
 * Reading one value: a plain number, exponent form (`2.2e-7`), an SI prefix (`330n`, `4.7k`),
 * the IEC 60062 letter-and-digit code where the letter stands for the decimal point (`4R7`,
 * `1k3`, `2M2`, `4n7`, `R47`), and an optional trailing unit symbol checked against the unit the
 * field expects (`330nF`, `560kΩ`, `310V`). Expected failures are returned, never thrown.
 */
import {
  DECK_PREFIX_EXPONENTS,
  RECORD_PREFIX_EXPONENTS,
  RESISTANCE_ONLY_PREFIX_EXPONENTS,
  UNIT_NAMES,
  canonicalUnit,
  type ValueNotation,
} from "./notation-tables.js";

/** Longest value text we try to read; anything longer is not a value. */
export const MAX_VALUE_TEXT_CHARS = 64;

/** The unit a field expects: a symbol such as `F`, `"1"` for a plain ratio, or `"any"`. */
export type ExpectedUnit = string;

/** How to read a value: the unit the field expects and the notation. */
export interface ParseValueOptions {
  /** The unit the field holds; a different trailing symbol is an error. Default `"any"`. */
  unit?: ExpectedUnit;
  /** Record notation (case matters) or deck notation (case-insensitive, `meg`). */
  notation?: ValueNotation;
}

/** Why a value could not be read. */
export type ValueErrorCode = "empty-value" | "bad-notation" | "wrong-unit" | "not-finite";

/** A read value in SI units, or why it could not be read. */
export type ValueResult =
  | { ok: true; value: number; unit: string | null }
  | { ok: false; code: ValueErrorCode; message: string };

interface Prefix {
  letters: string;
  exponent: number;
}

/** The prefix at the start of `rest`, if any, for the notation and expected unit. */
function prefixAt(rest: string, notation: ValueNotation, unit: ExpectedUnit): Prefix | null {
  if (notation === "deck") {
    const lower = rest.toLowerCase();
    for (const [letters, exponent] of DECK_PREFIX_EXPONENTS) {
      if (lower.startsWith(letters)) return { letters: rest.slice(0, letters.length), exponent };
    }
    return null;
  }
  const first = rest.charAt(0);
  const table =
    unit === "Ω"
      ? { ...RECORD_PREFIX_EXPONENTS, ...RESISTANCE_ONLY_PREFIX_EXPONENTS }
      : RECORD_PREFIX_EXPONENTS;
  if (Object.prototype.hasOwnProperty.call(table, first))
    return { letters: first, exponent: table[first]! };
  return null;
}

/** `330n`, `4.7k`, `1e6`, `4R7`: the forms the error messages suggest. */
function formsHint(unit: ExpectedUnit): string {
  const sym = unit === "any" || unit === "1" ? "" : unit;
  return `write a number with an optional SI prefix and unit, e.g. 4.7k${sym}, 330n, 2.2e-7, or the IEC 60062 code 4k7`;
}

function fail(code: ValueErrorCode, message: string): ValueResult {
  return { ok: false, code, message };
}

/** The trailing unit spelling checked against the expected unit. */
function checkUnit(
  text: string,
  unitText: string,
  opts: Required<ParseValueOptions>,
): ValueResult | string | null {
  const trimmed = unitText.trim();
  if (trimmed === "") return null;
  const unit = canonicalUnit(trimmed, opts.notation);
  if (unit === null) {
    // "meg" is the deck's mega; in a record M already is mega
    const megHint =
      opts.notation === "record" && /^eg/i.test(trimmed)
        ? " (in a record, M is mega: write 1M, not 1meg)"
        : "";
    return fail(
      "bad-notation",
      `cannot read "${text}": unknown text "${trimmed}"${megHint}; ${formsHint(opts.unit)}`,
    );
  }
  if (opts.unit === "any" || opts.unit === unit) return unit;
  const expected = UNIT_NAMES[opts.unit] ?? opts.unit;
  return fail(
    "wrong-unit",
    `"${text}" is in ${UNIT_NAMES[unit] ?? unit}, but this field is in ${expected}`,
  );
}

/** Reads a value string or number into SI units (see the file comment for the notation). */
export function parseValue(input: string | number, options: ParseValueOptions = {}): ValueResult {
  const opts: Required<ParseValueOptions> = {
    unit: options.unit ?? "any",
    notation: options.notation ?? "record",
  };
  if (typeof input === "number") {
    return Number.isFinite(input)
      ? { ok: true, value: input, unit: null }
      : fail("not-finite", `${input} is not a finite number`);
  }
  if (typeof input !== "string") return fail("bad-notation", "a value must be text or a number");
  const text = input.trim();
  if (text === "") return fail("empty-value", "the value is empty");
  if (text.length > MAX_VALUE_TEXT_CHARS)
    return fail("bad-notation", `a value is at most ${MAX_VALUE_TEXT_CHARS} characters`);

  // sign, integer digits, optional fraction, optional exponent
  const head = /^([+-]?)(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?/.exec(text)!;
  const sign = head[1] ?? "";
  const intDigits = head[2] ?? "";
  const hasPoint = head[3] !== undefined;
  const fracDigits = head[3] ?? "";
  const hasExponent = head[4] !== undefined;
  let exponent = hasExponent ? Number(head[4]) : 0;
  let rest = text.slice(head[0].length);
  let mantissaFrac = fracDigits;

  // whitespace is allowed between the number and its prefix or unit ("330 nF")
  const spaced = rest.replace(/^\s+/, "");
  const prefix = prefixAt(spaced, opts.notation, opts.unit);
  if (prefix !== null) {
    const afterPrefix = spaced.slice(prefix.letters.length);
    const code = /^\d+/.exec(afterPrefix);
    if (code !== null) {
      // IEC 60062: the letter stands for the decimal point, so no other point or exponent
      if (hasPoint || hasExponent || spaced !== rest) {
        return fail(
          "bad-notation",
          `cannot read "${text}": a decimal-point letter cannot follow a decimal point or exponent`,
        );
      }
      mantissaFrac = code[0];
      rest = afterPrefix.slice(code[0].length);
    } else {
      rest = afterPrefix;
    }
    // a unit symbol that is also a prefix letter: "1F" is never reached here, but "1T" is tera
    exponent += prefix.exponent;
  } else {
    rest = spaced;
  }
  if (intDigits === "" && mantissaFrac === "") {
    return fail("bad-notation", `cannot read "${text}" as a value; ${formsHint(opts.unit)}`);
  }
  const unitCheck = checkUnit(text, rest, opts);
  if (unitCheck !== null && typeof unitCheck !== "string") return unitCheck;

  // Build a decimal string and let Number() round once, so "4n7" equals the literal 4.7e-9.
  const value = Number(
    `${sign}${intDigits === "" ? "0" : intDigits}.${mantissaFrac === "" ? "0" : mantissaFrac}e${exponent}`,
  );
  if (!Number.isFinite(value)) return fail("not-finite", `"${text}" is too large to be a value`);
  return { ok: true, value, unit: unitCheck };
}
