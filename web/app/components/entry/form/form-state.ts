/**
 * The form editor's state: a teardown record as rows of text fields, so half-typed values stay
 * as typed. It comes from a stored record document and goes back to a record document, which
 * the engine's parseRecord then judges (nothing is validated here).
 */
import {
  KINDS,
  MEASUREMENT_KINDS,
  kindInfo,
  pinRolesFor,
  type MeasurementKind,
} from "@teardown/engine";

/** One pin of a part: its role and the net it goes to. */
export interface PinField {
  role: string;
  net: string;
}

export interface PartRow {
  /** Stable React key; not part of the record. */
  key: string;
  ref: string;
  kind: string;
  value: string;
  tolerance: string;
  volts: string;
  amps: string;
  watts: string;
  ratingClass: string;
  ratingPackage: string;
  surgeAmps: string;
  marking: string;
  polarised: boolean;
  closed: boolean;
  pins: PinField[];
  /** `name=value` pairs separated by spaces or commas. */
  model: string;
  note: string;
}

export interface NetRow {
  key: string;
  name: string;
  role: string;
  accessible: boolean;
  note: string;
}

export interface MeasurementRow {
  key: string;
  what: MeasurementKind;
  value: string;
  from: string;
  to: string;
  part: string;
  vrms: string;
  hz: string;
  instrument: string;
  uncertainty: string;
}

export interface SpacingRow {
  key: string;
  a: string;
  b: string;
  creepage: string;
  clearance: string;
  slot: boolean;
  materialGroup: string;
  pollutionDegree: string;
}

export interface FormState {
  title: string;
  summary: string;
  category: string;
  vrms: string;
  hz: string;
  tags: string;
  parts: PartRow[];
  nets: NetRow[];
  measurements: MeasurementRow[];
  spacings: SpacingRow[];
}

let keySeq = 0;
/** A fresh row key. */
export function rowKey(): string {
  keySeq += 1;
  return `row${keySeq}`;
}

type Obj = Record<string, unknown>;
const obj = (x: unknown): Obj =>
  x !== null && typeof x === "object" && !Array.isArray(x) ? (x as Obj) : {};
const text = (x: unknown): string => (x === null || x === undefined ? "" : String(x));

/** The pin roles the form shows for a kind: the engine's table, or free pins for other kinds. */
export function rolesFor(kind: string, polarised: boolean, count: number): string[] {
  const info = kindInfo(kind);
  if (info !== null && !info.variadic) return [...(pinRolesFor(kind, polarised) ?? info.pins)];
  const n = Math.max(1, count);
  return Array.from({ length: n }, (_, i) => `p${i + 1}`);
}

/** Pins re-fitted to a (new) kind: nets kept by position. */
export function refitPins(pins: PinField[], kind: string, polarised: boolean): PinField[] {
  const roles = rolesFor(kind, polarised, pins.length);
  return roles.map((role, i) => ({
    role,
    net: pins.find((p) => p.role === role)?.net ?? pins[i]?.net ?? "",
  }));
}

/** An empty part row of a kind. */
export function newPart(kind = "resistor", ref = ""): PartRow {
  return {
    key: rowKey(),
    ref,
    kind,
    value: "",
    tolerance: "",
    volts: "",
    amps: "",
    watts: "",
    ratingClass: "",
    ratingPackage: "",
    surgeAmps: "",
    marking: "",
    polarised: false,
    closed: kind === "switch",
    pins: refitPins([], kind, false),
    model: "",
    note: "",
  };
}

/** An empty net row. */
export function newNet(name = ""): NetRow {
  return { key: rowKey(), name, role: "", accessible: false, note: "" };
}

/** An empty measurement row. */
export function newMeasurement(): MeasurementRow {
  return {
    key: rowKey(),
    what: "input.current_rms",
    value: "",
    from: "",
    to: "",
    part: "",
    vrms: "",
    hz: "",
    instrument: "",
    uncertainty: "",
  };
}

/** An empty spacing row. */
export function newSpacing(): SpacingRow {
  return {
    key: rowKey(),
    a: "",
    b: "",
    creepage: "",
    clearance: "",
    slot: false,
    materialGroup: "",
    pollutionDegree: "",
  };
}

/** A blank teardown for the new-entry form. */
export function emptyForm(): FormState {
  return {
    title: "",
    summary: "",
    category: "",
    vrms: "230",
    hz: "50",
    tags: "",
    parts: [newPart("resistor", "R1")],
    nets: [],
    measurements: [],
    spacings: [],
  };
}

function pinsFrom(kind: string, polarised: boolean, raw: unknown): PinField[] {
  if (Array.isArray(raw)) {
    const roles = rolesFor(kind, polarised, raw.length);
    return raw.map((net, i) => ({ role: roles[i] ?? `p${i + 1}`, net: text(net) }));
  }
  const given = Object.entries(obj(raw)).map(([role, net]) => ({ role, net: text(net) }));
  const info = kindInfo(kind);
  return info !== null && !info.variadic ? refitPins(given, kind, polarised) : given;
}

function partFrom(raw: Obj): PartRow {
  const rating = obj(raw.rating);
  const kind = text(raw.kind);
  const polarised = raw.polarised === true;
  return {
    key: rowKey(),
    ref: text(raw.ref),
    kind,
    value: text(raw.value),
    tolerance: text(raw.tolerance),
    volts: text(rating.volts),
    amps: text(rating.amps),
    watts: text(rating.watts),
    ratingClass: text(rating.class),
    ratingPackage: text(rating.package),
    surgeAmps: text(rating.surge_amps),
    marking: text(raw.marking),
    polarised,
    closed: raw.closed === true,
    pins: pinsFrom(kind, polarised, raw.pins),
    model: Object.entries(obj(raw.model))
      .map(([k, v]) => `${k}=${text(v)}`)
      .join(" "),
    note: text(raw.note),
  };
}

function measurementFrom(raw: Obj): MeasurementRow {
  const between = Array.isArray(raw.between) ? raw.between : [];
  const supply = obj(raw.supply);
  const what = (MEASUREMENT_KINDS as readonly string[]).includes(text(raw.what))
    ? (raw.what as MeasurementKind)
    : "input.current_rms";
  return {
    key: rowKey(),
    what,
    value: text(raw.value),
    from: text(between[0]),
    to: text(between[1]),
    part: text(raw.part),
    vrms: text(supply.vrms),
    hz: text(supply.hz),
    instrument: text(raw.instrument),
    uncertainty: text(raw.uncertainty),
  };
}

function spacingFrom(raw: Obj): SpacingRow {
  const between = Array.isArray(raw.between) ? raw.between : [];
  return {
    key: rowKey(),
    a: text(between[0]),
    b: text(between[1]),
    creepage: text(raw.creepage_mm),
    clearance: text(raw.clearance_mm),
    slot: raw.slot === true,
    materialGroup: text(raw.material_group),
    pollutionDegree: text(raw.pollution_degree),
  };
}

/** The form state of a stored record document (the shape `serializeRecord` writes). */
export function formFromDocument(doc: unknown): FormState {
  const d = obj(doc);
  const device = obj(d.device);
  const supply = obj(device.rated_supply);
  const board = obj(d.board);
  return {
    title: text(d.title),
    summary: text(d.summary),
    category: text(device.category),
    vrms: text(supply.vrms ?? 230),
    hz: text(supply.hz ?? 50),
    tags: Array.isArray(device.tags) ? device.tags.map(text).join(", ") : "",
    parts: (Array.isArray(d.parts) ? d.parts : []).map((p) => partFrom(obj(p))),
    nets: Object.entries(obj(d.nets)).map(([name, info]) => {
      const i = obj(info);
      return {
        key: rowKey(),
        name,
        role: text(i.role),
        accessible: i.accessible === true,
        note: text(i.note),
      };
    }),
    measurements: (Array.isArray(d.measurements) ? d.measurements : []).map((m) =>
      measurementFrom(obj(m)),
    ),
    spacings: (Array.isArray(board.spacings) ? board.spacings : []).map((s) => spacingFrom(obj(s))),
  };
}

// A text field that reads as a number is sent as one (spacings must be numbers; others accept both).
function numberOrText(s: string): number | string {
  const t = s.trim();
  return t !== "" && Number.isFinite(Number(t)) ? Number(t) : t;
}

function put(out: Obj, key: string, s: string, asNumber = false): void {
  if (s.trim() !== "") out[key] = asNumber ? numberOrText(s) : s.trim();
}

/** `vgt=0.7 igt=50u` as a model map (a pair without `=` gets an empty value, which the engine names). */
export function parseModelText(s: string): Obj {
  const out: Obj = {};
  for (const token of s.split(/[\s,;]+/).filter((t) => t !== "")) {
    const at = token.indexOf("=");
    if (at < 0) out[token] = "";
    else out[token.slice(0, at)] = token.slice(at + 1);
  }
  return out;
}

function partDocument(p: PartRow): Obj {
  const out: Obj = { ref: p.ref.trim(), kind: p.kind.trim() };
  put(out, "value", p.value);
  put(out, "tolerance", p.tolerance);
  const rating: Obj = {};
  put(rating, "volts", p.volts);
  put(rating, "amps", p.amps);
  put(rating, "watts", p.watts);
  put(rating, "class", p.ratingClass);
  put(rating, "package", p.ratingPackage);
  put(rating, "surge_amps", p.surgeAmps);
  if (Object.keys(rating).length > 0) out.rating = rating;
  put(out, "marking", p.marking);
  if (p.kind === "capacitor" && p.polarised) out.polarised = true;
  if (p.kind === "switch") out.closed = p.closed;
  const pins: Obj = {};
  for (const pin of p.pins) if (pin.net.trim() !== "") pins[pin.role] = pin.net.trim();
  out.pins =
    kindInfo(p.kind) === null ? p.pins.map((pin) => pin.net.trim()).filter((n) => n !== "") : pins;
  const model = parseModelText(p.model);
  if (Object.keys(model).length > 0) out.model = model;
  put(out, "note", p.note);
  return out;
}

function measurementDocument(m: MeasurementRow): Obj {
  const out: Obj = { what: m.what, value: m.value.trim() };
  if (m.what.startsWith("voltage.")) out.between = [m.from.trim(), m.to.trim()];
  if (m.what.startsWith("part.")) out.part = m.part.trim();
  if (m.vrms.trim() !== "" || m.hz.trim() !== "")
    out.supply = { vrms: m.vrms.trim(), hz: m.hz.trim() };
  put(out, "instrument", m.instrument);
  put(out, "uncertainty", m.uncertainty);
  return out;
}

function spacingDocument(s: SpacingRow): Obj {
  const out: Obj = { between: [s.a.trim(), s.b.trim()] };
  put(out, "creepage_mm", s.creepage, true);
  put(out, "clearance_mm", s.clearance, true);
  if (s.slot) out.slot = true;
  put(out, "material_group", s.materialGroup);
  put(out, "pollution_degree", s.pollutionDegree, true);
  return out;
}

/** The record document the form stands for, in the record file's shape. */
export function documentFromForm(f: FormState): Obj {
  const device: Obj = { rated_supply: { vrms: f.vrms.trim(), hz: f.hz.trim() } };
  put(device, "category", f.category);
  const tags = f.tags
    .split(",")
    .map((t) => t.trim())
    .filter((t) => t !== "");
  if (tags.length > 0) device.tags = tags;
  const doc: Obj = { record: 1, title: f.title };
  if (f.summary.trim() !== "") doc.summary = f.summary;
  doc.device = device;
  doc.parts = f.parts.map(partDocument);
  const nets: Obj = {};
  for (const n of f.nets) {
    if (n.name.trim() === "") continue;
    const info: Obj = {};
    if (n.role !== "") info.role = n.role;
    if (n.accessible) info.accessible = true;
    put(info, "note", n.note);
    nets[n.name.trim()] = info;
  }
  if (Object.keys(nets).length > 0) doc.nets = nets;
  if (f.measurements.length > 0) doc.measurements = f.measurements.map(measurementDocument);
  if (f.spacings.length > 0) doc.board = { spacings: f.spacings.map(spacingDocument) };
  return doc;
}

/** Every net name the form mentions: pins, nets rows, measurements and spacings, in first-seen order. */
export function netNames(f: FormState): string[] {
  const seen = new Set<string>();
  const add = (n: string) => {
    const t = n.trim();
    if (t !== "") seen.add(t);
  };
  for (const p of f.parts) for (const pin of p.pins) add(pin.net);
  for (const n of f.nets) add(n.name);
  return [...seen];
}

/** The unit a kind's value is in, for placeholders ("Ω", "F"...), or null. */
export function valueUnit(kind: string): string | null {
  return kindInfo(kind)?.unit ?? null;
}

/** The known kinds, for the kind picker. */
export const KIND_NAMES = Object.keys(KINDS);
