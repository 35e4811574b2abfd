/**
 * The capacitor-discharge rules for plug pins after unplugging, and the closed-form RC decay
 * they are checked against:
 * - IEC 60335-1, 22.5: disconnected at the voltage peak, the pins must be at ≤ 34 V 1 s later,
 *   for an appliance whose capacitance exceeds 0.1 µF (checked against the document, forum quote of the test text).
 * - IEC 60950-1, 2.1.1.7: a capacitor > 0.1 µF on the mains side needs a discharge time constant
 *   ≤ 1 s for pluggable equipment type A (checked against the document, forum quote of the clause).
 */

/** IEC 60335-1, 22.5 (checked against the document): the pin voltage limit... */
export const PIN_VOLTAGE_LIMIT_V = 34;
/** ...measured this long after disconnection. */
export const PIN_VOLTAGE_DELAY_S = 1;
/** IEC 60335-1, 22.5 note and IEC 60950-1, 2.1.1.7 (checked against the document): capacitances up to 0.1 µF are not considered. */
export const DISCHARGE_CAPACITANCE_THRESHOLD_F = 0.1e-6;
/** IEC 60950-1, 2.1.1.7 (checked against the document): largest discharge time constant for pluggable equipment type A. */
export const TYPE_A_MAX_TIME_CONSTANT_S = 1;
/**
 * Below this equivalent time constant a discharge path exists; above it the pins keep nearly all
 * of their charge for the whole test (V(1 s) ≥ 99 % of V0) and we call the bleeder missing.
 */
export const MISSING_BLEEDER_MIN_TIME_CONSTANT_S = 100;

/** V(t) = V0·e^(−t/RC): the voltage of a capacitor C discharged through R. */
export function rcDischargeVoltage(v0: number, ohms: number, farads: number, t: number): number {
  return v0 * Math.exp(-t / (ohms * farads));
}

/** τ_max = t / ln(V0/V_lim): the largest time constant that reaches V_lim by time t. */
export function maxTimeConstantFor(v0: number, vLimit: number, t: number): number {
  return v0 <= vLimit ? Infinity : t / Math.log(v0 / vLimit);
}

/** R_max = τ_max / C: the largest bleeder that meets the limit. */
export function maxBleederOhms(v0: number, vLimit: number, t: number, farads: number): number {
  return maxTimeConstantFor(v0, vLimit, t) / farads;
}

/** The single time constant that decays V0 to V(t) in time t (RC exactly for an RC discharge). */
export function equivalentTimeConstant(v0: number, vt: number, t: number): number {
  const a = Math.abs(v0);
  const b = Math.abs(vt);
  if (b <= 0) return 0;
  if (b >= a) return Infinity;
  return t / Math.log(a / b);
}

/** The verdicts of both rules on one discharge. */
export function dischargeVerdicts(
  vAfter: number,
  tau: number,
): { exceeds_pin_limit: boolean; exceeds_type_a_tau: boolean } {
  return {
    exceeds_pin_limit: Math.abs(vAfter) > PIN_VOLTAGE_LIMIT_V,
    exceeds_type_a_tau: tau > TYPE_A_MAX_TIME_CONSTANT_S,
  };
}
