/**
 * One raw part (already of the right shape) into a normalised `Part`: the value read in the
 * kind's unit, tolerance as a fraction, ratings and model parameters as SI numbers, and pins as
 * a role → net map using the per-kind pin table. Problems go to the list; null when any.
 */
import { kindInfo, pinRolesFor, KINDS } from "../graph/kinds.js";
import { parseValue } from "../values/parse-value.js";
import { parseTolerance } from "../values/parse-tolerance.js";
import { partPlausibility } from "./plausibility.js";
import type { Part, Rating } from "./types.js";
import type { PathSegment, ProblemList } from "./input-errors.js";
import type { RawPart } from "./record-schema.js";

/** Units of the model parameters the record format names; others may carry any unit. */
export const MODEL_PARAMETER_UNITS: Readonly<Record<string, string>> = {
  vgt: "V",
  igt: "A",
  ih: "A",
  von: "V",
  is: "A",
  n: "1",
  rs: "Ω",
  bv: "V",
  rz: "Ω",
  vf: "V",
  if: "A",
  lp: "H",
  ratio: "1",
  k: "1",
  rp: "Ω",
  r: "Ω",
  c: "F",
};

/** Kinds whose value must be above zero (a zero-ohm resistor is a jumper and allowed). */
const POSITIVE_VALUE_KINDS: readonly string[] = [
  "capacitor",
  "inductor",
  "fuse",
  "varistor",
  "zener",
];

const RATING_UNITS: ReadonlyArray<readonly [keyof Rating, string]> = [
  ["volts", "V"],
  ["amps", "A"],
  ["watts", "W"],
  ["surge_amps", "A"],
];

/** The net name as text (YAML may have read `0` as a number). */
export function netNameText(net: string | number): string {
  return typeof net === "number" ? String(net) : net;
}

/** Reads one numeric field in the value notation; reports and returns null on failure. */
export function readNumber(
  raw: string | number,
  unit: string,
  path: readonly PathSegment[],
  problems: ProblemList,
): number | null {
  const read = parseValue(raw, { unit });
  if (!read.ok) {
    problems.error(path, read.code, read.message);
    return null;
  }
  return read.value;
}

function normalisePins(
  raw: RawPart,
  polarised: boolean,
  base: readonly PathSegment[],
  problems: ProblemList,
): Record<string, string> | null {
  const info = kindInfo(raw.kind);
  const roles = pinRolesFor(raw.kind, polarised);
  const path = [...base, "pins"];
  if (Array.isArray(raw.pins)) {
    const nets = raw.pins.map(netNameText);
    if (info === null) return Object.fromEntries(nets.map((net, i) => [`p${i + 1}`, net]));
    if (info.variadic) return Object.fromEntries(nets.map((net, i) => [`p${i + 1}`, net]));
    if (nets.length !== roles!.length) {
      problems.error(
        path,
        "pin-count",
        `a ${raw.kind} has ${roles!.length} pins (${roles!.join(", ")}), but ${nets.length} ${nets.length === 1 ? "is" : "are"} given`,
      );
      return null;
    }
    return Object.fromEntries(nets.map((net, i) => [roles![i]!, net]));
  }
  const entries = Object.entries(raw.pins).map(([role, net]) => [role, netNameText(net)] as const);
  if (info === null) return Object.fromEntries(entries);
  let ok = true;
  if (info.variadic) {
    for (const [role] of entries) {
      if (!/^p[1-9][0-9]*$/.test(role)) {
        problems.error(
          [...path, role],
          "unknown-pin",
          `a ${raw.kind}'s pins are named p1, p2, ...; "${role}" is not one`,
        );
        ok = false;
      }
    }
    if (entries.length === 0) {
      problems.error(path, "pin-count", `a ${raw.kind} needs at least one pin`);
      ok = false;
    }
    return ok ? Object.fromEntries(entries) : null;
  }
  for (const [role] of entries) {
    if (!roles!.includes(role)) {
      const extra =
        raw.kind === "capacitor"
          ? polarised
            ? " (a polarised capacitor)"
            : " (set polarised: true for plus/minus)"
          : "";
      problems.error(
        [...path, role],
        "unknown-pin",
        `a ${raw.kind}${extra} has pins ${roles!.join(", ")}; "${role}" is not one of them`,
      );
      ok = false;
    }
  }
  for (const role of roles!) {
    if (!entries.some(([r]) => r === role)) {
      problems.error(
        path,
        "missing-pin",
        `pin "${role}" of this ${raw.kind} is not connected to a net`,
      );
      ok = false;
    }
  }
  if (!ok) return null;
  // keep the kind's pin order whatever order the map was written in
  return Object.fromEntries(roles!.map((role) => [role, entries.find(([r]) => r === role)![1]]));
}

function normaliseValue(
  raw: RawPart,
  base: readonly PathSegment[],
  problems: ProblemList,
): { value: number | null; text: string | null; ok: boolean } {
  if (raw.value === undefined || raw.value === null) return { value: null, text: null, ok: true };
  const path = [...base, "value"];
  let text =
    typeof raw.value === "number"
      ? (problems.numberText(path) ?? String(raw.value))
      : raw.value.trim();
  const info = kindInfo(raw.kind);
  const unit = info === null ? "any" : (info.unit ?? "1");
  const read = parseValue(raw.value, { unit });
  // keep the file's spelling of a number only when it reads back to the same number
  if (
    typeof raw.value === "number" &&
    !(
      parseValue(text, { unit }).ok &&
      (parseValue(text, { unit }) as { value: number }).value === raw.value
    )
  ) {
    text = String(raw.value);
  }
  if (!read.ok) {
    if (info === null || info.unit === null) {
      // a part number in `value` of a diode or an unknown kind is documentation, not a number
      problems.warn(
        path,
        "value-not-numeric",
        `"${text}" is kept as text; a ${raw.kind} has no numeric value here`,
      );
      return { value: null, text, ok: true };
    }
    const hint = read.code === "wrong-unit" ? "" : ` (a ${raw.kind}'s value is in ${info.unit})`;
    problems.error(path, read.code, `${read.message}${hint}`);
    return { value: null, text, ok: false };
  }
  if (read.value < 0 || (read.value === 0 && POSITIVE_VALUE_KINDS.includes(raw.kind))) {
    problems.error(
      path,
      "value-out-of-range",
      `a ${raw.kind}'s value must be ${read.value < 0 ? "at least 0" : "above 0"}`,
    );
    return { value: null, text, ok: false };
  }
  return { value: read.value, text, ok: true };
}

/** Normalises one raw part at `parts[index]`; null when it has errors (they are reported). */
export function normalisePart(
  raw: RawPart,
  index: number,
  problems: ProblemList,
  opts: { checkPins?: boolean } = {},
): Part | null {
  const base: PathSegment[] = ["parts", index];
  const before = problems.errors.length;
  const info = kindInfo(raw.kind);
  if (info === null) {
    const near = Object.keys(KINDS).find((k) => k.toLowerCase() === raw.kind.toLowerCase().trim());
    const hint = near === undefined ? "" : `; did you mean "${near}"?`;
    problems.warn(
      [...base, "kind"],
      "unknown-kind",
      `"${raw.kind}" is not a kind the engine simulates; the part is kept for documentation${hint}`,
    );
  }
  if (raw.polarised !== undefined && raw.kind !== "capacitor") {
    problems.warn([...base, "polarised"], "field-ignored", "polarised applies to capacitors only");
  }
  if (raw.closed !== undefined && raw.kind !== "switch") {
    problems.warn([...base, "closed"], "field-ignored", "closed applies to switches only");
  }
  const polarised = raw.kind === "capacitor" && raw.polarised === true;
  const value = normaliseValue(raw, base, problems);
  let tolerance: number | null = null;
  if (raw.tolerance !== undefined && raw.tolerance !== null) {
    const t = parseTolerance(raw.tolerance);
    if (t.ok) tolerance = t.value;
    else problems.error([...base, "tolerance"], t.code, t.message);
  }
  const rating: Rating = {};
  for (const [key, unit] of RATING_UNITS) {
    const rawRating = raw.rating?.[key];
    if (rawRating === undefined) continue;
    const n = readNumber(rawRating as string | number, unit, [...base, "rating", key], problems);
    if (n !== null && n < 0)
      problems.error([...base, "rating", key], "value-out-of-range", `a rating cannot be negative`);
    else if (n !== null) (rating as Record<string, number>)[key] = n;
  }
  if (raw.rating?.class !== undefined) rating.class = raw.rating.class;
  if (raw.rating?.package !== undefined) rating.package = raw.rating.package;
  const model: Record<string, number> = {};
  for (const [key, rawParam] of Object.entries(raw.model ?? {})) {
    const n = readNumber(
      rawParam,
      MODEL_PARAMETER_UNITS[key] ?? "any",
      [...base, "model", key],
      problems,
    );
    if (n !== null) model[key] = n;
  }
  if (value.ok) {
    // impossible numbers are refused, implausible ones kept and named (see plausibility.ts)
    for (const f of partPlausibility({ kind: raw.kind, value: value.value, model, rating })) {
      if (f.level === "impossible")
        problems.error([...base, ...f.field], "impossible-value", f.message);
      else problems.warn([...base, ...f.field], "implausible-value", f.message);
    }
  }
  const pins = opts.checkPins === false ? null : normalisePins(raw, polarised, base, problems);
  if (pins === null || !value.ok || problems.errors.length > before) return null;
  return {
    ref: raw.ref,
    kind: raw.kind,
    value: value.value,
    value_text: value.text,
    tolerance,
    rating,
    marking: raw.marking ?? null,
    polarised,
    closed: raw.kind === "switch" ? (raw.closed ?? true) : false,
    model,
    pins,
    note: raw.note ?? null,
  };
}
