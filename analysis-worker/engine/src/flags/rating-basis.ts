/**
 * Each voltage rating compared on the basis it is stated in (datasheet convention):
 * - a resistor's limiting element voltage is "DC or AC RMS": the RMS voltage across it is
 *   compared (a continuous stress); its short-time overload voltage, where the package is known,
 *   against the peak. A 1/4 W carbon-film bleeder with 229 V RMS across it is therefore at 92 %
 *   of its 250 V, and its 324 V peak at 65 % of its 500 V overload: a warning, not a danger;
 * - a capacitor rated AC (class X/Y, or "~"/"VAC" in its marking) against the RMS voltage, a
 *   plain (DC) capacitor rating against the peak;
 * - varistors, fuses, switches, transformers and loads are mains parts rated in AC RMS;
 * - semiconductors (diodes, zeners, LEDs, thyristors, triacs) are rated by a repetitive peak
 *   (V_RRM, V_DRM): against the peak.
 * Warnings start at 80 % of a DC or peak rating and, for an AC RMS rating, where a +10 % mains
 * would pass it (common practice); danger at 100 %.
 */
import type { Assumption } from "../record/gaps-and-assumptions.js";
import type { Part } from "../record/types.js";
import { safetyClassOf } from "./capacitor-class.js";
import { resistorOverloadRating, resistorVoltageRating } from "./rating-defaults.js";

/** Fraction of a DC or peak voltage rating above which a warning is raised (common practice). */
export const VOLTAGE_WARNING_FRACTION = 0.8;
/** An AC-rated part warns when the stress raised by this mains tolerance passes its rating (common practice). */
export const MAINS_HIGH_TOLERANCE = 0.1;

const RMS_RATED_KINDS = new Set(["varistor", "fuse", "switch", "transformer", "load"]);

/** One comparison of a voltage stress with a rating. */
export interface VoltageCheck {
  /** Which voltage is compared: the RMS (continuous) or the peak. */
  basis: "RMS" | "peak";
  /** The rating's name in words ("limiting element voltage", "DC rating"). */
  rating: string;
  stress_v: number;
  limit_v: number;
  /** Fraction of the limit above which a warning is raised. */
  warnAt: number;
  assumption: Assumption | null;
}

/** True when a capacitor's voltage rating is an AC RMS rating. */
export function isAcRating(p: Part): boolean {
  if (safetyClassOf(p) !== null) return true;
  return /~|V\s*AC|VAC/i.test(p.marking ?? "");
}

const AC_WARN = 1 / (1 + MAINS_HIGH_TOLERANCE);

/**
 * The voltage checks of one part, given its solved peak voltage and the RMS voltage across it
 * (null when the solver gives none; then RMS-based checks are skipped).
 */
export function voltageChecks(p: Part, peakV: number, rmsV: number | null): VoltageCheck[] {
  const rms = (rating: string, limit: number, warnAt: number, a: Assumption | null) =>
    rmsV === null
      ? []
      : [{ basis: "RMS" as const, rating, stress_v: rmsV, limit_v: limit, warnAt, assumption: a }];
  const peak = (rating: string, limit: number, a: Assumption | null): VoltageCheck[] => [
    {
      basis: "peak",
      rating,
      stress_v: peakV,
      limit_v: limit,
      warnAt: VOLTAGE_WARNING_FRACTION,
      assumption: a,
    },
  ];
  if (p.kind === "resistor") {
    const cont = resistorVoltageRating(p);
    const over = resistorOverloadRating(p);
    return [
      ...(cont === null
        ? []
        : rms("limiting element voltage", cont.value, VOLTAGE_WARNING_FRACTION, cont.assumption)),
      ...(over === null ? [] : peak("overload voltage", over.value, over.assumption)),
    ];
  }
  const stated = p.rating.volts;
  if (stated === undefined) return [];
  if (p.kind === "capacitor")
    return isAcRating(p)
      ? rms("AC rating", stated, AC_WARN, null)
      : peak("DC rating", stated, null);
  if (RMS_RATED_KINDS.has(p.kind)) return rms("AC rating", stated, AC_WARN, null);
  return peak("repetitive peak rating", stated, null);
}

/** The severity of one check: danger past the limit, warning past its warning fraction. */
export function checkSeverity(c: VoltageCheck): "danger" | "warning" | null {
  const ratio = c.stress_v / c.limit_v;
  return ratio > 1 ? "danger" : ratio > c.warnAt ? "warning" : null;
}
