/**
 * Two circuits on one pair of mains nets: the second record's refs and nets get a suffix, except
 * its line and neutral nets, which become the first record's. Block recognition must find in
 * the merged board what it finds in each circuit alone (other branches on the same nets change
 * nothing about what a branch is).
 */
import type { TeardownRecord } from "@teardown/engine";
import { renameRecord } from "./rename-record.js";

/** The mains net names a record declares, by role. */
function mainsNets(rec: TeardownRecord): { line: string[]; neutral: string[] } {
  const byRole = (role: string): string[] =>
    Object.entries(rec.nets)
      .filter(([, info]) => info.role === role)
      .map(([name]) => name)
      .sort();
  return { line: byRole("line"), neutral: byRole("neutral") };
}

/** `b`'s part and net names as they appear in the merged board. */
export function mergedNames(
  a: TeardownRecord,
  b: TeardownRecord,
  tag: string,
): { refOf: (ref: string) => string; netOf: (net: string) => string } {
  const ma = mainsNets(a);
  const mb = mainsNets(b);
  const netOf = (net: string): string => {
    const li = mb.line.indexOf(net);
    if (li >= 0 && ma.line[0] !== undefined) return ma.line[0];
    const ni = mb.neutral.indexOf(net);
    if (ni >= 0 && ma.neutral[0] !== undefined) return ma.neutral[0];
    return `${net}_${tag}`;
  };
  return { refOf: (ref) => `${ref}_${tag}`, netOf };
}

/** `a` with `b` hung on the same line and neutral nets (see the file comment). */
export function mergeRecords(a: TeardownRecord, b: TeardownRecord, tag: string): TeardownRecord {
  const { refOf, netOf } = mergedNames(a, b, tag);
  const moved = renameRecord(b, refOf, netOf);
  return {
    ...a,
    parts: [...a.parts, ...moved.parts],
    nets: { ...moved.nets, ...a.nets },
    measurements: [...a.measurements, ...moved.measurements],
  };
}
