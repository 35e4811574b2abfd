/**
 * The records the layout checks run over: the layout's own circuits, plus every record of the
 * shared test-circuit library (tests/support/circuits, `ALL_TEST_CIRCUITS`) when it is there.
 * The library is loaded by a computed path so this file still compiles and runs before it exists.
 */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { readCircuitFile, type TeardownRecord } from "@teardown/engine";
import { projectRoot } from "@teardown/db";
import { LAYOUT_CIRCUITS, type NamedRecord } from "./layout-circuits.js";

/** Every demo record (seed-demo/records), named by its file, in file-name order. */
export function demoCircuits(): NamedRecord[] {
  const dir = path.join(projectRoot(), "seed-demo", "records");
  return readdirSync(dir)
    .filter((f) => f.endsWith(".yaml"))
    .sort()
    .map((f) => {
      const parsed = readCircuitFile(readFileSync(path.join(dir, f), "utf8"), { filename: f });
      if (!parsed.ok) throw new Error(`${f}: ${parsed.errors[0]?.message}`);
      return { name: f, record: parsed.record };
    });
}

function isRecord(value: unknown): value is TeardownRecord {
  const v = value as Partial<TeardownRecord> | null;
  return (
    typeof v === "object" && v !== null && Array.isArray(v.parts) && typeof v.nets === "object"
  );
}

/** Accepts a library entry that is a record, or holds one under `record` (named or not). */
function named(entry: unknown, index: number): NamedRecord | null {
  if (isRecord(entry)) return { name: `library #${index}: ${entry.title}`, record: entry };
  const e = entry as { name?: unknown; title?: unknown; record?: unknown } | null;
  if (typeof e === "object" && e !== null && isRecord(e.record)) {
    const label =
      typeof e.name === "string" ? e.name : typeof e.title === "string" ? e.title : e.record.title;
    return { name: `library: ${label}`, record: e.record };
  }
  return null;
}

/** The shared library's records, or an empty list while it does not exist yet. */
export async function libraryCircuits(): Promise<NamedRecord[]> {
  const where = ["..", "..", "support", "circuits", "index.js"].join("/");
  let mod: { ALL_TEST_CIRCUITS?: unknown };
  try {
    mod = (await import(/* @vite-ignore */ where)) as { ALL_TEST_CIRCUITS?: unknown };
  } catch {
    return [];
  }
  const list = mod.ALL_TEST_CIRCUITS;
  const entries = Array.isArray(list)
    ? list
    : typeof list === "object" && list !== null
      ? Object.values(list)
      : [];
  return entries.map(named).filter((n): n is NamedRecord => n !== null);
}

/** Our circuits followed by the library's. */
export async function allLayoutCircuits(): Promise<NamedRecord[]> {
  return [...LAYOUT_CIRCUITS, ...(await libraryCircuits())];
}
