/**
 * Pin roles per kind: the single table every stage uses (parser, graph, blocks, fingerprint,
 * layout, solver). `symmetric` means the pins are interchangeable for matching purposes.
 */
import type { KnownKind } from "../record/types.js";

export interface KindInfo {
  /** Pin roles in list order. Connectors and test points take any number (see `variadic`). */
  pins: readonly string[];
  /** Pins may be swapped without changing the circuit (a resistor's two ends). */
  symmetric: boolean;
  /** Connectors and test points: one or more pins, named p1, p2, ... */
  variadic: boolean;
  /** The unit symbol of `value`, or null when the kind has no value. */
  unit: string | null;
  /** Left out of the simulation (documentation only). */
  documentationOnly: boolean;
}

export const KINDS: Record<KnownKind, KindInfo> = {
  resistor: {
    pins: ["a", "b"],
    symmetric: true,
    variadic: false,
    unit: "Ω",
    documentationOnly: false,
  },
  capacitor: {
    pins: ["a", "b"],
    symmetric: true,
    variadic: false,
    unit: "F",
    documentationOnly: false,
  },
  inductor: {
    pins: ["a", "b"],
    symmetric: true,
    variadic: false,
    unit: "H",
    documentationOnly: false,
  },
  diode: {
    pins: ["anode", "cathode"],
    symmetric: false,
    variadic: false,
    unit: null,
    documentationOnly: false,
  },
  zener: {
    pins: ["anode", "cathode"],
    symmetric: false,
    variadic: false,
    unit: "V",
    documentationOnly: false,
  },
  led: {
    pins: ["anode", "cathode"],
    symmetric: false,
    variadic: false,
    unit: null,
    documentationOnly: false,
  },
  thyristor: {
    pins: ["anode", "gate", "cathode"],
    symmetric: false,
    variadic: false,
    unit: null,
    documentationOnly: false,
  },
  triac: {
    pins: ["mt1", "mt2", "gate"],
    symmetric: false,
    variadic: false,
    unit: null,
    documentationOnly: false,
  },
  transformer: {
    pins: ["p1", "p2", "s1", "s2"],
    symmetric: false,
    variadic: false,
    unit: null,
    documentationOnly: false,
  },
  fuse: { pins: ["a", "b"], symmetric: true, variadic: false, unit: "A", documentationOnly: false },
  varistor: {
    pins: ["a", "b"],
    symmetric: true,
    variadic: false,
    unit: "V",
    documentationOnly: false,
  },
  load: {
    pins: ["a", "b"],
    symmetric: true,
    variadic: false,
    unit: null,
    documentationOnly: false,
  },
  switch: {
    pins: ["a", "b"],
    symmetric: true,
    variadic: false,
    unit: null,
    documentationOnly: false,
  },
  connector: {
    pins: ["p1"],
    symmetric: false,
    variadic: true,
    unit: null,
    documentationOnly: true,
  },
  testpoint: {
    pins: ["p1"],
    symmetric: false,
    variadic: true,
    unit: null,
    documentationOnly: true,
  },
};

/** Polarised capacitors use these roles instead of a/b. */
export const POLARISED_CAPACITOR_PINS = ["plus", "minus"] as const;

/** The kind's table entry, or null for a kind the engine does not know. */
export function kindInfo(kind: string): KindInfo | null {
  return Object.prototype.hasOwnProperty.call(KINDS, kind) ? KINDS[kind as KnownKind] : null;
}

/** Pin roles expected for a part, taking polarised capacitors into account. */
export function pinRolesFor(kind: string, polarised: boolean): readonly string[] | null {
  if (kind === "capacitor" && polarised) return POLARISED_CAPACITOR_PINS;
  return kindInfo(kind)?.pins ?? null;
}
