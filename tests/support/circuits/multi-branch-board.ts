/**
 * A 30-part mains board with several branches on the same fused line, for tests that block
 * recognition works inside a larger board and not only on a circuit alone. An invented
 * "bathroom heater controller": values are plausible, not taken from any product.
 *
 *   L ─F1─ L1 ─┬─ RV1 to N (varistor across the fused mains)
 *              ├─ R1 ─ A ─ C1 ∥ R2 ─ B ─ bridge D1..D4 (B, N) ─ P/M: C2, Z1, LOAD1 (logic supply)
 *              ├─ LAMP1 ─ A2 ─ TR1 to N; gate: R5 A2─X, C3 X─N, R6 X─G; snubber R7 A2─S, C4 S─N
 *              ├─ R8 ─ K ─ LED1 to N, D5 reverse across LED1 (mains indicator)
 *              └─ D6 ─ P2 ─ R9 ─ Q ─ C5 ─ X3 ─ T1 primary to N; Q1 from Q to N; gate divider
 *                           R10 P2─G2, R11 G2─N; T1 secondary into spark gap SG1 (igniter)
 */
import type { TeardownRecord } from "@teardown/engine";
import { part, record } from "../record-factory.js";

const MAINS = { L: { role: "line" as const }, N: { role: "neutral" as const } };
const POLARISED = { polarised: true };

/** The 30-part board (see the file comment for its branches). */
export function multiBranchBoard(): TeardownRecord {
  return record(
    [
      part("F1", "fuse", ["L", "L1"], 2),
      part("RV1", "varistor", ["L1", "N"], 470),
      // logic supply: surge resistor, X2 dropper with bleeder, bridge, zener, reservoir, load
      part("R1", "resistor", ["L1", "A"], 100),
      part("C1", "capacitor", ["A", "B"], 470e-9, { rating: { volts: 310, class: "X2" } }),
      part("R2", "resistor", ["A", "B"], 1e6),
      part("D1", "diode", { anode: "B", cathode: "P" }),
      part("D2", "diode", { anode: "N", cathode: "P" }),
      part("D3", "diode", { anode: "M", cathode: "B" }),
      part("D4", "diode", { anode: "M", cathode: "N" }),
      part("Z1", "zener", { anode: "M", cathode: "P" }, 12),
      part("C2", "capacitor", { plus: "P", minus: "M" }, 220e-6, POLARISED),
      part("LOAD1", "load", ["P", "M"], null, { model: { r: 1.2e3 } }),
      // triac stage: heater lamp, RC phase-shift gate network, RC snubber across the triac
      part("LAMP1", "load", ["L1", "A2"], null, { model: { r: 529 } }),
      part("TR1", "triac", { mt2: "A2", mt1: "N", gate: "G" }),
      part("R5", "resistor", ["A2", "X"], 220e3),
      part("C3", "capacitor", ["X", "N"], 47e-9),
      part("R6", "resistor", ["X", "G"], 1e3),
      part("R7", "resistor", ["A2", "S"], 100),
      part("C4", "capacitor", ["S", "N"], 47e-9, { rating: { class: "X2" } }),
      // mains indicator with its reverse-protection diode
      part("R8", "resistor", ["L1", "K"], 100e3),
      part("LED1", "led", { anode: "K", cathode: "N" }),
      part("D5", "diode", { anode: "N", cathode: "K" }),
      // igniter: half-wave charge, divider-driven thyristor, capacitor discharge into T1
      part("D6", "diode", { anode: "L1", cathode: "P2" }),
      part("R9", "resistor", ["P2", "Q"], 10e3),
      part("C5", "capacitor", ["Q", "X3"], 1e-6),
      part("T1", "transformer", { p1: "X3", p2: "N", s1: "HV", s2: "N" }, null, {
        model: { lp: 150e-6, ratio: 40, k: 0.9 },
      }),
      part("Q1", "thyristor", { anode: "Q", gate: "G2", cathode: "N" }),
      part("R10", "resistor", ["P2", "G2"], 100e3),
      part("R11", "resistor", ["G2", "N"], 10e3),
      part("SG1", "load", ["HV", "N"], null, { model: { c: 10e-12 } }),
    ],
    { ...MAINS, HV: { role: "output" } },
  );
}
