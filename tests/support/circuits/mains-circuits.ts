/**
 * Hand-made mains circuits for tests, one factory each, built in code with the record factory.
 * They are small versions of boards a teardown meets (a plug-in night light, an igniter, a lamp
 * dimmer, ...). Values are plausible, not taken from any product. Each factory returns a fresh
 * record, so a test may change it freely.
 */
import type { TeardownRecord } from "@teardown/engine";
import { part, record } from "../record-factory.js";

const MAINS = { L: { role: "line" as const }, N: { role: "neutral" as const } };
const POLARISED = { polarised: true };

/** A night light: fuse, surge resistor, X2 dropper with bleeder, bridge, zener, reservoir, LED. */
export function nightLightDropper(): TeardownRecord {
  return record(
    [
      part("F1", "fuse", ["L", "L1"], 0.5),
      part("R1", "resistor", ["L1", "A"], 100),
      part("C1", "capacitor", ["A", "B"], 470e-9, { rating: { volts: 310, class: "X2" } }),
      part("R2", "resistor", ["A", "B"], 1e6),
      part("D1", "diode", { anode: "B", cathode: "P" }),
      part("D2", "diode", { anode: "N", cathode: "P" }),
      part("D3", "diode", { anode: "M", cathode: "B" }),
      part("D4", "diode", { anode: "M", cathode: "N" }),
      part("Z1", "zener", { anode: "M", cathode: "P" }, 5.1),
      part("C2", "capacitor", { plus: "P", minus: "M" }, 100e-6, POLARISED),
      part("R3", "resistor", ["P", "K"], 150),
      part("LED1", "led", { anode: "K", cathode: "M" }),
    ],
    MAINS,
  );
}

/** A capacitor-discharge igniter: half-wave charge, divider-driven thyristor, pulse transformer. */
export function thyristorIgniter(): TeardownRecord {
  return record(
    [
      part("D1", "diode", { anode: "L", cathode: "P" }),
      part("R1", "resistor", ["P", "Q"], 10e3),
      part("C1", "capacitor", ["Q", "X"], 1e-6),
      part("T1", "transformer", { p1: "X", p2: "N", s1: "HV", s2: "N" }, null, {
        model: { lp: 150e-6, ratio: 40, k: 0.9 },
      }),
      part("Q1", "thyristor", { anode: "Q", gate: "G", cathode: "N" }, null, {
        model: { vgt: 0.7, igt: 50e-6, ih: 3e-3, von: 1.2 },
      }),
      part("R2", "resistor", ["P", "G"], 100e3),
      part("R3", "resistor", ["G", "N"], 10e3),
      part("SG1", "load", ["HV", "N"], null, { model: { c: 10e-12 } }),
    ],
    { ...MAINS, HV: { role: "output" } },
  );
}

/** A lamp dimmer: fuse, lamp, triac with an RC phase shift through a diac (a kind we do not simulate). */
export function triacDimmer(): TeardownRecord {
  return record(
    [
      part("F1", "fuse", ["L", "L1"], 2),
      part("LAMP1", "load", ["L1", "A"], null, { model: { r: 529 } }),
      part("TR1", "triac", { mt2: "A", mt1: "N", gate: "G" }),
      part("R1", "resistor", ["A", "X"], 220e3),
      part("C1", "capacitor", ["X", "N"], 47e-9),
      part("DB1", "diac", { p1: "X", p2: "G" }),
    ],
    MAINS,
  );
}

/** A resistor-fed half-wave supply: surge resistor, diode, reservoir, resistor-fed zener, load. */
export function halfWaveResistive(): TeardownRecord {
  return record(
    [
      part("R1", "resistor", ["L", "A"], 47),
      part("D1", "diode", { anode: "A", cathode: "P" }),
      part("C1", "capacitor", { plus: "P", minus: "N" }, 47e-6, POLARISED),
      part("R2", "resistor", ["P", "K"], 1e3),
      part("Z1", "zener", { anode: "N", cathode: "K" }, 12),
      part("LOAD1", "load", ["K", "N"], null, { model: { r: 2.2e3 } }),
    ],
    MAINS,
  );
}

/** A fused mains transformer into a bridge, reservoir and an LED fed from a divider. */
export function fusedTransformerSupply(): TeardownRecord {
  return record(
    [
      part("J1", "connector", ["L", "N"]),
      part("F1", "fuse", ["L", "L1"], 0.1),
      part("T1", "transformer", { p1: "L1", p2: "N", s1: "S1", s2: "S2" }, null, {
        model: { lp: 10, ratio: 20, k: 0.98 },
      }),
      part("D1", "diode", { anode: "S1", cathode: "P" }),
      part("D2", "diode", { anode: "S2", cathode: "P" }),
      part("D3", "diode", { anode: "M", cathode: "S1" }),
      part("D4", "diode", { anode: "M", cathode: "S2" }),
      part("C1", "capacitor", { plus: "P", minus: "M" }, 470e-6, POLARISED),
      part("R1", "resistor", ["P", "V"], 1e3),
      part("R2", "resistor", ["V", "M"], 1e3),
      part("LED1", "led", { anode: "V", cathode: "M" }),
    ],
    MAINS,
  );
}

/** A varistor-protected input with an X capacitor and its bleeder, transformer, half-wave secondary. */
export function varistorProtectedInput(): TeardownRecord {
  return record(
    [
      part("F1", "fuse", ["L", "L1"], 1),
      part("RV1", "varistor", ["L1", "N"], 430),
      part("CX", "capacitor", ["L1", "N"], 100e-9, { rating: { class: "X2" } }),
      part("RX", "resistor", ["L1", "N"], 1e6),
      part("T1", "transformer", { p1: "L1", p2: "N", s1: "S1", s2: "S2" }, null, {
        model: { lp: 10, ratio: 20, k: 0.98 },
      }),
      part("D1", "diode", { anode: "S1", cathode: "P" }),
      part("C1", "capacitor", { plus: "P", minus: "S2" }, 1e-3, POLARISED),
      part("LOAD1", "load", ["P", "S2"], null, { model: { r: 100 } }),
    ],
    MAINS,
  );
}

/** A half-wave dropper: surge resistor, dropper with bleeder, zener clamp, diode, reservoir, load. */
export function halfWaveDropper(): TeardownRecord {
  return record(
    [
      part("R1", "resistor", ["L", "A"], 220),
      part("C1", "capacitor", ["A", "B"], 1e-6, { rating: { volts: 275, class: "X2" } }),
      part("R2", "resistor", ["A", "B"], 470e3),
      part("Z1", "zener", { anode: "N", cathode: "B" }, 24),
      part("D1", "diode", { anode: "B", cathode: "P" }),
      part("C2", "capacitor", { plus: "P", minus: "N" }, 220e-6, POLARISED),
      part("LOAD1", "load", ["P", "N"], null, { model: { r: 1e3 } }),
    ],
    MAINS,
  );
}

/** A dropper in the neutral leg with its bleeder, a bridge, a reservoir and a load. */
export function neutralSideDropper(): TeardownRecord {
  return record(
    [
      part("C1", "capacitor", ["N", "B"], 330e-9),
      part("R1", "resistor", ["N", "B"], 1e6),
      part("D1", "diode", { anode: "L", cathode: "P" }),
      part("D2", "diode", { anode: "B", cathode: "P" }),
      part("D3", "diode", { anode: "M", cathode: "L" }),
      part("D4", "diode", { anode: "M", cathode: "B" }),
      part("C2", "capacitor", { plus: "P", minus: "M" }, 47e-6, POLARISED),
      part("LOAD1", "load", ["P", "M"], null, { model: { r: 4.7e3 } }),
    ],
    MAINS,
  );
}

/** A heater switched by a thyristor on a bridge's output, gate driven by an RC network. */
export function thyristorRcHeater(): TeardownRecord {
  return record(
    [
      part("HEATER1", "load", ["L", "A"], null, { model: { r: 100 } }),
      part("D1", "diode", { anode: "A", cathode: "P" }),
      part("D2", "diode", { anode: "N", cathode: "P" }),
      part("D3", "diode", { anode: "M", cathode: "A" }),
      part("D4", "diode", { anode: "M", cathode: "N" }),
      part("Q1", "thyristor", { anode: "P", gate: "G", cathode: "M" }),
      part("R1", "resistor", ["P", "X"], 47e3),
      part("C1", "capacitor", ["X", "M"], 100e-9),
      part("R2", "resistor", ["X", "G"], 1e3),
    ],
    MAINS,
  );
}

/** A mains LED indicator behind a series resistor with a reverse diode: only its reverse protection. */
export function resistiveLedIndicator(): TeardownRecord {
  return record(
    [
      part("R1", "resistor", ["L", "A"], 100e3),
      part("LED1", "led", { anode: "A", cathode: "N" }),
      part("D1", "diode", { anode: "N", cathode: "A" }),
    ],
    MAINS,
  );
}

/** A capacitor-fed LED indicator: dropper with bleeder, LED and a reverse diode straight to neutral. */
export function capacitiveLedIndicator(): TeardownRecord {
  return record(
    [
      part("C1", "capacitor", ["L", "A"], 100e-9, { rating: { class: "X2" } }),
      part("R1", "resistor", ["L", "A"], 1e6),
      part("LED1", "led", { anode: "A", cathode: "N" }),
      part("D1", "diode", { anode: "N", cathode: "A" }),
    ],
    MAINS,
  );
}
