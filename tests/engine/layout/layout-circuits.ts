/**
 * Small invented circuits for the layout checks, built with the record factory: the usual
 * mains-gadget shapes (dropper and bridge, thyristor trigger into a pulse transformer, triac
 * phase control, switched heater with indicator), one with no mains roles at all, one full of
 * awkward cases, and a 40-part ladder for size. Used until tests/support/circuits exists.
 */
import type { TeardownRecord } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";

export interface NamedRecord {
  name: string;
  record: TeardownRecord;
}

const dropperBridge = record(
  [
    part("F1", "fuse", ["L", "L1"], 0.5),
    part("RV1", "varistor", ["L1", "N"], 275),
    part("C1", "capacitor", ["L1", "A"], 330e-9, { value_text: "330n" }),
    part("R1", "resistor", ["L1", "A"], 1e6, { value_text: "1M" }),
    part("R2", "resistor", ["A", "B"], 100, { value_text: "100" }),
    part("D1", "diode", { anode: "B", cathode: "P" }),
    part("D2", "diode", { anode: "N", cathode: "P" }),
    part("D3", "diode", { anode: "M", cathode: "B" }),
    part("D4", "diode", { anode: "M", cathode: "N" }),
    part("C2", "capacitor", { plus: "P", minus: "M" }, 100e-6, {
      polarised: true,
      value_text: "100u",
    }),
    part("DZ1", "zener", { anode: "M", cathode: "P" }, 12, { value_text: "12V" }),
    part("LED1", "led", { anode: "P", cathode: "K" }),
    part("R3", "resistor", ["K", "M"], 1000, { value_text: "1k" }),
  ],
  { P: { role: "output" } },
);

const thyristorPulse = record([
  part("C1", "capacitor", ["L", "A"], 100e-9, { value_text: "100n" }),
  part("R1", "resistor", ["L", "A"], 470e3, { value_text: "470k" }),
  part("D1", "diode", { anode: "A", cathode: "P" }),
  part("C2", "capacitor", ["P", "N"], 1e-6, { value_text: "1u" }),
  part("R2", "resistor", ["P", "G"], 220e3, { value_text: "220k" }),
  part("R3", "resistor", ["G", "N"], 10e3, { value_text: "10k" }),
  part("Q1", "thyristor", { anode: "P", gate: "G", cathode: "X" }),
  part("T1", "transformer", { p1: "X", p2: "N", s1: "HV", s2: "N" }),
  part("LD1", "load", ["HV", "N"]),
]);

const triacDimmer = record([
  part("LD1", "load", ["L", "X"], null, { value_text: "60W" }),
  part("TR1", "triac", { mt2: "X", mt1: "N", gate: "G" }),
  part("R1", "resistor", ["X", "Y"], 250e3, { value_text: "250k" }),
  part("C1", "capacitor", ["Y", "N"], 100e-9, { value_text: "100n" }),
  part("DB1", "diac", { p1: "Y", p2: "G" }),
  part("R2", "resistor", ["X", "S"], 100, { value_text: "100" }),
  part("C3", "capacitor", ["S", "N"], 47e-9, { value_text: "47n" }),
]);

const switchedHeater = record(
  [
    part("J1", "connector", ["L", "N", "PE"]),
    part("F1", "fuse", ["L", "L1"], 10, { value_text: "10A" }),
    part("S1", "switch", ["L1", "L2"]),
    part("LD1", "load", ["L2", "N"], null, { value_text: "2kW" }),
    part("R1", "resistor", ["L2", "K1"], 100e3, { value_text: "100k" }),
    part("LED1", "led", { anode: "K1", cathode: "N" }),
    part("D1", "diode", { anode: "N", cathode: "K1" }),
    part("LD2", "load", ["L2", "PE"], null, { value_text: "case" }),
  ],
  { PE: { role: "earth", accessible: true } },
);

const noMainsRoles = record(
  [
    part("R1", "resistor", ["VIN", "B"], 4700, { value_text: "4k7" }),
    part("R2", "resistor", ["B", "GND"], 1000, { value_text: "1k" }),
    part("C1", "capacitor", ["B", "GND"], 10e-9, { value_text: "10n" }),
    part("D1", "diode", { anode: "B", cathode: "VOUT" }),
    part("C2", "capacitor", ["VOUT", "GND"], 1e-6, { value_text: "1u" }),
    part("TP1", "testpoint", ["VOUT"]),
    part("U1", "regulator-ic", { in: "VIN", gnd: "GND", out: "VOUT" }),
  ],
  { VOUT: { role: "output" } },
);

const awkwardCases = record(
  [
    part("LD1", "load", ["L", "X"]),
    part("LD2", "load", ["X", "Y"]),
    part("LD3", "load", ["Y", "OUT"]),
    part("R1", "resistor", ["L", "OUT"], 1e3, { value_text: "1k" }),
    part("R8", "resistor", ["X", "FLOAT"], 1e3, { value_text: "a rather long value text" }),
    part("R9", "resistor", ["N", "N"], 10, { value_text: "10" }),
    part("C9", "capacitor", ["N", "Y"], 1e-9, { value_text: "1n" }),
    part("LD9", "load", ["Z", "Z"]),
    part("Q9", "thyristor", { anode: "N", gate: "Y", cathode: "X" }),
  ],
  { OUT: { role: "output" } },
);

/** A ladder of `stages` RC-diode-zener stages behind a fuse and varistor: 4 + 4·stages parts. */
export function ladderRecord(stages: number): TeardownRecord {
  const parts = [
    part("F1", "fuse", ["L", "S0"], 1, { value_text: "1A" }),
    part("RV1", "varistor", ["S0", "N"], 275, { value_text: "275V" }),
  ];
  for (let i = 1; i <= stages; i++) {
    const prev = `S${i - 1}`;
    const here = `S${i}`;
    parts.push(
      part(`R${i}`, "resistor", [prev, here], 1000 * i, { value_text: `${i}k` }),
      part(`C${i}`, "capacitor", [here, "N"], 1e-7, { value_text: "100n" }),
      part(`D${i}`, "diode", { anode: here, cathode: `T${i}` }),
      part(`Z${i}`, "zener", { anode: "N", cathode: `T${i}` }, 5.1, { value_text: "5V1" }),
    );
  }
  parts.push(
    part("LD1", "load", [`T${stages}`, "N"]),
    part("RB1", "resistor", [`T${stages}`, "N"], 100e3, { value_text: "100k" }),
  );
  return record(parts, { [`T${stages}`]: { role: "output" } });
}

/** The layout's own circuit set: six shapes and a 40-part ladder. */
export const LAYOUT_CIRCUITS: NamedRecord[] = [
  { name: "dropper with bridge, zener and LED", record: dropperBridge },
  { name: "thyristor trigger into a pulse transformer", record: thyristorPulse },
  { name: "triac phase control with a diac", record: triacDimmer },
  { name: "switched heater with indicator and earth", record: switchedHeater },
  { name: "low-voltage circuit with no mains roles", record: noMainsRoles },
  { name: "chained loads, shorted and floating parts", record: awkwardCases },
  { name: "40-part ladder", record: ladderRecord(9) },
];
