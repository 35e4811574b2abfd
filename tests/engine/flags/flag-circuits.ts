/**
 * Small mains circuits for the flag tests, each with a knob that turns one flag on or off, and a
 * helper that solves a record and assesses it with a small Monte Carlo (fast tests).
 */
import type { Flag, Part, RiskAssessment, TeardownRecord } from "@teardown/engine";
import { analyzeCircuit, assessRisks, evidenceValue } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";

/** Solves the record at its rated supply and runs the assessment (throws on a solver failure: a test bug). */
export function assess(rec: TeardownRecord, samples = 8): RiskAssessment {
  const a = analyzeCircuit(rec, {});
  if (!a.ok) throw new Error(`solver failed: ${a.error.code} ${a.error.message}`);
  return assessRisks(rec, a.value, { samples, seed: 7 });
}

/** A flag's numeric evidence by label (throws when missing or not a number: the test names a label the flag lacks). */
export function evNum(f: Flag, label: string): number {
  const v = evidenceValue(f, label);
  if (typeof v !== "number") throw new Error(`${f.code} has no numeric evidence "${label}"`);
  return v;
}

/** A flag's word evidence by label (throws when missing). */
export function evText(f: Flag, label: string): string {
  const v = evidenceValue(f, label);
  if (typeof v !== "string") throw new Error(`${f.code} has no word evidence "${label}"`);
  return v;
}

/** The codes of the flags, for readable assertions. */
export function codes(r: RiskAssessment): string[] {
  return r.flags.map((f) => f.code);
}

/** A fused X-capacitor input with an optional bleeder and a heater: the discharge test circuit. */
export function xCapacitorInput(bleederOhms: number | null, farads = 0.47e-6): TeardownRecord {
  // The heater is behind an open switch, as the standard's test puts any switch off.
  const parts: Part[] = [
    part("F1", "fuse", ["L", "L1"], 1),
    part("CX", "capacitor", ["L1", "N"], farads, { rating: { volts: 275, class: "X2" } }),
    part("HT1", "load", ["L1", "H"], null, { model: { r: 2000 } }),
    part("S1", "switch", ["H", "N"], null, { closed: false }),
  ];
  if (bleederOhms !== null) parts.push(part("RX", "resistor", ["L1", "N"], bleederOhms));
  return record(parts);
}

/** A dropper (X2 or unrated) with an optional bleeder, optional fuse and surge resistor, into a half-wave heater. */
export function dropperHeater(
  o: {
    bleeder?: number | null;
    fuse?: boolean;
    surge?: boolean;
    cls?: string | null;
    farads?: number;
  } = {},
): TeardownRecord {
  const start = o.fuse ? "L1" : "L";
  const afterSurge = o.surge ? "L2" : start;
  const parts: Part[] = [];
  if (o.fuse) parts.push(part("F1", "fuse", ["L", "L1"], 0.5));
  if (o.surge) parts.push(part("RS", "resistor", [start, "L2"], 100, { rating: { watts: 1 } }));
  const rating =
    o.cls === null || o.cls === undefined ? { volts: 400 } : { volts: 275, class: o.cls };
  parts.push(
    part("C1", "capacitor", [afterSurge, "A"], o.farads ?? 1e-6, { rating, tolerance: 0.1 }),
  );
  if (o.bleeder !== null && o.bleeder !== undefined)
    parts.push(part("R1", "resistor", [afterSurge, "A"], o.bleeder));
  parts.push(
    part("D1", "diode", { anode: "A", cathode: "H" }),
    part("D2", "diode", { anode: "N", cathode: "A" }),
    part("HT1", "load", ["H", "N"], null, { model: { r: 330 } }),
  );
  return record(parts);
}

/** A heater switched by a thyristor whose gate is fed from its anode through `ra` with `rb` to the cathode. */
export function thyristorHeater(ra: number): TeardownRecord {
  return record([
    part("F1", "fuse", ["L", "L1"], 2),
    part("HT1", "load", ["L1", "A"], null, { model: { r: 100 } }),
    part("Q1", "thyristor", { anode: "A", gate: "G", cathode: "N" }),
    part("RA", "resistor", ["A", "G"], ra),
    part("RB", "resistor", ["G", "N"], 1000),
  ]);
}

/** A fused step-up transformer into an emitter (a discharge load) or a resistor. */
export function stepUp(o: {
  ratio: number;
  dischargeLoad: boolean;
  tags?: string[];
}): TeardownRecord {
  const rec = record(
    [
      part("F1", "fuse", ["L", "L1"], 0.5),
      part("T1", "transformer", { p1: "L1", p2: "N", s1: "HV", s2: "RET" }, null, {
        model: { lp: 2, ratio: o.ratio, k: 0.99 },
      }),
      o.dischargeLoad
        ? part("E1", "load", ["HV", "RET"], null, { model: { c: 1e-9 } })
        : part("E1", "load", ["HV", "RET"], null, { model: { r: 10e6 } }),
      part("RG", "resistor", ["RET", "N"], 1e6),
    ],
    { HV: { role: "output" } },
  );
  return { ...rec, device: { ...rec.device, tags: o.tags ?? [] } };
}
