/**
 * Model parameters of every simulated kind, with the defaults used when a record gives none.
 * Each default that is used is reported as an assumption in the result, so a reader can see
 * which figures rest on a guessed part.
 */
import type { Assumption } from "../record/gaps-and-assumptions.js";
import type { Part } from "../record/types.js";

/** kT/q at 300 K. */
export const THERMAL_VOLTAGE_V = 0.025865;
/** Off-state resistance of a thyristor or triac main path, and of an open switch. */
export const OFF_STATE_OHMS = 1e9;
/** Closed switch contact. */
export const SWITCH_CLOSED_OHMS = 0.01;
/** Fuse cold resistance when the record does not give model.r. */
export const FUSE_DEFAULT_OHMS = 0.05;
/** Zener test current at which the stated value (Vz) holds, when the record gives no model.iz_test. */
export const ZENER_TEST_CURRENT_A = 5e-3;
/** Thyristor/triac on-state slope resistance when the record gives no model.ron. */
export const ON_STATE_OHMS = 0.1;
/** LED series resistance when the record gives no model.rs. */
export const LED_SERIES_OHMS = 5;
/** LED emission coefficient (the record has no field for it). */
export const LED_EMISSION = 2;
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

/** Why a default model value was used, in plain words. */
const NOT_IN_RECORD = "not in the record; a typical value for the part's kind";

/** Reads a model value or a default, listing the default as an assumption (the one way a model default is chosen). */
export function param(
  p: Part,
  key: string,
  fallback: number,
  assumptions: Assumption[],
  why = NOT_IN_RECORD,
): number {
  const v = p.model[key];
  if (v !== undefined && Number.isFinite(v)) return v;
  assumptions.push({ part: p.ref, field: `model.${key}`, value: fallback, why });
  return fallback;
}

/** The stated value, or a default listed as an assumption. */
function valueOr(p: Part, fallback: number, assumptions: Assumption[], why: string): number {
  if (p.value !== null) return p.value;
  assumptions.push({ part: p.ref, field: "value", value: fallback, why });
  return fallback;
}

/** Shockley diode with series resistance; defaults are a 1 A silicon rectifier (Vf about 1.0 V at 1 A). */
export function diodeModel(p: Part, assumptions: Assumption[]): { j: JunctionParams; rs: number } {
  const rectifier = "not in the record; a 1 A silicon rectifier's value";
  const is = param(p, "is", 5e-9, assumptions, rectifier);
  const n = param(p, "n", 1.9, assumptions, rectifier);
  const rs = param(p, "rs", 0.05, assumptions, rectifier);
  const bv = p.model.bv;
  if (!(bv !== undefined && bv > 0))
    assumptions.push({
      part: p.ref,
      field: "model.bv",
      value: "none",
      why: "no reverse breakdown voltage in the record, so the diode is taken never to break down",
    });
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
export function zenerModel(p: Part, assumptions: Assumption[]): { j: JunctionParams; rs: number } {
  const vz = valueOr(p, 5.1, assumptions, "no zener voltage in the record; a common value");
  const rz = param(p, "rz", 5, assumptions);
  const izt = param(
    p,
    "iz_test",
    ZENER_TEST_CURRENT_A,
    assumptions,
    "not in the record; the stated zener voltage is taken to hold at this test current, a common datasheet test current for small zeners",
  );
  const is = param(
    p,
    "is",
    1e-12,
    assumptions,
    "not in the record; a small silicon junction's value",
  );
  return {
    j: {
      is,
      vt: THERMAL_VOLTAGE_V,
      breakdown: { bv: vz, ib: izt, vtb: THERMAL_VOLTAGE_V },
    },
    rs: rz,
  };
}

/** LED: Shockley (n = 2 and rs = 5 Ω unless given) fitted so the forward voltage is vf at current if. */
export function ledModel(p: Part, assumptions: Assumption[]): { j: JunctionParams; rs: number } {
  const indicator = "not in the record; a small indicator LED's value";
  const vf = param(p, "vf", 2.0, assumptions, indicator);
  const iF = param(p, "if", 0.02, assumptions, indicator);
  const n = param(p, "n", LED_EMISSION, assumptions, indicator);
  const rs = param(p, "rs", LED_SERIES_OHMS, assumptions, indicator);
  const vt = n * THERMAL_VOLTAGE_V;
  const is = iF / Math.expm1(Math.max(vf - iF * rs, 0.1) / vt);
  return { j: { is, vt, breakdown: null }, rs };
}

/** Varistor power law I = 1 mA (V/Vc)^alpha, symmetric. */
export function varistorModel(
  p: Part,
  assumptions: Assumption[],
): { vc: number; alpha: number; i0: number } {
  const vc = valueOr(
    p,
    470,
    assumptions,
    "no varistor voltage in the record; a common value for 230 V mains",
  );
  const alpha = param(
    p,
    "alpha",
    30,
    assumptions,
    "not in the record; a typical metal-oxide varistor's nonlinearity exponent",
  );
  return { vc, alpha, i0: VARISTOR_REFERENCE_CURRENT_A };
}

/** Thyristor (sensitive gate defaults) or triac (logic-level defaults) parameters. */
export function switchingModel(
  p: Part,
  triac: boolean,
  assumptions: Assumption[],
): SwitchingParams {
  const typical = triac
    ? "not in the record; a logic-level triac's value"
    : "not in the record; a sensitive-gate thyristor's value";
  const vgt = param(p, "vgt", triac ? 0.8 : 0.6, assumptions, typical);
  const igt = param(p, "igt", triac ? 5e-3 : 200e-6, assumptions, typical);
  const ih = param(p, "ih", triac ? 10e-3 : 5e-3, assumptions, typical);
  const von = param(p, "von", triac ? 1.2 : 1.0, assumptions, typical);
  const ron = param(p, "ron", ON_STATE_OHMS, assumptions, typical);
  // The gate junction (n = 1) is fitted so it passes exactly igt at vgt.
  const gate: JunctionParams = {
    is: igt / Math.expm1(vgt / THERMAL_VOLTAGE_V),
    vt: THERMAL_VOLTAGE_V,
    breakdown: null,
  };
  return { vgt, igt, ih, von, ron, gate };
}

/**
 * Default winding time constant L/R (s) where the record gives no winding resistance: about a
 * Q of 16 at 50 Hz, the order of a small mains transformer's primary (a 10 H primary of a few VA
 * measures a couple of hundred ohms; common practice). Both windings get the same L/R, since
 * resistance and inductance both grow with the square of the turns in a shared window. A
 * near-lossless default (0.1 Ω on 10 H) would keep any DC flux offset for minutes (L/R = 100 s)
 * and turn the integration's tiny volt-second error into a DC primary current of milliamps.
 */
export const WINDING_TIME_CONSTANT_S = 0.05;
/** ...but never below this (Ω): a small pulse transformer's winding of a few turns still measures about this much. */
export const WINDING_MIN_OHMS = 0.1;

/**
 * Transformer windings as coupled inductors. `ratio` is the turns ratio Np/Ns (20 steps 230 V
 * down to 11.5 V, 0.05 steps it up to 4.6 kV): Ls = lp / ratio², M = k sqrt(Lp Ls).
 */
export function transformerModel(
  p: Part,
  assumptions: Assumption[],
): { lp: number; ls: number; m: number; rp: number; rs: number } {
  const small = "not in the record; a small mains transformer's value";
  const lp = param(p, "lp", 0.1, assumptions, small);
  const ratio = param(p, "ratio", 1, assumptions, "not in the record; windings taken as equal");
  const kGiven = param(p, "k", 0.99, assumptions, small);
  const k = Math.min(kGiven, MAX_COUPLING);
  if (k < kGiven)
    assumptions.push({
      part: p.ref,
      field: "model.k",
      value: k,
      why: "a coupling of 1 is taken as just below 1, so the windings stay solvable",
    });
  const ls = lp / (ratio * ratio);
  const byTau = `not in the record; a small mains transformer's winding (L/R = ${WINDING_TIME_CONSTANT_S * 1000} ms)`;
  const byL = (l: number) => Math.max(WINDING_MIN_OHMS, l / WINDING_TIME_CONSTANT_S);
  const rp = param(p, "rp", byL(lp), assumptions, byTau);
  const rs = param(p, "rs", byL(ls), assumptions, byTau);
  return { lp, ls, m: k * Math.sqrt(lp * ls), rp, rs };
}
