/**
 * Circuits that look like a block but are not one: each must not be recognised as the block
 * it imitates (two diodes in series are no bridge, a capacitor across the supply is no dropper,
 * and so on). Built in code with the record factory; each factory returns a fresh record.
 */
import type { TeardownRecord } from "@teardown/engine";
import { part, record } from "../record-factory.js";

const MAINS = { L: { role: "line" as const }, N: { role: "neutral" as const } };
const POLARISED = { polarised: true };

/** Two diodes in series from the line into a reservoir: a half-wave string, no bridge. */
export function twoDiodesInSeries(): TeardownRecord {
  return record(
    [
      part("D1", "diode", { anode: "L", cathode: "X" }),
      part("D2", "diode", { anode: "X", cathode: "P" }),
      part("C1", "capacitor", { plus: "P", minus: "N" }, 100e-6, POLARISED),
      part("LOAD1", "load", ["P", "N"], null, { model: { r: 10e3 } }),
    ],
    MAINS,
  );
}

/** An X capacitor straight across the fused supply beside a heater: no dropper, no bleeder. */
export function capacitorAcrossSupply(): TeardownRecord {
  return record(
    [
      part("F1", "fuse", ["L", "L1"], 1),
      part("CX", "capacitor", ["L1", "N"], 100e-9),
      part("LOAD1", "load", ["L1", "N"], null, { model: { r: 50 } }),
    ],
    MAINS,
  );
}

/** Two resistors in series with nothing at their midpoint, and a thyristor with only a gate resistor. */
export function dividerFeedingNothing(): TeardownRecord {
  return record(
    [
      part("D1", "diode", { anode: "L", cathode: "P" }),
      part("C1", "capacitor", { plus: "P", minus: "N" }, 10e-6, POLARISED),
      part("R1", "resistor", ["P", "X"], 100e3),
      part("R2", "resistor", ["X", "N"], 10e3),
      part("LOAD1", "load", ["P", "A"], null, { model: { r: 1e3 } }),
      part("Q1", "thyristor", { anode: "A", gate: "G", cathode: "N" }),
      part("R3", "resistor", ["G", "N"], 1e3),
    ],
    MAINS,
  );
}

/** A resistor across the fused supply with no capacitor beside it: a load, not a bleeder. */
export function resistorAcrossSupply(): TeardownRecord {
  return record(
    [
      part("F1", "fuse", ["L", "L1"], 1),
      part("R1", "resistor", ["L1", "N"], 100e3),
      part("LOAD1", "load", ["L1", "N"], null, { model: { r: 50 } }),
    ],
    MAINS,
  );
}

/** A bridge with its fourth diode turned round, into a reservoir and a load. */
export function bridgeWithReversedDiode(): TeardownRecord {
  return record(
    [
      part("D1", "diode", { anode: "L", cathode: "P" }),
      part("D2", "diode", { anode: "N", cathode: "P" }),
      part("D3", "diode", { anode: "M", cathode: "L" }),
      part("D4", "diode", { anode: "N", cathode: "M" }),
      part("C1", "capacitor", { plus: "P", minus: "M" }, 47e-6, POLARISED),
      part("LOAD1", "load", ["P", "M"], null, { model: { r: 1e3 } }),
    ],
    MAINS,
  );
}

/** A series RC snubber across the supply beside a heater: the capacitor carries no load current. */
export function rcSnubberAcrossSupply(): TeardownRecord {
  return record(
    [
      part("R1", "resistor", ["L", "X"], 100),
      part("C1", "capacitor", ["X", "N"], 100e-9),
      part("LOAD1", "load", ["L", "N"], null, { model: { r: 50 } }),
    ],
    MAINS,
  );
}
