/**
 * The one validation path for every reader: a raw record object (from YAML, JSON, a netlist
 * deck or a CSV parts list) and a locator for its source positions in, the normalised
 * `TeardownRecord` or every problem found out. Each section is checked on its own so that one
 * bad part does not hide the problems of the next.
 */
import {
  MeasurementInput,
  NetInput,
  PartInput,
  RecordInput,
  SpacingInput,
  SupplyInput,
  NET_NAME_PATTERN,
  REF_PATTERN,
} from "./record-schema.js";
import { ProblemList, sortByPlace, type SourceLocator } from "./input-errors.js";
import { reportSchemaIssues } from "./schema-issues.js";
import { netNameText, normalisePart } from "./normalise-part.js";
import {
  normaliseMeasurement,
  normaliseNet,
  normaliseSpacing,
  normaliseSupply,
  type KnownNames,
} from "./normalise-sections.js";
import type { z } from "zod";
import type { RawMeasurement, RawPart } from "./record-schema.js";
import type {
  Measurement,
  NetInfo,
  ParseResult,
  Part,
  Spacing,
  Supply,
  TeardownRecord,
} from "./types.js";

/** The supply assumed when a record states none (a warning says so). */
export const DEFAULT_RATED_SUPPLY: Readonly<Supply> = { vrms: 230, hz: 50 };

type Loose = Record<string, unknown>;

function isMap(x: unknown): x is Loose {
  return typeof x === "object" && x !== null && !Array.isArray(x);
}

/** Net names on a part's pins, read defensively (the part may be otherwise broken). */
function pinNets(rawPart: unknown): string[] {
  if (!isMap(rawPart)) return [];
  const pins = rawPart.pins;
  const values = Array.isArray(pins) ? pins : isMap(pins) ? Object.values(pins) : [];
  return values
    .filter((v): v is string | number => typeof v === "string" || typeof v === "number")
    .map(netNameText)
    .filter((n) => NET_NAME_PATTERN.test(n));
}

function ratedSupply(raw: Loose, problems: ProblemList): Supply {
  const device = raw.device;
  const rawSupply = isMap(device) ? device.rated_supply : undefined;
  if (rawSupply === undefined) {
    problems.warn(
      ["device", "rated_supply"],
      "no-rated-supply",
      `no rated supply given; assuming ${DEFAULT_RATED_SUPPLY.vrms} V / ${DEFAULT_RATED_SUPPLY.hz} Hz`,
    );
    return { ...DEFAULT_RATED_SUPPLY };
  }
  const parsed = SupplyInput.safeParse(rawSupply);
  if (!parsed.success) return { ...DEFAULT_RATED_SUPPLY };
  return (
    normaliseSupply(parsed.data, ["device", "rated_supply"], problems) ?? {
      ...DEFAULT_RATED_SUPPLY,
    }
  );
}

/**
 * The fields of a raw object that each pass their own schema, so that a part with a bad ref
 * still has its value and pins checked. Null when a field the checks need is unusable.
 */
function salvage(
  rawItem: unknown,
  shape: Record<string, { safeParse(x: unknown): { success: boolean } }>,
  needed: readonly string[],
): Loose | null {
  if (!isMap(rawItem)) return null;
  const kept: Loose = {};
  for (const [key, schema] of Object.entries(shape)) {
    if (rawItem[key] !== undefined && schema.safeParse(rawItem[key]).success)
      kept[key] = rawItem[key];
  }
  return needed.every((k) => kept[k] !== undefined) ? kept : null;
}

function readParts(raw: Loose, problems: ProblemList): { parts: Part[]; refs: Set<string> } {
  const parts: Part[] = [];
  const firstIndexOfRef = new Map<string, number>();
  const rawParts = Array.isArray(raw.parts) ? raw.parts : [];
  rawParts.forEach((rawPart, i) => {
    const ref = isMap(rawPart) ? rawPart.ref : undefined;
    if (typeof ref === "string" && REF_PATTERN.test(ref)) {
      const first = firstIndexOfRef.get(ref);
      if (first !== undefined)
        problems.error(
          ["parts", i, "ref"],
          "duplicate-ref",
          `ref "${ref}" is already used by parts[${first}]`,
        );
      else firstIndexOfRef.set(ref, i);
    }
    const shaped = PartInput.safeParse(rawPart);
    if (shaped.success) {
      const part = normalisePart(shaped.data, i, problems);
      if (part !== null) parts.push(part);
      return;
    }
    // the shape errors are already reported; still check what can be checked
    const kept = salvage(rawPart, PartInput.shape, ["kind"]);
    if (kept === null) return;
    const checkPins = kept.pins !== undefined;
    const stand_in = {
      ...kept,
      ref: typeof kept.ref === "string" ? kept.ref : "unnamed",
      pins: kept.pins ?? [],
    } as RawPart;
    normalisePart(stand_in, i, problems, { checkPins });
  });
  return { parts, refs: new Set(firstIndexOfRef.keys()) };
}

function readNets(
  raw: Loose,
  rawParts: unknown[],
): { nets: Record<string, NetInfo>; names: Set<string> } {
  const nets: Record<string, NetInfo> = {};
  const names = new Set<string>();
  if (isMap(raw.nets)) {
    for (const [name, rawNet] of Object.entries(raw.nets)) {
      if (!NET_NAME_PATTERN.test(name)) continue;
      names.add(name);
      const shaped = NetInput.safeParse(rawNet);
      if (shaped.success) nets[name] = normaliseNet(shaped.data);
    }
  }
  for (const rawPart of rawParts) {
    for (const name of pinNets(rawPart)) {
      names.add(name);
      nets[name] ??= normaliseNet({});
    }
  }
  return { nets, names };
}

function readMeasurements(
  raw: Loose,
  rated: Supply,
  known: KnownNames,
  problems: ProblemList,
): Measurement[] {
  const out: Measurement[] = [];
  if (!Array.isArray(raw.measurements)) return out;
  raw.measurements.forEach((rawM, i) => {
    const shaped = MeasurementInput.safeParse(rawM);
    if (shaped.success) {
      const m = normaliseMeasurement(shaped.data, i, rated, known, problems);
      if (m !== null) out.push(m);
      return;
    }
    const kept = salvage(rawM, MeasurementInput.shape, ["what", "value"]);
    if (kept !== null) normaliseMeasurement(kept as RawMeasurement, i, rated, known, problems);
  });
  return out;
}

function readSpacings(raw: Loose, known: KnownNames, problems: ProblemList): Spacing[] {
  const out: Spacing[] = [];
  const board = raw.board;
  if (!isMap(board) || !Array.isArray(board.spacings)) return out;
  board.spacings.forEach((rawS, i) => {
    const shaped = SpacingInput.safeParse(rawS);
    if (!shaped.success) return;
    const s = normaliseSpacing(shaped.data, i, known, problems);
    if (s !== null) out.push(s);
  });
  return out;
}

function stringOrNull(x: unknown): string | null {
  return typeof x === "string" ? x : null;
}

/** A copy of the raw tree without the unknown fields zod found (they are only warned about). */
function withoutUnknownFields(raw: unknown, issues: readonly z.core.$ZodIssue[]): unknown {
  const copy = structuredClone(raw) as unknown;
  for (const issue of issues) {
    if (issue.code !== "unrecognized_keys") continue;
    let node: unknown = copy;
    for (const seg of issue.path)
      node = isMap(node) || Array.isArray(node) ? (node as Loose)[seg as string] : undefined;
    if (isMap(node)) for (const key of issue.keys) delete node[key];
  }
  return copy;
}

/** Validates a raw record object and normalises it; all problems are reported at once. */
export function validateRawRecord(
  input: unknown,
  locator: SourceLocator,
  extra?: ProblemList,
): ParseResult {
  const problems = extra ?? new ProblemList(locator);
  let shape = RecordInput.safeParse(input, { reportInput: true });
  let raw = input;
  if (!shape.success) {
    reportSchemaIssues(shape.error.issues, [], problems);
    raw = withoutUnknownFields(input, shape.error.issues);
    if (shape.error.issues.every((i) => i.code === "unrecognized_keys"))
      shape = RecordInput.safeParse(raw);
  }
  if (!isMap(raw)) return { ok: false, errors: sortByPlace(problems.errors) };

  const rated = ratedSupply(raw, problems);
  const rawParts = Array.isArray(raw.parts) ? raw.parts : [];
  const { parts, refs } = readParts(raw, problems);
  const { nets, names } = readNets(raw, rawParts);
  const known: KnownNames = { nets: names, refs };
  const measurements = readMeasurements(raw, rated, known, problems);
  const spacings = readSpacings(raw, known, problems);

  if (!shape.success || problems.errors.length > 0) {
    return { ok: false, errors: sortByPlace(problems.errors) };
  }
  const data = shape.data;
  const record: TeardownRecord = {
    record: 1,
    title: data.title,
    summary: stringOrNull(data.summary),
    device: {
      category: stringOrNull(data.device?.category),
      rated_supply: rated,
      tags: [...(data.device?.tags ?? [])],
    },
    parts,
    nets,
    measurements,
    board: { spacings },
  };
  return { ok: true, record, warnings: sortByPlace(problems.warnings) };
}
