/**
 * Model parameters of every simulated kind, with the defaults used when a record gives none.
 * Each default that is used is reported as an assumption in the result, so a reader can see
 * which figures rest on a guessed part.
 */
import type { Part } from "../record/types.js";

/** kT/q at 300 K. */
export const THERMAL_VOLTAGE_V = 0.025865;
/** Off-state resistance of a thyristor or triac main path, and of an open switch. */
export const OFF_STATE_OHMS = 1e9;
/** Closed switch contact. */
export const SWITCH_CLOSED_OHMS = 0.01;
/** Fuse cold resistance when the record does not give model.r. */
export const FUSE_DEFAULT_OHMS = 0.05;
/** Zener test current at which the stated value (Vz) holds. */
export const ZENER_TEST_CURRENT_A = 5e-3;
/** Current at which a diode's optional breakdown voltage bv is reached. */
export const BREAKDOWN_KNEE_CURRENT_A = 1e-3;
/** Varistor current at its stated clamping voltage (the trade's 1 mA point). */
export const VARISTOR_REFERENCE_CURRENT_A = 1e-3;
/** Largest coupling factor used, so the winding inductance matrix stays invertible. */
export const MAX_COUPLING = 0.999999;

/** A pn junction: i = is (e^{v/vt} - 1) - ib e^{-(v + bv)/vtb} when breakdown is set. */
export interface JunctionParams {
  is: number;
  vt: number;
  breakdown: { bv: number; ib: number; vtb: number } | null;
}

/** The thyristor/triac parameters after defaults. */
export interface SwitchingParams {
  vgt: number;
  igt: number;
  ih: number;
  von: number;
  ron: number;
  gate: JunctionParams;
}

/** Reads a model value or a default, noting the default as an assumption. */
function param(
  p: Part,
  key: string,
  fallback: number,
  unit: string,
  assumptions: string[],
): number {
  const v = p.model[key];
  if (v !== undefined && Number.isFinite(v)) return v;
  assumptions.push(`${p.ref}: ${key} = ${fallback} ${unit} (not in the record)`);
  return fallback;
}

/** Shockley diode with series resistance; defaults are a 1 A silicon rectifier (Vf about 1.0 V at 1 A). */
export function diodeModel(p: Part, assumptions: string[]): { j: JunctionParams; rs: number } {
  const is = param(p, "is", 5e-9, "A", assumptions);
  const n = param(p, "n", 1.9, "", assumptions);
  const rs = param(p, "rs", 0.05, "Ω", assumptions);
  const bv = p.model.bv;
  return {
    j: {
      is,
      vt: n * THERMAL_VOLTAGE_V,
      breakdown:
        bv !== undefined && bv > 0
          ? { bv, ib: BREAKDOWN_KNEE_CURRENT_A, vtb: THERMAL_VOLTAGE_V }
          : null,
    },
    rs,
  };
}

/** Zener: a forward silicon junction plus a reverse breakdown passing the test current at Vz, in series with rz. */
export function zenerModel(p: Part, assumptions: string[]): { j: JunctionParams; rs: number } {
  const vz = p.value ?? 5.1;
  if (p.value === null) assumptions.push(`${p.ref}: Vz = 5.1 V (no value in the record)`);
  const rz = param(p, "rz", 5, "Ω", assumptions);
  return {
    j: {
      is: 1e-12,
      vt: THERMAL_VOLTAGE_V,
      breakdown: { bv: vz, ib: ZENER_TEST_CURRENT_A, vtb: THERMAL_VOLTAGE_V },
    },
    rs: rz,
  };
}

/** LED: Shockley with n = 2 and rs = 5 Ω fitted so the forward voltage is vf at current if. */
export function ledModel(p: Part, assumptions: string[]): { j: JunctionParams; rs: number } {
  const vf = param(p, "vf", 2.0, "V", assumptions);
  const iF = param(p, "if", 0.02, "A", assumptions);
  const n = 2;
  const rs = p.model.rs ?? 5;
  const vt = n * THERMAL_VOLTAGE_V;
  const is = iF / Math.expm1(Math.max(vf - iF * rs, 0.1) / vt);
  return { j: { is, vt, breakdown: null }, rs };
}

/** Varistor power law I = 1 mA (V/Vc)^alpha, symmetric. */
export function varistorModel(
  p: Part,
  assumptions: string[],
): { vc: number; alpha: number; i0: number } {
  const vc = p.value ?? 470;
  if (p.value === null)
    assumptions.push(`${p.ref}: clamping voltage 470 V at 1 mA (no value in the record)`);
  const alpha = param(p, "alpha", 30, "", assumptions);
  return { vc, alpha, i0: VARISTOR_REFERENCE_CURRENT_A };
}

/** Thyristor (sensitive gate defaults) or triac (logic-level defaults) parameters. */
export function switchingModel(p: Part, triac: boolean, assumptions: string[]): SwitchingParams {
  const vgt = param(p, "vgt", triac ? 0.8 : 0.6, "V", assumptions);
  const igt = param(p, "igt", triac ? 5e-3 : 200e-6, "A", assumptions);
  const ih = param(p, "ih", triac ? 10e-3 : 5e-3, "A", assumptions);
  const von = param(p, "von", triac ? 1.2 : 1.0, "V", assumptions);
  const ron = p.model.ron ?? 0.1;
  // The gate junction (n = 1) is fitted so it passes exactly igt at vgt.
  const gate: JunctionParams = {
    is: igt / Math.expm1(vgt / THERMAL_VOLTAGE_V),
    vt: THERMAL_VOLTAGE_V,
    breakdown: null,
  };
  return { vgt, igt, ih, von, ron, gate };
}

/** Transformer windings as coupled inductors: Ls = lp / ratio², M = k sqrt(Lp Ls). */
export function transformerModel(
  p: Part,
  assumptions: string[],
): { lp: number; ls: number; m: number; rp: number; rs: number } {
  const lp = param(p, "lp", 0.1, "H", assumptions);
  const ratio = param(p, "ratio", 1, "", assumptions);
  const k = Math.min(param(p, "k", 0.99, "", assumptions), MAX_COUPLING);
  const rp = param(p, "rp", 0.1, "Ω", assumptions);
  const rs = param(p, "rs", 0.1, "Ω", assumptions);
  const ls = lp / (ratio * ratio);
  return { lp, ls, m: k * Math.sqrt(lp * ls), rp, rs };
}
