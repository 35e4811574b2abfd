/**
 * What changed between two revisions of the same board, keyed by part ref (the name a person
 * gave each part on the board): parts added, removed and changed (value, kind, rating, marking,
 * connections...), nets whose role or accessibility changed, and measurements added, removed or
 * changed. Pure: two normalised records in, a plain description out.
 */
import type { Measurement, NetInfo, Part, TeardownRecord } from "@teardown/engine";

/** One field of one thing that changed, with both sides as they read in the record. */
export interface FieldChange {
  field: string;
  from: unknown;
  to: unknown;
}

/** A part as shown in a diff. */
export interface PartBrief {
  ref: string;
  kind: string;
  value: string | null;
  pins: Record<string, string>;
}

/** A pin that moved from one net to another (a null side: the pin did not exist there). */
export interface PinChange {
  pin: string;
  from: string | null;
  to: string | null;
}

export interface PartChange {
  ref: string;
  kind: string;
  changes: FieldChange[];
  /** Connections that changed, pin by pin; empty when only other fields changed. */
  pins: PinChange[];
}

/** A measurement as shown in a diff, with the key that identifies it across revisions. */
export interface MeasurementBrief {
  key: string;
  what: string;
  value: number;
}

export interface RevisionDiff {
  /** Top-level fields (title, summary, category, rated supply, tags) that changed. */
  record: FieldChange[];
  parts: { added: PartBrief[]; removed: PartBrief[]; changed: PartChange[] };
  nets: { added: string[]; removed: string[]; changed: { net: string; changes: FieldChange[] }[] };
  measurements: {
    added: MeasurementBrief[];
    removed: MeasurementBrief[];
    changed: { key: string; what: string; changes: FieldChange[] }[];
  };
  /** True when nothing at all differs. */
  same: boolean;
}

function same(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

function sorted<T>(o: Record<string, T>): Record<string, T> {
  return Object.fromEntries(Object.entries(o).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
}

function fieldChanges(pairs: [string, unknown, unknown][]): FieldChange[] {
  return pairs.filter(([, a, b]) => !same(a, b)).map(([field, from, to]) => ({ field, from, to }));
}

function valueText(p: Part): string | null {
  return p.value_text ?? (p.value === null ? null : String(p.value));
}

function brief(p: Part): PartBrief {
  return { ref: p.ref, kind: p.kind, value: valueText(p), pins: { ...p.pins } };
}

function partChange(a: Part, b: Part): PartChange | null {
  // A value written differently but meaning the same ("100n" and "0.1u") is not a change.
  const value: [string, unknown, unknown] =
    a.value !== null && a.value === b.value
      ? ["value", null, null]
      : ["value", valueText(a), valueText(b)];
  const changes = fieldChanges([
    ["kind", a.kind, b.kind],
    value,
    ["tolerance", a.tolerance, b.tolerance],
    [
      "rating",
      sorted(a.rating as Record<string, unknown>),
      sorted(b.rating as Record<string, unknown>),
    ],
    ["marking", a.marking, b.marking],
    ["polarised", a.polarised, b.polarised],
    ["closed", a.closed, b.closed],
    ["model", sorted(a.model), sorted(b.model)],
    ["note", a.note, b.note],
  ]);
  const pins: PinChange[] = [];
  for (const pin of new Set([...Object.keys(a.pins), ...Object.keys(b.pins)])) {
    const from = a.pins[pin] ?? null;
    const to = b.pins[pin] ?? null;
    if (from !== to) pins.push({ pin, from, to });
  }
  if (changes.length === 0 && pins.length === 0) return null;
  return { ref: b.ref, kind: b.kind, changes, pins };
}

function netChanges(a: NetInfo, b: NetInfo): FieldChange[] {
  return fieldChanges([
    ["role", a.role, b.role],
    ["accessible", a.accessible, b.accessible],
    ["note", a.note, b.note],
  ]);
}

/** What identifies a measurement across revisions: what was measured, where, at which supply. */
export function measurementKey(m: Measurement): string {
  const where = m.between !== null ? `${m.between[0]}-${m.between[1]}` : (m.part ?? "input");
  return `${m.what}@${where}@${m.supply.vrms}V/${m.supply.hz}Hz`;
}

function measurementBriefs(
  ms: Measurement[],
): Map<string, { m: Measurement; brief: MeasurementBrief }> {
  const out = new Map<string, { m: Measurement; brief: MeasurementBrief }>();
  const seen = new Map<string, number>();
  for (const m of ms) {
    // The same reading taken twice keeps both: the second gets an ordinal.
    const base = measurementKey(m);
    const n = (seen.get(base) ?? 0) + 1;
    seen.set(base, n);
    const key = n === 1 ? base : `${base}#${n}`;
    out.set(key, { m, brief: { key, what: m.what, value: m.value } });
  }
  return out;
}

/** The ref-keyed difference from revision `a` to revision `b`. */
export function diffRevisions(a: TeardownRecord, b: TeardownRecord): RevisionDiff {
  const record = fieldChanges([
    ["title", a.title, b.title],
    ["summary", a.summary, b.summary],
    ["category", a.device.category, b.device.category],
    ["rated_supply", a.device.rated_supply, b.device.rated_supply],
    ["tags", a.device.tags, b.device.tags],
  ]);

  const partsA = new Map(a.parts.map((p) => [p.ref, p]));
  const partsB = new Map(b.parts.map((p) => [p.ref, p]));
  const parts: RevisionDiff["parts"] = { added: [], removed: [], changed: [] };
  for (const p of b.parts) if (!partsA.has(p.ref)) parts.added.push(brief(p));
  for (const p of a.parts) if (!partsB.has(p.ref)) parts.removed.push(brief(p));
  for (const p of b.parts) {
    const old = partsA.get(p.ref);
    const change = old ? partChange(old, p) : null;
    if (change) parts.changed.push(change);
  }

  const nets: RevisionDiff["nets"] = { added: [], removed: [], changed: [] };
  for (const name of Object.keys(b.nets)) if (!(name in a.nets)) nets.added.push(name);
  for (const name of Object.keys(a.nets)) if (!(name in b.nets)) nets.removed.push(name);
  for (const [name, info] of Object.entries(b.nets)) {
    const old = a.nets[name];
    const changes = old ? netChanges(old, info) : [];
    if (changes.length > 0) nets.changed.push({ net: name, changes });
  }

  const ma = measurementBriefs(a.measurements);
  const mb = measurementBriefs(b.measurements);
  const measurements: RevisionDiff["measurements"] = { added: [], removed: [], changed: [] };
  for (const [key, { brief: mbBrief }] of mb) if (!ma.has(key)) measurements.added.push(mbBrief);
  for (const [key, { brief: maBrief }] of ma) if (!mb.has(key)) measurements.removed.push(maBrief);
  for (const [key, { m }] of mb) {
    const old = ma.get(key)?.m;
    if (!old) continue;
    const changes = fieldChanges([
      ["value", old.value, m.value],
      ["uncertainty", old.uncertainty, m.uncertainty],
      ["instrument", old.instrument, m.instrument],
    ]);
    if (changes.length > 0) measurements.changed.push({ key, what: m.what, changes });
  }

  const sameAll =
    record.length === 0 &&
    parts.added.length + parts.removed.length + parts.changed.length === 0 &&
    nets.added.length + nets.removed.length + nets.changed.length === 0 &&
    measurements.added.length + measurements.removed.length + measurements.changed.length === 0;
  return { record, parts, nets, measurements, same: sameAll };
}
