/**
 * overstress-voltage and overstress-power: the solved peak voltage across each part against its
 * voltage rating, and its mean dissipation against its power rating. Choices, documented here:
 * - a capacitor's rating is read as AC RMS when its class is X/Y or its marking shows "~" or
 *   "VAC" (safety capacitors are rated in RMS), and the peak/√2 across it is compared; a plain
 *   rating is DC and the peak is compared;
 * - a resistor without a voltage rating gets the limiting element voltage of its package or
 *   power class (rating-defaults.ts), named in the evidence;
 * - other parts (diodes: reverse voltage) are checked only against a stated rating;
 * - warnings start at 80 % of a DC voltage rating, and for an AC (RMS) rating when the mains'
 *   +10 % would pass it (X/Y parts are rated for their mains with margin built in), and at 50 %
 *   of a power rating (common derating practice); danger at 100 %.
 */
import type { Part } from "../record/types.js";
import type { Flag } from "./flag-types.js";
import { MAINS_CAUTION } from "./flag-types.js";
import { safetyClassOf } from "./capacitor-class.js";
import { powerRating, resistorVoltageRating } from "./rating-defaults.js";
import type { RiskContext } from "./risk-context.js";
import { sig3 } from "./risk-context.js";

/** Fraction of a voltage rating above which a warning is raised (common practice). */
export const VOLTAGE_WARNING_FRACTION = 0.8;
/** An AC-rated part warns when the stress raised by this mains tolerance passes its rating (common practice). */
export const MAINS_HIGH_TOLERANCE = 0.1;
/** Fraction of a power rating above which a warning is raised (the common 50 % derating). */
export const POWER_WARNING_FRACTION = 0.5;

/** True when a capacitor's voltage rating is an AC RMS rating. */
export function isAcRating(p: Part): boolean {
  if (safetyClassOf(p) !== null) return true;
  return /~|V\s*AC|VAC/i.test(p.marking ?? "");
}

interface VoltageLimit {
  stress_v: number;
  limit_v: number;
  basis: string;
  rating_source: string;
  /** Fraction of the limit above which a warning is raised. */
  warnAt: number;
}

function voltageLimit(p: Part, peak: number): VoltageLimit | null {
  if (p.kind === "capacitor") {
    if (p.rating.volts === undefined) return null;
    return isAcRating(p)
      ? {
          stress_v: peak / Math.SQRT2,
          limit_v: p.rating.volts,
          basis: "AC RMS rating against peak/√2",
          rating_source: "the record",
          warnAt: 1 / (1 + MAINS_HIGH_TOLERANCE),
        }
      : {
          stress_v: peak,
          limit_v: p.rating.volts,
          basis: "DC rating against peak",
          rating_source: "the record",
          warnAt: VOLTAGE_WARNING_FRACTION,
        };
  }
  if (p.kind === "resistor") {
    const r = resistorVoltageRating(p);
    return r === null
      ? null
      : {
          stress_v: peak,
          limit_v: r.volts,
          basis: "limiting element voltage against peak",
          rating_source: r.source,
          warnAt: VOLTAGE_WARNING_FRACTION,
        };
  }
  if (p.rating.volts === undefined) return null;
  return {
    stress_v: peak,
    limit_v: p.rating.volts,
    basis: "rated voltage against peak (a diode's reverse rating)",
    rating_source: "the record",
    warnAt: VOLTAGE_WARNING_FRACTION,
  };
}

function severityFor(ratio: number, warnAt: number): "danger" | "warning" | null {
  return ratio > 1 ? "danger" : ratio > warnAt ? "warning" : null;
}

/** The overstress flags of every part the solver figured. */
export function overstressFlags(ctx: RiskContext): Flag[] {
  const flags: Flag[] = [];
  for (const p of ctx.record.parts) {
    const fig = ctx.analysis.parts[p.ref];
    if (fig === undefined) continue;
    const lim = voltageLimit(p, fig.voltage_peak);
    if (lim !== null && lim.limit_v > 0) {
      const ratio = lim.stress_v / lim.limit_v;
      const sev = severityFor(ratio, lim.warnAt);
      if (sev !== null)
        flags.push({
          code: "overstress-voltage",
          severity: sev,
          parts: [p.ref],
          nets: Object.values(p.pins),
          message: `${p.ref} sees ${sig3(lim.stress_v)} V against its ${sig3(lim.limit_v)} V rating (${sig3(100 * ratio)} %; ${lim.basis}).`,
          evidence: {
            peak_v: fig.voltage_peak,
            stress_v: lim.stress_v,
            limit_v: lim.limit_v,
            ratio,
            warning_fraction: lim.warnAt,
            basis: lim.basis,
            rating_source: lim.rating_source,
          },
          source:
            p.kind === "resistor" && lim.rating_source !== "the record"
              ? "resistor limiting element voltage, reference-values.md §8 (FOUND)"
              : "the part's rating; derating thresholds: common practice",
          caution: MAINS_CAUTION,
        });
    }
    const pr = powerRating(p);
    if (pr !== null && pr.watts > 0) {
      const ratio = Math.abs(fig.power) / pr.watts;
      const sev = severityFor(ratio, POWER_WARNING_FRACTION);
      if (sev !== null)
        flags.push({
          code: "overstress-power",
          severity: sev,
          parts: [p.ref],
          nets: Object.values(p.pins),
          message: `${p.ref} dissipates ${sig3(Math.abs(fig.power))} W against its ${sig3(pr.watts)} W rating (${sig3(100 * ratio)} %).`,
          evidence: {
            power_w: Math.abs(fig.power),
            limit_w: pr.watts,
            ratio,
            warning_fraction: POWER_WARNING_FRACTION,
            rating_source: pr.source,
          },
          source: "the part's rating; 50 % derating for a warning: common practice",
          caution:
            "A hot part ages and can fail short or open; check the real temperature before relying on the estimate.",
        });
    }
  }
  return flags;
}
