/**
 * The normalised teardown record: what `parseRecord` returns once the text (YAML or JSON) has
 * been validated. Values are plain SI numbers; the original text of each value is kept beside
 * it for display and round trips. See docs/teardown-record.md.
 */

/** A mains supply: RMS volts and hertz. */
export interface Supply {
  vrms: number;
  hz: number;
}

/** Kinds the engine simulates or documents. Any other kind is kept as `UnknownKind`. */
export const KNOWN_KINDS = [
  "resistor",
  "capacitor",
  "inductor",
  "diode",
  "zener",
  "led",
  "thyristor",
  "triac",
  "transformer",
  "fuse",
  "varistor",
  "load",
  "switch",
  "connector",
  "testpoint",
] as const;
export type KnownKind = (typeof KNOWN_KINDS)[number];

/**
 * A net's name, branded where the engine keys maps and lists by it (the solver's nodes, the
 * graph's adjacency), so a part's ref cannot be passed where a net is meant, nor the other way.
 * The record itself holds plain strings; stages brand them where they build their own maps.
 */
export type NetName = string & { readonly __brand: "NetName" };
/** A part's reference designator, branded like `NetName`. */
export type PartRef = string & { readonly __brand: "PartRef" };

/** Ratings as printed or taken from a datasheet; every field optional. */
export interface Rating {
  volts?: number;
  amps?: number;
  watts?: number;
  /** Safety class of a capacitor (X1, X2, Y1, Y2, ...). */
  class?: string;
  /** Package or power class, used for default resistor voltage limits (e.g. "0805", "CFR-25"). */
  package?: string;
  /** Non-repetitive surge current (A), e.g. a rectifier's I_FSM. */
  surge_amps?: number;
}

export interface PartFields {
  ref: string;
  /** The main value in the kind's unit (ohm, farad, henry, volt, amp), or null when none. */
  value: number | null;
  /** The value as written in the record, for display and export. */
  value_text: string | null;
  /** Relative tolerance (0.1 for 10%), or null when not stated. */
  tolerance: number | null;
  rating: Rating;
  marking: string | null;
  /** Capacitors only: true when polarised (pins plus/minus). */
  polarised: boolean;
  /** Switches only: true when closed. */
  closed: boolean;
  /** Numeric model parameters (vgt, igt, is, n, lp, ratio, ...), SI numbers. */
  model: Record<string, number>;
  /**
   * Pin role -> net name, in the kind's pin order (see graph/kinds.ts). List-form pins are
   * given the kind's role names in order.
   */
  pins: Record<string, string>;
  note: string | null;
}

/** A part of a known kind, discriminated by `kind`: a switch over it is checked for exhaustiveness. */
export type KnownPart = { [K in KnownKind]: PartFields & { kind: K } }[KnownKind];

/** A part of any other kind, a word kept for documentation and search (never simulated). */
export type OtherPart = PartFields & { kind: string };

/** A part as the record holds it: a known kind, or any other word. */
export type Part = KnownPart | OtherPart;

/** True when the part's kind is one the engine knows, narrowing it to the discriminated union. */
export function isKnownPart(p: Part): p is KnownPart {
  return (KNOWN_KINDS as readonly string[]).includes(p.kind);
}

export const NET_ROLES = ["line", "neutral", "earth", "output"] as const;
export type NetRole = (typeof NET_ROLES)[number];

export interface NetInfo {
  role: NetRole | null;
  /** True when a person can touch it in normal use. */
  accessible: boolean;
  note: string | null;
}

export const MEASUREMENT_KINDS = [
  "input.current_rms",
  "input.power",
  "input.apparent_power",
  "input.power_factor",
  "voltage.dc",
  "voltage.rms",
  "voltage.peak",
  "part.current_rms",
  "part.power",
] as const;
export type MeasurementKind = (typeof MEASUREMENT_KINDS)[number];

/** Stated uncertainty of a measurement: relative (0.02 for 2%) or absolute (in the unit). */
export type Uncertainty = { relative: number } | { absolute: number };

export interface Measurement {
  what: MeasurementKind;
  value: number;
  /** voltage.* only: [from, to], the reading is V(from) - V(to). */
  between: [string, string] | null;
  /** part.* only. */
  part: string | null;
  /** The supply during the measurement (the rated supply when not stated). */
  supply: Supply;
  instrument: string | null;
  uncertainty: Uncertainty | null;
}

export interface Spacing {
  between: [string, string];
  creepage_mm: number | null;
  clearance_mm: number | null;
  slot: boolean;
  /** IEC 60664-1 material group; IIIa when not stated. */
  material_group: "I" | "II" | "IIIa" | "IIIb";
  /** IEC 60664-1 pollution degree; 2 when not stated. */
  pollution_degree: 1 | 2 | 3;
}

export interface Device {
  category: string | null;
  rated_supply: Supply;
  tags: string[];
}

/** A validated record, version 1. */
export interface TeardownRecord {
  record: 1;
  title: string;
  summary: string | null;
  device: Device;
  parts: Part[];
  /** Every net named in a pin or in `nets`, with defaults filled in. */
  nets: Record<string, NetInfo>;
  measurements: Measurement[];
  board: { spacings: Spacing[] };
}

/** Where a problem is: a field path such as `parts[1].value`, and the line/column in the file. */
export interface SourcePlace {
  path: string;
  line: number | null;
  column: number | null;
}

/** An expected failure of reading input, returned as a value (never thrown). */
export interface InputError extends SourcePlace {
  code: string;
  message: string;
}

export type ParseResult =
  | { ok: true; record: TeardownRecord; warnings: InputError[] }
  | { ok: false; errors: InputError[] };
