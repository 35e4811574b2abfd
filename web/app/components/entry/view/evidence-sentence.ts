/**
 * One evidence entry of a finding ({ label, value, unit }) as words with its unit:
 * "time constant: 2.2 s", "firing angle: 90°".
 */
import { DISPLAY_DIGITS, NOT_COMPUTED, si } from "../si-units";
import { obj, str } from "./result-access";

/** Units shown with an SI prefix (24.1 mA); the others (%, mm, ppm, none) as plain numbers. */
const PREFIXED_UNITS = new Set(["V", "A", "W", "VA", "F", "H", "Ω", "s", "Hz", "J"]);
/** Units written against the number (90°, 2.1×). */
const ATTACHED_UNITS = new Set(["°", "×"]);

/** The entry as "label: value unit", or null when it has no label. */
export function evidenceSentence(entry: unknown): string | null {
  const e = obj(entry);
  const label = str(e.label);
  if (label === null) return null;
  const unit = str(e.unit) ?? "";
  const v = e.value;
  if (typeof v === "string") return `${label}: ${v}`;
  if (typeof v !== "number" || !Number.isFinite(v)) return `${label}: ${NOT_COMPUTED}`;
  if (PREFIXED_UNITS.has(unit)) return `${label}: ${si(v, unit)}`;
  const n = Number(v.toPrecision(DISPLAY_DIGITS));
  if (ATTACHED_UNITS.has(unit)) return `${label}: ${n}${unit}`;
  return `${label}: ${n}${unit ? ` ${unit}` : ""}`;
}
