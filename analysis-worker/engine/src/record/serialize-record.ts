/**
 * Writing a normalised record back in the record format (YAML or JSON), preferring each
 * value's own text, so that parseRecord(serializeRecord(r)) gives r again. Defaults that the
 * reader fills in (a measurement at the rated supply, a net with no info) are left out.
 */
import { stringify } from "yaml";
import { kindInfo, pinRolesFor } from "../graph/kinds.js";
import { exactValueText } from "../values/format-value.js";
import { parseValue } from "../values/parse-value.js";
import { percentText } from "../values/parse-tolerance.js";
import type { Measurement, NetInfo, Part, Spacing, Supply, TeardownRecord } from "./types.js";

type Out = Record<string, unknown>;

function valueField(part: Part): string | number | undefined {
  if (part.value_text !== null) {
    if (part.value === null) return part.value_text;
    const info = kindInfo(part.kind);
    const read = parseValue(part.value_text, { unit: info === null ? "any" : (info.unit ?? "1") });
    if (read.ok && read.value === part.value) return part.value_text;
  }
  return part.value === null ? undefined : exactValueText(part.value);
}

function pinsField(part: Part): string[] | Record<string, string> {
  const roles = pinRolesFor(part.kind, part.polarised);
  const keys = Object.keys(part.pins);
  // list form when it reads back to the same role map: the kind's roles, all of them, in order
  if (
    roles !== null &&
    roles.length > 1 &&
    keys.length === roles.length &&
    keys.every((k, i) => k === roles[i])
  ) {
    return keys.map((k) => part.pins[k]!);
  }
  return { ...part.pins };
}

function partOut(part: Part): Out {
  const out: Out = { ref: part.ref, kind: part.kind };
  const value = valueField(part);
  if (value !== undefined) out.value = value;
  if (part.tolerance !== null) out.tolerance = percentText(part.tolerance) ?? part.tolerance;
  if (Object.keys(part.rating).length > 0) out.rating = { ...part.rating };
  if (part.marking !== null) out.marking = part.marking;
  if (part.polarised) out.polarised = true;
  if (part.kind === "switch") out.closed = part.closed;
  out.pins = pinsField(part);
  if (Object.keys(part.model).length > 0) out.model = { ...part.model };
  if (part.note !== null) out.note = part.note;
  return out;
}

function netOut(info: NetInfo): Out {
  const out: Out = {};
  if (info.role !== null) out.role = info.role;
  if (info.accessible) out.accessible = true;
  if (info.note !== null) out.note = info.note;
  return out;
}

function sameSupply(a: Supply, b: Supply): boolean {
  return a.vrms === b.vrms && a.hz === b.hz;
}

function measurementOut(m: Measurement, rated: Supply): Out {
  const out: Out = { what: m.what, value: m.value };
  if (m.between !== null) out.between = [...m.between];
  if (m.part !== null) out.part = m.part;
  if (!sameSupply(m.supply, rated)) out.supply = { ...m.supply };
  if (m.instrument !== null) out.instrument = m.instrument;
  if (m.uncertainty !== null) {
    out.uncertainty =
      "relative" in m.uncertainty
        ? (percentText(m.uncertainty.relative) ?? `${m.uncertainty.relative * 100}%`)
        : m.uncertainty.absolute;
  }
  return out;
}

function spacingOut(s: Spacing): Out {
  const out: Out = { between: [...s.between] };
  if (s.creepage_mm !== null) out.creepage_mm = s.creepage_mm;
  if (s.clearance_mm !== null) out.clearance_mm = s.clearance_mm;
  if (s.slot) out.slot = true;
  out.material_group = s.material_group;
  out.pollution_degree = s.pollution_degree;
  return out;
}

/** The record as a plain object in the record file's shape. */
export function recordToRaw(record: TeardownRecord): Out {
  const onPins = new Set(record.parts.flatMap((p) => Object.values(p.pins)));
  const nets: Out = {};
  for (const [name, info] of Object.entries(record.nets)) {
    const out = netOut(info);
    if (Object.keys(out).length > 0 || !onPins.has(name)) nets[name] = out;
  }
  const device: Out = {};
  if (record.device.category !== null) device.category = record.device.category;
  device.rated_supply = { ...record.device.rated_supply };
  if (record.device.tags.length > 0) device.tags = [...record.device.tags];
  const out: Out = { record: 1, title: record.title };
  if (record.summary !== null) out.summary = record.summary;
  out.device = device;
  out.parts = record.parts.map(partOut);
  if (Object.keys(nets).length > 0) out.nets = nets;
  if (record.measurements.length > 0)
    out.measurements = record.measurements.map((m) =>
      measurementOut(m, record.device.rated_supply),
    );
  if (record.board.spacings.length > 0)
    out.board = { spacings: record.board.spacings.map(spacingOut) };
  return out;
}

/** Writes a normalised record as record-format text that reads back to the same record. */
export function serializeRecord(record: TeardownRecord, format: "yaml" | "json"): string {
  const raw = recordToRaw(record);
  if (format === "json") return `${JSON.stringify(raw, null, 2)}\n`;
  return stringify(raw, { lineWidth: 0, aliasDuplicateObjects: false });
}
