/**
 * A small structural differ for two boards' part lists, written for the demo test and
 * independent of the engine: it reads the record files with the plain YAML parser, flattens each
 * part into dotted leaf paths, maps renamed designators, and reports added, removed and changed
 * fields with their raw written values.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { parse } from "yaml";

export interface PartDiff {
  added: string[];
  removed: string[];
  changed: Array<{ ref: string; field: string; from: unknown; to: unknown }>;
}

type RawPart = Record<string, unknown> & { ref: string };

/** The parts of a record file as written (no normalisation). */
export function rawParts(recordsDir: string, file: string): RawPart[] {
  const doc = parse(readFileSync(path.join(recordsDir, file), "utf8")) as { parts: RawPart[] };
  return doc.parts;
}

function flatten(value: unknown, prefix: string, out: Map<string, unknown>): void {
  if (value !== null && typeof value === "object") {
    for (const [k, v] of Object.entries(value as Record<string, unknown>))
      flatten(v, prefix ? `${prefix}.${k}` : k, out);
  } else out.set(prefix, value);
}

function leaves(p: RawPart): Map<string, unknown> {
  const out = new Map<string, unknown>();
  for (const [k, v] of Object.entries(p)) if (k !== "ref") flatten(v, k, out);
  return out;
}

/** How board b's parts differ from board a's, after renaming a's designators by `renamed`. */
export function diffParts(a: RawPart[], b: RawPart[], renamed: Record<string, string>): PartDiff {
  const asB = new Map(a.map((p) => [renamed[p.ref] ?? p.ref, p]));
  const inB = new Map(b.map((p) => [p.ref, p]));
  const diff: PartDiff = { added: [], removed: [], changed: [] };
  for (const p of a) if (!inB.has(renamed[p.ref] ?? p.ref)) diff.removed.push(p.ref);
  for (const p of b) {
    const before = asB.get(p.ref);
    if (!before) {
      diff.added.push(p.ref);
      continue;
    }
    const x = leaves(before);
    const y = leaves(p);
    for (const field of new Set([...x.keys(), ...y.keys()]))
      if (x.get(field) !== y.get(field))
        diff.changed.push({ ref: p.ref, field, from: x.get(field), to: y.get(field) });
  }
  return diff;
}
