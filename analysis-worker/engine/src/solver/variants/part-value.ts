/**
 * The one way to change a part's value in a variant (a sweep point, a tolerance sample, a
 * sensitivity, a what-if): each kind keeps the value that matters in one place, and a load's
 * lives in its model (its resistance, else its capacitance), not in `value`, which the solver
 * never reads for a load. Changing `value` there would change nothing.
 */
import type { Part, TeardownRecord } from "../../record/types.js";

/** Where a part keeps the value that variants change: its main value, or a load's model r or c. */
export type ValueSlot = "value" | "model.r" | "model.c";

/** Kinds whose main `value` is what the solver uses. */
const VALUE_KINDS: ReadonlySet<Part["kind"]> = new Set([
  "resistor",
  "capacitor",
  "inductor",
  "zener",
  "varistor",
]);

/** The changeable value of a part and where it lives, or null for a part with none. */
export function partValueOf(p: Part): { slot: ValueSlot; value: number } | null {
  if (p.kind === "load") {
    if (p.model.r !== undefined) return { slot: "model.r", value: p.model.r };
    if (p.model.c !== undefined) return { slot: "model.c", value: p.model.c };
    return null;
  }
  if (VALUE_KINDS.has(p.kind) && p.value !== null && p.value > 0)
    return { slot: "value", value: p.value };
  return null;
}

/** The part with its changeable value replaced (a part with none is returned unchanged). */
export function withPartValue(p: Part, value: number): Part {
  const slot = partValueOf(p)?.slot;
  if (slot === undefined) return p;
  if (slot === "model.r") return { ...p, model: { ...p.model, r: value } };
  if (slot === "model.c") return { ...p, model: { ...p.model, c: value } };
  return { ...p, value, value_text: String(value) };
}

/** The record with the given parts' values replaced (ref -> new value). */
export function withPartValues(
  rec: TeardownRecord,
  values: ReadonlyMap<string, number>,
): TeardownRecord {
  if (values.size === 0) return rec;
  return {
    ...rec,
    parts: rec.parts.map((p) => (values.has(p.ref) ? withPartValue(p, values.get(p.ref)!) : p)),
  };
}
