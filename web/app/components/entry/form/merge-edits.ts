/**
 * Re-applying one person's edits on a newer revision (after a 409 stale save): a three-way
 * merge of record documents. What the editor changed from their base wins where the newer
 * revision left that thing alone; where both changed the same thing, the editor's version is
 * kept and the place is reported so they can look before saving. Parts are matched by ref,
 * nets by name, measurements by what/where/supply, spacings by their net pair.
 */
import { documentFromForm, formFromDocument } from "./form-state";

type Obj = Record<string, unknown>;

/** The outcome of a merge: the document to edit on, and where both sides changed the same thing. */
export interface MergeOutcome {
  merged: Obj;
  conflicts: string[];
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);
const obj = (x: unknown): Obj =>
  x !== null && typeof x === "object" && !Array.isArray(x) ? (x as Obj) : {};
const list = (x: unknown): Obj[] => (Array.isArray(x) ? x.map(obj) : []);

// A document as the form writes it, so that formatting differences are not taken for edits.
function canonical(doc: unknown): Obj {
  return documentFromForm(formFromDocument(doc));
}

function pick(
  base: unknown,
  mine: unknown,
  theirs: unknown,
  label: string,
  conflicts: string[],
): unknown {
  if (same(mine, base)) return theirs;
  if (same(theirs, base) || same(mine, theirs)) return mine;
  conflicts.push(label);
  return mine;
}

function keyed(items: Obj[], keyOf: (o: Obj) => string): Map<string, Obj> {
  const out = new Map<string, Obj>();
  const seen = new Map<string, number>();
  for (const item of items) {
    const base = keyOf(item);
    const n = (seen.get(base) ?? 0) + 1;
    seen.set(base, n);
    out.set(n === 1 ? base : `${base}#${n}`, item);
  }
  return out;
}

function mergeKeyed(
  base: Obj[],
  mine: Obj[],
  theirs: Obj[],
  keyOf: (o: Obj) => string,
  label: (k: string) => string,
  conflicts: string[],
): Obj[] {
  const b = keyed(base, keyOf);
  const m = keyed(mine, keyOf);
  const t = keyed(theirs, keyOf);
  // Their order first, then what only the editor added, in the editor's order.
  const keys = [...t.keys(), ...[...m.keys()].filter((k) => !t.has(k))];
  const out: Obj[] = [];
  for (const k of keys) {
    const chosen = pick(b.get(k), m.get(k), t.get(k), label(k), conflicts);
    if (chosen !== undefined) out.push(chosen as Obj);
  }
  return out;
}

const measurementKey = (m: Obj) =>
  JSON.stringify([m.what, m.between ?? null, m.part ?? null, m.supply ?? null]);
const spacingKey = (s: Obj) =>
  JSON.stringify(Array.isArray(s.between) ? [...(s.between as unknown[])].map(String).sort() : []);

/** The editor's changes from `baseDoc` to `mineDoc`, replayed on `theirsDoc`. */
export function mergeEdits(baseDoc: unknown, mineDoc: unknown, theirsDoc: unknown): MergeOutcome {
  const base = canonical(baseDoc);
  const mine = canonical(mineDoc);
  const theirs = canonical(theirsDoc);
  const conflicts: string[] = [];
  const merged: Obj = { record: 1 };
  for (const field of ["title", "summary"]) {
    const v = pick(base[field], mine[field], theirs[field], field, conflicts);
    if (v !== undefined) merged[field] = v;
  }
  const [bd, md, td] = [obj(base.device), obj(mine.device), obj(theirs.device)];
  const device: Obj = {};
  for (const field of ["category", "rated_supply", "tags"]) {
    const v = pick(bd[field], md[field], td[field], `device ${field}`, conflicts);
    if (v !== undefined) device[field] = v;
  }
  merged.device = device;
  merged.parts = mergeKeyed(
    list(base.parts),
    list(mine.parts),
    list(theirs.parts),
    (p) => String(p.ref),
    (k) => `part ${k}`,
    conflicts,
  );
  const [bn, mn, tn] = [obj(base.nets), obj(mine.nets), obj(theirs.nets)];
  const nets: Obj = {};
  for (const name of new Set([...Object.keys(tn), ...Object.keys(mn)])) {
    const v = pick(bn[name], mn[name], tn[name], `net ${name}`, conflicts);
    if (v !== undefined) nets[name] = v;
  }
  if (Object.keys(nets).length > 0) merged.nets = nets;
  const measurements = mergeKeyed(
    list(base.measurements),
    list(mine.measurements),
    list(theirs.measurements),
    measurementKey,
    (k) => `measurement ${JSON.parse(k.split("#")[0]!)[0]}`,
    conflicts,
  );
  if (measurements.length > 0) merged.measurements = measurements;
  const spacings = mergeKeyed(
    list(obj(base.board).spacings),
    list(obj(mine.board).spacings),
    list(obj(theirs.board).spacings),
    spacingKey,
    (k) => `spacing ${(JSON.parse(k.split("#")[0]!) as string[]).join("–")}`,
    conflicts,
  );
  if (spacings.length > 0) merged.board = { spacings };
  return { merged, conflicts };
}
