/**
 * The deck convention reads `M` (any case) as milli and spells mega `meg`. A person who writes
 * `R1 L A 1M` almost always means one megohm, and gets one milliohm: a short across the mains
 * that the solver will happily drive to kilo-amps. So every deck value whose `m`/`M` made it a
 * milli value is looked at: on a resistor it is always named (milliohm resistors are current
 * shunts, rare on a gadget's board, and written `1m` on purpose); on any other field it is
 * named when the milli reading lands outside what that kind of part can plausibly be.
 */
import { fieldPlausibility } from "../record/plausibility.js";
import { formatValue } from "../values/format-value.js";

/** A number, then an `m` or `M` that is not the start of `meg`: the deck's milli. */
const DECK_MILLI = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?\s*m(?!eg)/i;

/** True when this deck text took `m`/`M` as milli. */
export function usesDeckMilli(text: string): boolean {
  return DECK_MILLI.test(text.trim());
}

/**
 * The warning text when a deck value read as milli is far likelier meant as mega, else null.
 * `field` is the part field (`["value"]`, `["model", "lp"]`, ...), `value` the milli reading.
 */
export function milliOrMegaMessage(
  text: string,
  kind: string,
  field: readonly string[],
  value: number,
  unit: string,
): string | null {
  if (!usesDeckMilli(text)) return null;
  const isResistance = kind === "resistor" && field.length === 1 && field[0] === "value";
  if (!isResistance && fieldPlausibility(kind, field, value) === null) return null;
  const shownUnit = unit === "1" || unit === "any" ? null : unit;
  const mega = value * 1e9;
  const suggestion = text.trim().replace(/m(?!eg)/i, "meg");
  return (
    `"${text.trim()}" reads as ${formatValue(value, shownUnit)}: in a deck M and m are milli. ` +
    `If you meant ${formatValue(mega, shownUnit)}, write ${suggestion}`
  );
}
