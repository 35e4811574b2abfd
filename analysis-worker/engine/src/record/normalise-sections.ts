/**
 * The record's other sections into normalised form: supplies, nets, measurements and board
 * spacings, with the defaults the record format states (rated supply for a measurement,
 * material group IIIa and pollution degree 2 for a spacing).
 */
import type { Measurement, MeasurementKind, NetInfo, Spacing, Supply } from "./types.js";
import { parseValue } from "../values/parse-value.js";
import { parseUncertainty } from "../values/parse-tolerance.js";
import type { PathSegment, ProblemList } from "./input-errors.js";
import { netNameText, readNumber } from "./normalise-part.js";
import { judgeNumber, SUPPLY_BOUNDS } from "./plausibility.js";
import type { RawMeasurement, RawNet, RawSpacing, RawSupply } from "./record-schema.js";

/** The unit of each measurement's value (docs/teardown-record.md, "Measurements"). */
export const MEASUREMENT_UNITS: Readonly<Record<MeasurementKind, string>> = {
  "input.current_rms": "A",
  "input.power": "W",
  "input.apparent_power": "VA",
  "input.power_factor": "1",
  "voltage.dc": "V",
  "voltage.rms": "V",
  "voltage.peak": "V",
  "part.current_rms": "A",
  "part.power": "W",
};

/** Measurements whose value cannot be negative. */
const NON_NEGATIVE_MEASUREMENTS: readonly MeasurementKind[] = [
  "input.current_rms",
  "input.apparent_power",
  "voltage.rms",
  "voltage.peak",
  "part.current_rms",
];

/** Nets and parts a cross reference may name. */
export interface KnownNames {
  nets: ReadonlySet<string>;
  refs: ReadonlySet<string>;
}

/** A supply with positive volts and hertz, or null (reported). */
export function normaliseSupply(
  raw: RawSupply,
  path: readonly PathSegment[],
  problems: ProblemList,
): Supply | null {
  const vrms = readNumber(raw.vrms, "V", [...path, "vrms"], problems);
  const hz = readNumber(raw.hz, "Hz", [...path, "hz"], problems);
  if (vrms === null || hz === null) return null;
  let ok = true;
  if (!(vrms > 0)) {
    problems.error(
      [...path, "vrms"],
      "value-out-of-range",
      "the supply's RMS voltage must be above 0",
    );
    ok = false;
  }
  if (!(hz > 0)) {
    problems.error(
      [...path, "hz"],
      "value-out-of-range",
      "the supply frequency must be above 0 (this reader handles mains AC)",
    );
    ok = false;
  }
  if (ok) {
    for (const key of ["vrms", "hz"] as const) {
      const f = judgeNumber(key === "vrms" ? vrms : hz, SUPPLY_BOUNDS[key], [key]);
      if (f !== null && f.level === "implausible")
        problems.warn([...path, key], "implausible-value", f.message);
    }
  }
  return ok ? { vrms, hz } : null;
}

/** A net's info with defaults (no role, not accessible, no note). */
export function normaliseNet(raw: RawNet): NetInfo {
  return { role: raw.role ?? null, accessible: raw.accessible ?? false, note: raw.note ?? null };
}

function checkNetPair(
  pair: readonly (string | number)[],
  path: readonly PathSegment[],
  known: KnownNames,
  problems: ProblemList,
): [string, string] | null {
  const names = pair.map(netNameText) as [string, string];
  let ok = true;
  names.forEach((name, i) => {
    if (!known.nets.has(name)) {
      problems.error(
        [...path, i],
        "unknown-net",
        `no net "${name}": it is not on any part's pins nor under nets`,
      );
      ok = false;
    }
  });
  return ok ? names : null;
}

/** One measurement at `measurements[index]`; null when it has errors. */
export function normaliseMeasurement(
  raw: RawMeasurement,
  index: number,
  rated: Supply,
  known: KnownNames,
  problems: ProblemList,
): Measurement | null {
  const base: PathSegment[] = ["measurements", index];
  const before = problems.errors.length;
  const unit = MEASUREMENT_UNITS[raw.what];
  const read = parseValue(raw.value, { unit });
  let value: number | null = null;
  if (!read.ok) problems.error([...base, "value"], read.code, read.message);
  else value = read.value;
  if (value !== null && value < 0 && NON_NEGATIVE_MEASUREMENTS.includes(raw.what)) {
    problems.error(
      [...base, "value"],
      "value-out-of-range",
      `a ${raw.what} reading cannot be negative`,
    );
  }
  if (value !== null && raw.what === "input.power_factor" && Math.abs(value) > 1) {
    problems.error(
      [...base, "value"],
      "value-out-of-range",
      "a power factor lies between -1 and 1",
    );
  }
  let between: [string, string] | null = null;
  if (raw.what.startsWith("voltage.")) {
    if (raw.between === undefined)
      problems.error(base, "missing-field", `a ${raw.what} measurement needs between: [net, net]`);
    else between = checkNetPair(raw.between, [...base, "between"], known, problems);
  } else if (raw.between !== undefined) {
    problems.warn(
      [...base, "between"],
      "field-ignored",
      `between applies to voltage.* measurements only`,
    );
  }
  let part: string | null = null;
  if (raw.what.startsWith("part.")) {
    if (raw.part === undefined)
      problems.error(base, "missing-field", `a ${raw.what} measurement needs part: REF`);
    else if (!known.refs.has(raw.part))
      problems.error([...base, "part"], "unknown-part", `no part with ref "${raw.part}"`);
    else part = raw.part;
  } else if (raw.part !== undefined) {
    problems.warn([...base, "part"], "field-ignored", `part applies to part.* measurements only`);
  }
  const supply =
    raw.supply === undefined ? rated : normaliseSupply(raw.supply, [...base, "supply"], problems);
  let uncertainty: Measurement["uncertainty"] = null;
  if (raw.uncertainty !== undefined && raw.uncertainty !== null) {
    const u = parseUncertainty(raw.uncertainty, unit);
    if (u.ok) uncertainty = u.value;
    else problems.error([...base, "uncertainty"], u.code, u.message);
  }
  if (problems.errors.length > before || value === null || supply === null) return null;
  return {
    what: raw.what,
    value,
    between,
    part,
    supply: { ...supply },
    instrument: raw.instrument ?? null,
    uncertainty,
  };
}

/** One spacing at `board.spacings[index]`; null when it has errors. */
export function normaliseSpacing(
  raw: RawSpacing,
  index: number,
  known: KnownNames,
  problems: ProblemList,
): Spacing | null {
  const base: PathSegment[] = ["board", "spacings", index];
  const between = checkNetPair(raw.between, [...base, "between"], known, problems);
  if (raw.creepage_mm == null && raw.clearance_mm == null) {
    problems.warn(
      base,
      "spacing-empty",
      "a spacing with neither creepage_mm nor clearance_mm says nothing",
    );
  }
  if (between === null) return null;
  return {
    between,
    creepage_mm: raw.creepage_mm ?? null,
    clearance_mm: raw.clearance_mm ?? null,
    slot: raw.slot ?? false,
    material_group: raw.material_group ?? "IIIa",
    pollution_degree: raw.pollution_degree ?? 2,
  };
}
