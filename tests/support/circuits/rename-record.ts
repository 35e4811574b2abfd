/**
 * Copies of a record with new refs, new net names and the parts in another order, for tests
 * that check results do not depend on names or order. Net roles and everything else are kept.
 */
import type { TeardownRecord } from "@teardown/engine";

/** A renamed and reordered copy; maps default to the identity, order to the record's order. */
export function renameRecord(
  rec: TeardownRecord,
  refOf: (ref: string) => string,
  netOf: (net: string) => string,
  order: readonly number[] = rec.parts.map((_, i) => i),
): TeardownRecord {
  const parts = order.map((i) => {
    const p = rec.parts[i]!;
    return {
      ...p,
      ref: refOf(p.ref),
      pins: Object.fromEntries(Object.entries(p.pins).map(([role, net]) => [role, netOf(net)])),
    };
  });
  const nets = Object.fromEntries(
    Object.entries(rec.nets).map(([name, info]) => [netOf(name), { ...info }]),
  );
  const measurements = rec.measurements.map((m) => ({
    ...m,
    between:
      m.between === null ? null : ([netOf(m.between[0]), netOf(m.between[1])] as [string, string]),
    part: m.part === null ? null : refOf(m.part),
  }));
  return { ...rec, parts, nets, measurements };
}

/** Refs and net names of a record, sorted, for building renaming maps. */
export function namesOf(rec: TeardownRecord): { refs: string[]; nets: string[] } {
  return { refs: rec.parts.map((p) => p.ref).sort(), nets: Object.keys(rec.nets).sort() };
}
