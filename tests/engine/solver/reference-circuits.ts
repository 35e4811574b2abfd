/**
 * The mains circuits the solver's reference tests share: a capacitive dropper into a resistor,
 * a bridge rectifier with a smoothing capacitor, a dropper supply with a zener and a large
 * storage capacitor, and a phase-controlled full-wave rectifier triggered by a divider.
 */
import type { TeardownRecord } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";

/** Bridge rectifier between the AC nets `a`, `b` and the DC nets `plus`, `minus`. */
export function bridge(
  a: string,
  b: string,
  plus: string,
  minus: string,
  model: Record<string, number> = {},
) {
  return [
    part("D1", "diode", { anode: a, cathode: plus }, null, { model }),
    part("D2", "diode", { anode: b, cathode: plus }, null, { model }),
    part("D3", "diode", { anode: minus, cathode: a }, null, { model }),
    part("D4", "diode", { anode: minus, cathode: b }, null, { model }),
  ];
}

/** C1 in series with R1 across the mains. */
export function dropperIntoResistor(c = 330e-9, r = 1000): TeardownRecord {
  return record([part("C1", "capacitor", ["L", "A"], c), part("R1", "resistor", ["A", "N"], r)]);
}

/** Bridge from the mains into C1 ∥ RL (a plain smoothed rectifier). */
export function smoothedRectifier(c = 470e-6, rl = 2000): TeardownRecord {
  return record([
    part("RS", "resistor", ["L", "B"], 1),
    ...bridge("B", "N", "P", "M"),
    part("C1", "capacitor", { plus: "P", minus: "M" }, c, { polarised: true }),
    part("RL", "resistor", ["P", "M"], rl),
  ]);
}

/** Dropper (330 nF with bleeder and surge resistor), bridge, 470 µF, 12 V zener and a load. */
export function dropperSupply(): TeardownRecord {
  return record([
    part("C1", "capacitor", ["L", "A"], 330e-9),
    part("R1", "resistor", ["L", "A"], 1e6),
    part("R2", "resistor", ["A", "B"], 100),
    ...bridge("B", "N", "P", "M"),
    part("C2", "capacitor", { plus: "P", minus: "M" }, 470e-6, { polarised: true }),
    part("Z1", "zener", { anode: "M", cathode: "P" }, 12),
    part("RL", "resistor", ["P", "M"], 1000),
  ]);
}

/** Full-wave phase control: bridge, load RL to the anode, thyristor to the minus rail, divider RA/RB on the gate. */
export function phaseControlled(
  ra: number,
  rb = 1000,
  rl = 10_000,
  diodeModel: Record<string, number> = {},
): TeardownRecord {
  return record([
    ...bridge("L", "N", "P", "M", diodeModel),
    part("RL", "resistor", ["P", "A"], rl),
    part("Q1", "thyristor", { anode: "A", gate: "G", cathode: "M" }, null, {
      model: { vgt: 0.6, igt: 200e-6, ih: 5e-3, von: 1.0 },
    }),
    part("RA", "resistor", ["P", "G"], ra),
    part("RB", "resistor", ["G", "M"], rb),
  ]);
}

/** A triac phase controller: load in series with the triac across the mains, RC-less divider gate drive. */
export function triacDimmer(ra = 47_000): TeardownRecord {
  return record([
    part("RL", "resistor", ["L", "A"], 500),
    part("Q1", "triac", { mt1: "N", mt2: "A", gate: "G" }, null, {
      model: { vgt: 0.8, igt: 5e-3, ih: 10e-3, von: 1.2 },
    }),
    part("RA", "resistor", ["A", "G"], ra),
    part("RB", "resistor", ["G", "N"], 1000),
  ]);
}

/** Every reference circuit, by name. */
export function allReferenceCircuits(): Record<string, TeardownRecord> {
  return {
    "capacitive dropper into a resistor": dropperIntoResistor(),
    "smoothed bridge rectifier": smoothedRectifier(),
    "dropper supply with zener and storage capacitor": dropperSupply(),
    "phase-controlled full-wave rectifier": phaseControlled(100_000),
    "triac phase controller": triacDimmer(),
  };
}

/**
 * A thyristor latched on smoothed DC: a half-wave rectifier charges a large capacitor, which
 * feeds a load through the thyristor; a divider from the same DC drives its gate. From rest it
 * fires once the divider reaches the gate threshold; once on, the DC holds it on for as long as
 * the load current stays above the holding current, far below that threshold (a latch with
 * hysteresis: it starts from cold and keeps running at different supplies).
 */
export function latchedOnDc(rl = 10_000): TeardownRecord {
  return record([
    part("D1", "diode", { anode: "L", cathode: "P" }, null, {
      model: { is: 5e-9, n: 1.9, rs: 0.05 },
    }),
    part("C1", "capacitor", { plus: "P", minus: "N" }, 1000e-6, { polarised: true }),
    part("RL", "resistor", ["P", "A"], rl),
    part("Q1", "thyristor", { anode: "A", gate: "G", cathode: "N" }, null, {
      model: { vgt: 0.6, igt: 200e-6, ih: 5e-3, von: 1.0, ron: 0.05 },
    }),
    part("RA", "resistor", ["P", "G"], 100_000),
    part("RB", "resistor", ["G", "N"], 1000),
  ]);
}

/**
 * A capacitor-dump pulse stage: a half-wave rectifier charges C1 through R1; a divider from C1
 * drives a thyristor's gate; the thyristor dumps C1 through a small resistor.
 */
export function pulseStage(): TeardownRecord {
  return record([
    part("D1", "diode", { anode: "L", cathode: "P" }),
    part("R1", "resistor", ["P", "S"], 47_000),
    part("C1", "capacitor", ["S", "N"], 470e-9),
    part("R2", "resistor", ["S", "G"], 1e6),
    part("R3", "resistor", ["G", "N"], 10_000),
    part("R4", "resistor", ["S", "X"], 10),
    part("Q1", "thyristor", { anode: "X", gate: "G", cathode: "N" }, null, {
      model: { vgt: 0.7, igt: 50e-6, ih: 3e-3, von: 1.2 },
    }),
  ]);
}
