/**
 * A what-if's input: another supply and/or new values for some parts. Checked against the record
 * it applies to, so an unknown part or an unreadable value comes back as an error naming its
 * place in the request (`changes[0].part`, `supply.vrms`), never as a throw.
 */
import { KINDS } from "../graph/kinds.js";
import type { InputError, Part, Supply, TeardownRecord } from "../record/types.js";
import { partValueOf, withPartValue, type ValueSlot } from "../solver/variants/part-value.js";
import { parseValue } from "../values/parse-value.js";
import { exactValueText } from "../values/format-value.js";

/** One part's new main value, as a number in SI units or as record notation ("22k", "100n"). */
export interface PartChange {
  part: string;
  value: number | string;
}

/** What a what-if asks for; both fields may be left out (then it is the rated analysis). */
export interface WhatIfRequest {
  supply?: Supply;
  changes?: PartChange[];
}

/** The supply range a what-if may ask for: below it nothing works, above it no mains gadget is rated. */
export const WHAT_IF_VRMS_RANGE = { min: 1, max: 1000 } as const;
/** Mains frequencies from the lowest in use on railways (16.7 Hz) to aircraft (400 Hz), with room. */
export const WHAT_IF_HZ_RANGE = { min: 10, max: 1000 } as const;
/** Most parts one what-if may change. */
export const MAX_WHAT_IF_CHANGES = 50;

/** The unit a changed value is read in: a load's resistance or capacitance, else its kind's. */
function unitOfSlot(kind: Part["kind"], slot: ValueSlot): string {
  if (slot === "model.r") return "Ω";
  if (slot === "model.c") return "F";
  return KINDS[kind as keyof typeof KINDS].unit ?? "any";
}

/** The checked request: the variant record, the supply it runs at, and the changes in SI units. */
export interface CheckedWhatIf {
  record: TeardownRecord;
  supply: Supply;
  changes: Array<{ part: string; value: number }>;
}

function problem(path: string, code: string, message: string): InputError {
  return { path, code, message, line: null, column: null };
}

function checkSupply(s: Supply | undefined, rated: Supply, errors: InputError[]): Supply {
  if (s === undefined) return rated;
  const within = (v: unknown, r: { min: number; max: number }) =>
    typeof v === "number" && Number.isFinite(v) && v >= r.min && v <= r.max;
  if (!within(s.vrms, WHAT_IF_VRMS_RANGE))
    errors.push(
      problem(
        "supply.vrms",
        "out-of-range",
        `the supply voltage must be ${WHAT_IF_VRMS_RANGE.min} to ${WHAT_IF_VRMS_RANGE.max} V RMS`,
      ),
    );
  if (!within(s.hz, WHAT_IF_HZ_RANGE))
    errors.push(
      problem(
        "supply.hz",
        "out-of-range",
        `the supply frequency must be ${WHAT_IF_HZ_RANGE.min} to ${WHAT_IF_HZ_RANGE.max} Hz`,
      ),
    );
  return { vrms: s.vrms, hz: s.hz };
}

/** Checks a what-if against the record and builds its variant; every problem is returned at once. */
export function checkWhatIf(
  record: TeardownRecord,
  req: WhatIfRequest,
): { ok: true; value: CheckedWhatIf } | { ok: false; errors: InputError[] } {
  const errors: InputError[] = [];
  const supply = checkSupply(req.supply, record.device.rated_supply, errors);
  const changes = req.changes ?? [];
  if (changes.length > MAX_WHAT_IF_CHANGES)
    errors.push(
      problem("changes", "too-many", `at most ${MAX_WHAT_IF_CHANGES} changes in one what-if`),
    );
  const applied = new Map<string, number>();
  changes.slice(0, MAX_WHAT_IF_CHANGES).forEach((c, i) => {
    const part = record.parts.find((p) => p.ref === c.part);
    if (part === undefined) {
      errors.push(problem(`changes[${i}].part`, "unknown-part", `no part ${c.part} in the record`));
      return;
    }
    // The one rule of where a part keeps the value a variant changes (a load's is its model).
    const slot = partValueOf(part)?.slot;
    if (slot === undefined) {
      errors.push(
        problem(
          `changes[${i}].part`,
          "no-value",
          `${c.part} is a ${part.kind} with no value to change; a what-if changes a resistor, capacitor, inductor, zener or varistor, or a load's resistance or capacitance`,
        ),
      );
      return;
    }
    if (applied.has(c.part)) {
      errors.push(problem(`changes[${i}].part`, "duplicate", `${c.part} is changed twice`));
      return;
    }
    const unit = unitOfSlot(part.kind, slot);
    const read = parseValue(c.value, { unit, notation: "record" });
    if (!read.ok) {
      errors.push(problem(`changes[${i}].value`, read.code, read.message));
      return;
    }
    if (!(read.value > 0)) {
      errors.push(
        problem(`changes[${i}].value`, "not-positive", `the value of ${c.part} must be above zero`),
      );
      return;
    }
    applied.set(c.part, read.value);
  });
  if (errors.length > 0) return { ok: false, errors };
  return {
    ok: true,
    value: {
      record: withValues(record, applied),
      supply,
      changes: [...applied].map(([part, value]) => ({ part, value })),
    },
  };
}

/**
 * The record with some parts' values replaced where each keeps it (a load's in its model), the
 * written value following for display.
 */
export function withValues(
  record: TeardownRecord,
  values: ReadonlyMap<string, number>,
): TeardownRecord {
  if (values.size === 0) return record;
  return {
    ...record,
    parts: record.parts.map((p) => {
      const v = values.get(p.ref);
      if (v === undefined) return p;
      const changed = withPartValue(p, v);
      return changed.kind === p.kind && partValueOf(p)?.slot === "value"
        ? { ...changed, value_text: exactValueText(v) }
        : changed;
    }),
  };
}
