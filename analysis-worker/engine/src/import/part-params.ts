/**
 * `key=value` words on a deck line or in a CSV column, into the fields of a raw part: ratings,
 * tolerance, marking, flags and model parameters. Numbers are read in the source's notation
 * and stored as numbers (or, for the main value, as record-notation text), so the record
 * validation never has to know which notation a file used.
 */
import { kindInfo } from "../graph/kinds.js";
import { MODEL_PARAMETER_UNITS } from "../record/normalise-part.js";
import { exactValueText } from "../values/format-value.js";
import { parseValue } from "../values/parse-value.js";
import type { ValueNotation } from "../values/notation-tables.js";
import type { RawRecordBuilder, SourceToken } from "./raw-record-builder.js";
import { formatPath } from "../record/input-errors.js";
import { milliOrMegaMessage } from "./milli-or-mega.js";

/** Rating keys and their units. */
const RATING_KEYS: Readonly<Record<string, string>> = {
  volts: "V",
  amps: "A",
  watts: "W",
  surge_amps: "A",
};
/** Rating keys that hold text. */
const RATING_TEXT_KEYS: readonly string[] = ["class", "package"];
/** Part fields that hold text. */
const TEXT_KEYS: readonly string[] = ["marking", "note"];
/** Part fields that hold true or false. */
const FLAG_KEYS: readonly string[] = ["polarised", "closed"];

/** The unit a kind's main value is read in. */
export function valueUnitOf(kind: string): string {
  const info = kindInfo(kind);
  return info === null ? "any" : (info.unit ?? "1");
}

/** In a deck, warns at the word when its `m`/`M` made a milli value where mega is likelier. */
function warnMilliOrMega(
  text: string,
  kind: string,
  field: string[],
  value: number,
  unit: string,
  notation: ValueNotation,
  at: SourceToken,
  index: number,
  builder: RawRecordBuilder,
): void {
  if (notation !== "deck") return;
  const message = milliOrMegaMessage(text, kind, field, value, unit);
  if (message !== null)
    builder.problems.warnAt(at, formatPath(["parts", index, ...field]), "milli-or-mega", message);
}

/**
 * Reads a main value in the source notation and gives its record-notation text; the text of
 * a value that cannot be read is passed on unchanged, so that the record validation reports it
 * (unit-less kinds keep a part number as text). `index` is the part's place in `parts`.
 */
export function valueToRecordText(
  text: string,
  kind: string,
  notation: ValueNotation,
  at: SourceToken,
  builder: RawRecordBuilder,
  index: number,
): string | null {
  const unit = valueUnitOf(kind);
  const read = parseValue(text, { unit, notation });
  if (read.ok) {
    warnMilliOrMega(text, kind, ["value"], read.value, unit, notation, at, index, builder);
    return exactValueText(read.value, "record");
  }
  const info = kindInfo(kind);
  if (info === null || info.unit === null) return text;
  builder.errorAt(at, read.code, read.message);
  return null;
}

/** Splits `key=value`; null for a bare word. */
export function splitParam(token: SourceToken): { key: string; value: string } | null {
  const eq = token.text.indexOf("=");
  if (eq <= 0) return null;
  return { key: token.text.slice(0, eq).trim().toLowerCase(), value: token.text.slice(eq + 1) };
}

/** Applies `key=value` words to the raw part at `parts[index]`. */
export function applyParams(
  rawPart: Record<string, unknown>,
  index: number,
  params: readonly SourceToken[],
  notation: ValueNotation,
  builder: RawRecordBuilder,
): void {
  const kind = String(rawPart.kind);
  for (const token of params) {
    const param = splitParam(token);
    if (param === null) {
      builder.errorAt(token, "bad-parameter", `expected key=value, got "${token.text}"`);
      continue;
    }
    const { key, value } = param;
    const at = (path: (string | number)[]): void => builder.place(["parts", index, ...path], token);
    if (key === "value") {
      const text = valueToRecordText(value, kind, notation, token, builder, index);
      if (text !== null) rawPart.value = text;
      at(["value"]);
    } else if (key === "tol" || key === "tolerance") {
      rawPart.tolerance = value;
      at(["tolerance"]);
    } else if (RATING_KEYS[key] !== undefined || RATING_TEXT_KEYS.includes(key)) {
      const rating = (rawPart.rating ??= {}) as Record<string, unknown>;
      if (RATING_TEXT_KEYS.includes(key)) rating[key] = value;
      else {
        const read = parseValue(value, { unit: RATING_KEYS[key]!, notation });
        if (read.ok) {
          rating[key] = read.value;
          const field = ["rating", key];
          warnMilliOrMega(
            value,
            kind,
            field,
            read.value,
            RATING_KEYS[key]!,
            notation,
            token,
            index,
            builder,
          );
        } else builder.errorAt(token, read.code, `${key}: ${read.message}`);
      }
      at(["rating", key]);
    } else if (TEXT_KEYS.includes(key)) {
      rawPart[key] = value;
      at([key]);
    } else if (FLAG_KEYS.includes(key)) {
      if (/^(true|yes|1)$/i.test(value)) rawPart[key] = true;
      else if (/^(false|no|0)$/i.test(value)) rawPart[key] = false;
      else builder.errorAt(token, "bad-parameter", `${key} is true or false, got "${value}"`);
      at([key]);
    } else if (/^[a-z][a-z0-9_]*$/.test(key)) {
      const model = (rawPart.model ??= {}) as Record<string, unknown>;
      const unit = MODEL_PARAMETER_UNITS[key] ?? "any";
      const read = parseValue(value, { unit, notation });
      if (read.ok) {
        model[key] = read.value;
        warnMilliOrMega(
          value,
          kind,
          ["model", key],
          read.value,
          unit,
          notation,
          token,
          index,
          builder,
        );
      } else builder.errorAt(token, read.code, `${key}: ${read.message}`);
      at(["model", key]);
    } else {
      builder.errorAt(
        token,
        "bad-parameter",
        `"${key}" is not a parameter name (letters, digits and _)`,
      );
    }
  }
}
