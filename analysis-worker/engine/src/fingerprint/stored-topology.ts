/**
 * The circuit's structure alone (parts' refs, kinds, polarity and pins; nets' roles), stored with
 * an entry so fragment search can confirm a candidate without reading and validating the whole
 * record again (that costs milliseconds per entry; this is a JSON read). Values, ratings and
 * notes are left out because fragment matching does not look at them.
 */
import { NET_ROLES, type NetRole, type TeardownRecord } from "../record/types.js";

/** One part's structure. */
export interface TopologyPart {
  ref: string;
  kind: string;
  polarised: boolean;
  pins: Record<string, string>;
}

/** A record's structure as stored in the entry's `topology` column. */
export interface StoredTopology {
  parts: TopologyPart[];
  nets: Record<string, NetRole | null>;
}

/** The structure of a validated record. */
export function topologyOf(record: TeardownRecord): StoredTopology {
  return {
    parts: record.parts.map((p) => ({
      ref: p.ref,
      kind: p.kind,
      polarised: p.polarised,
      pins: { ...p.pins },
    })),
    nets: Object.fromEntries(Object.entries(record.nets).map(([name, n]) => [name, n.role])),
  };
}

const isMap = (v: unknown): v is Record<string, unknown> =>
  typeof v === "object" && v !== null && !Array.isArray(v);

/**
 * A record holding only the stored structure (every other field empty), for matching; null when
 * the stored value does not have the shape topologyOf writes (checked, since it is read back
 * from the database).
 */
export function recordFromTopology(stored: unknown): TeardownRecord | null {
  if (!isMap(stored) || !Array.isArray(stored.parts) || !isMap(stored.nets)) return null;
  const parts: TeardownRecord["parts"] = [];
  for (const p of stored.parts) {
    if (!isMap(p) || typeof p.ref !== "string" || typeof p.kind !== "string") return null;
    if (typeof p.polarised !== "boolean" || !isMap(p.pins)) return null;
    const pins: Record<string, string> = {};
    for (const [role, net] of Object.entries(p.pins)) {
      if (typeof net !== "string") return null;
      pins[role] = net;
    }
    parts.push({
      ref: p.ref,
      kind: p.kind,
      value: null,
      value_text: null,
      tolerance: null,
      rating: {},
      marking: null,
      polarised: p.polarised,
      closed: false,
      model: {},
      pins,
      note: null,
    });
  }
  const nets: TeardownRecord["nets"] = {};
  for (const [name, role] of Object.entries(stored.nets)) {
    if (role !== null && !(NET_ROLES as readonly unknown[]).includes(role)) return null;
    nets[name] = { role: role as NetRole | null, accessible: false, note: null };
  }
  return {
    record: 1,
    title: "",
    summary: null,
    device: { category: null, rated_supply: { vrms: 0, hz: 0 }, tags: [] },
    parts,
    nets,
    measurements: [],
    board: { spacings: [] },
  };
}
