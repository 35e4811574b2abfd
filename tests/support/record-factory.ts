/**
 * Tiny factories for building normalised records in tests without going through the parser.
 * `part("R1", "resistor", ["L", "A"], 1e6)` gives a resistor between nets L and A.
 */
import type { NetInfo, Part, TeardownRecord } from "@teardown/engine";
import { pinRolesFor } from "@teardown/engine";

/** A part with pins given as a list (in the kind's pin order) or as a role map. */
export function part(
  ref: string,
  kind: string,
  pins: string[] | Record<string, string>,
  value: number | null = null,
  extra: Partial<Part> = {},
): Part {
  const polarised = extra.polarised ?? false;
  let pinMap: Record<string, string>;
  if (Array.isArray(pins)) {
    const roles = pinRolesFor(kind, polarised) ?? pins.map((_, i) => `p${i + 1}`);
    const names = roles.length >= pins.length ? roles : pins.map((_, i) => `p${i + 1}`);
    pinMap = Object.fromEntries(pins.map((net, i) => [names[i]!, net]));
  } else {
    pinMap = { ...pins };
  }
  return {
    ref,
    kind,
    value,
    value_text: value === null ? null : String(value),
    tolerance: null,
    rating: {},
    marking: null,
    polarised,
    closed: kind === "switch" ? true : false,
    model: {},
    note: null,
    ...extra,
    pins: pinMap,
  };
}

/** A record around the given parts; every net named by a pin gets default info, L/N get roles. */
export function record(
  parts: Part[],
  nets: Record<string, Partial<NetInfo>> = {},
  extra: Partial<TeardownRecord> = {},
): TeardownRecord {
  const allNets: Record<string, NetInfo> = {};
  const defaults = (name: string): NetInfo => ({
    role: name === "L" ? "line" : name === "N" ? "neutral" : null,
    accessible: false,
    note: null,
  });
  for (const p of parts) for (const net of Object.values(p.pins)) allNets[net] ??= defaults(net);
  for (const [name, info] of Object.entries(nets)) allNets[name] = { ...defaults(name), ...info };
  return {
    record: 1,
    title: "test record",
    summary: null,
    device: { category: null, rated_supply: { vrms: 230, hz: 50 }, tags: [] },
    parts,
    nets: allNets,
    measurements: [],
    board: { spacings: [] },
    ...extra,
  };
}
