/**
 * What the demo scenario is meant to show, in a form a test (and later the search and compare
 * work) can check: which entries are batch variants of one gadget and exactly how their parts
 * differ, which risk flags each revision is meant to raise, and which measurements are meant to
 * disagree with the traced circuit and which part the mismatch hint should blame.
 *
 * Everything here is the scenario's intent, written by hand from the gadgets' stories; the
 * figures themselves always come from the engine.
 */

export type Severity = "danger" | "warning" | "info";

/** A flag the revision is meant to raise: its code, severity, and parts or nets it must name. */
export interface IntendedFlag {
  code: string;
  severity: Severity;
  /** Part refs or net names the flag names (each must be among its parts or nets). */
  on: string[];
}

/** A measurement meant to disagree, by its index in the record's measurement list. */
export interface IntendedMismatch {
  measurement: number;
  what: string;
  /** The part the mismatch hint should name as the explanation, or null when none is expected. */
  explainedBy: string | null;
}

/** What one revision file is meant to show. Measurements not listed as mismatches should agree. */
export interface RevisionExpectation {
  flags: IntendedFlag[];
  mismatches: IntendedMismatch[];
}

const flag = (severity: Severity, code: string, ...on: string[]): IntendedFlag => ({
  code,
  severity,
  on,
});
const mismatch = (measurement: number, what: string, explainedBy: string | null) => ({
  measurement,
  what,
  explainedBy,
});

/** Intended flags and mismatches per record file (paths relative to records/). */
export const REVISION_EXPECTATIONS: Readonly<Record<string, RevisionExpectation>> = {
  "glowmoth-night-light.yaml": {
    flags: [flag("warning", "overstress-voltage", "R1"), flag("warning", "no-fuse")],
    mismatches: [mismatch(1, "voltage.dc", "C1")],
  },
  "puffwick-fragrance-warmer.yaml": {
    flags: [
      flag("warning", "overstress-voltage", "R1"),
      flag("warning", "no-fuse"),
      flag("warning", "bleeder-slow"),
    ],
    mismatches: [],
  },
  "breezel-desk-ionizer.yaml": {
    flags: [flag("info", "high-voltage-output", "HV"), flag("info", "ozone")],
    // The hint does name a part here, but only after minutes of pulse-transformer solves; the
    // disagreement itself is the point of this entry.
    mismatches: [mismatch(0, "input.power", null)],
  },
  "dimmbo-lamp-dimmer.yaml": {
    flags: [],
    mismatches: [mismatch(0, "input.power", "LP1")],
  },
  "tockly-wall-clock-supply.yaml": { flags: [], mismatches: [] },
  "snugglet-hand-warmer.yaml": {
    flags: [
      flag("danger", "accessible-mains", "CASE"),
      flag("danger", "bleeder-missing", "C1"),
      flag("danger", "overstress-voltage", "C1"),
      flag("warning", "no-fuse"),
      flag("warning", "capacitor-class", "C1"),
      flag("warning", "spacing-short", "L", "CASE"),
    ],
    mismatches: [],
  },
  "lumora-led-bulb-l24a.yaml": {
    flags: [
      flag("warning", "no-surge-limit", "DB1"),
      flag("warning", "no-surge-limit", "DB4"),
      flag("warning", "bleeder-slow"),
    ],
    mismatches: [],
  },
  "history/lumora-led-bulb-l24c.r1.yaml": {
    flags: [flag("warning", "bleeder-slow")],
    mismatches: [mismatch(0, "input.current_rms", "C1")],
  },
  "lumora-led-bulb-l24c.yaml": {
    flags: [flag("warning", "bleeder-slow")],
    mismatches: [mismatch(0, "input.current_rms", "C1")],
  },
  "glowmoth-night-light-batch2.yaml": {
    flags: [flag("warning", "overstress-voltage", "R1"), flag("warning", "no-fuse")],
    mismatches: [],
  },
  "history/thermbrook-heater-controller.r1.yaml": {
    flags: [flag("warning", "overstress-power", "R3")],
    mismatches: [mismatch(0, "input.power", "HE1"), mismatch(1, "input.current_rms", "HE1")],
  },
  "thermbrook-heater-controller.yaml": {
    flags: [flag("warning", "overstress-power", "R3")],
    mismatches: [],
  },
  "history/zaptrel-bug-zapper.r1.yaml": {
    flags: [flag("warning", "capacitor-class", "C1")],
    // The first pass read the capacitors wrong by a factor the hint's one-part search does
    // not reach with a plausible value; the disagreement itself is the point.
    mismatches: [mismatch(0, "voltage.dc", null)],
  },
  "history/zaptrel-bug-zapper.r2.yaml": {
    flags: [flag("warning", "capacitor-class", "C1"), flag("info", "high-voltage-output", "HV")],
    mismatches: [],
  },
  "zaptrel-bug-zapper.yaml": {
    flags: [flag("warning", "capacitor-class", "C1"), flag("info", "high-voltage-output", "HV")],
    mismatches: [],
  },
  "whirlby-fan-speed-control.yaml": {
    // The snubber resistor's pulses stay under its overload figure and its RMS under its
    // limiting element voltage: no voltage flag on the basis the ratings are stated in.
    flags: [flag("warning", "trigger-marginal", "Q1")],
    mismatches: [],
  },
  "tickwell-timer-socket.yaml": { flags: [flag("warning", "no-fuse")], mismatches: [] },
  "dingsby-door-chime.yaml": { flags: [], mismatches: [] },
  "voltplum-battery-charger.yaml": {
    flags: [
      flag("danger", "accessible-mains", "BP"),
      flag("danger", "bleeder-missing", "C1"),
      flag("danger", "overstress-voltage", "C1"),
      flag("warning", "no-fuse"),
      flag("warning", "capacitor-class", "C1"),
      flag("warning", "spacing-short", "L", "BP"),
    ],
    mismatches: [],
  },
  "mossquell-mat-heater.yaml": {
    flags: [
      flag("danger", "overstress-power", "R3"),
      flag("warning", "overstress-power", "R1"),
      flag("warning", "overstress-power", "R2"),
    ],
    mismatches: [mismatch(0, "input.power", "R1")],
  },
  "plugmint-smart-plug-supply.yaml": {
    flags: [flag("warning", "bleeder-slow"), flag("warning", "overstress-power", "R3")],
    mismatches: [],
  },
};

/** One part field that differs between the two boards of a pair (raw values as written). */
export interface ChangedField {
  /** The part's ref on the second board. */
  ref: string;
  /** Dotted path inside the part, e.g. `value`, `model.r`, `pins.cathode`. */
  field: string;
  from: unknown;
  to: unknown;
}

/**
 * Two entries that are batches of one gadget. Their parts differ exactly by: the renamed
 * designators, the changed fields, the added and the removed parts (nothing else).
 */
export interface VariantPair {
  a: string;
  b: string;
  /** Ref on board a → ref on board b, for every part whose designator changed. */
  renamed: Record<string, string>;
  changed: ChangedField[];
  /** Refs on board b with no counterpart on board a. */
  added: string[];
  /** Refs on board a with no counterpart on board b. */
  removed: string[];
}

/** The scenario's variant pairs (entry slugs; the current revision of each is compared). */
export const VARIANT_PAIRS: readonly VariantPair[] = [
  {
    a: "lumora-led-bulb-l24a",
    b: "lumora-led-bulb-l24c",
    renamed: {
      RF1: "F1",
      CX1: "C1",
      RB1: "R1",
      RB2: "R2",
      DB1: "D1",
      DB2: "D2",
      DB3: "D3",
      DB4: "D4",
      EC1: "C2",
    },
    changed: [
      { ref: "F1", field: "model.r", from: 10, to: 22 },
      { ref: "F1", field: "marking", from: "10R FR", to: "22R FR" },
      { ref: "C1", field: "value", from: "680n", to: "560n" },
      { ref: "C1", field: "marking", from: "684J 630V", to: "564J 630V" },
    ],
    added: ["R3"],
    removed: [],
  },
  {
    a: "glowmoth-night-light",
    b: "glowmoth-night-light-batch2",
    renamed: {},
    changed: [
      { ref: "C1", field: "value", from: "330n", to: "220n" },
      { ref: "C1", field: "marking", from: "334K 310V~ X2", to: "224K 310V~ X2" },
      { ref: "R3", field: "value", from: 47, to: 68 },
      { ref: "LED2", field: "pins.cathode", from: "K2", to: "M" },
    ],
    added: [],
    removed: ["LED3"],
  },
];
