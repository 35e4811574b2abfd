/**
 * overstress-voltage and overstress-power: the solved voltage across each part against its
 * voltage ratings, each on the basis the rating is stated in (rating-basis.ts), and its mean
 * dissipation against its power rating. A rating the record does not give is taken by package
 * where one is known (rating-defaults.ts) and listed in the assessment's assumptions.
 * Power: warning past 50 % of the rating (the common derating), danger past 100 %.
 */
import type { Part } from "../record/types.js";
import type { Flag } from "./flag-types.js";
import { MAINS_CAUTION, ev, evPercent } from "./flag-types.js";
import { cite } from "./citations.js";
import { powerRating } from "./rating-defaults.js";
import type { VoltageCheck } from "./rating-basis.js";
import { checkSeverity, voltageChecks } from "./rating-basis.js";
import type { RiskContext } from "./risk-context.js";
import { assume, sig3, voltageBetween } from "./risk-context.js";

/** Fraction of a power rating above which a warning is raised (the common 50 % derating). */
export const POWER_WARNING_FRACTION = 0.5;

const SEVERITY_RANK = { danger: 2, warning: 1 } as const;

/** The RMS voltage across a part's first two pins (a resistor's I·R when a net has no waveform), or null. */
function rmsAcross(ctx: RiskContext, p: Part, currentRms: number): number | null {
  const [a, b] = Object.values(p.pins);
  const between = a !== undefined && b !== undefined ? voltageBetween(ctx, a, b) : null;
  if (between !== null) return between.rms_v;
  // Ohm's law holds at every instant across a resistor, so its RMS voltage is I_rms·R.
  return p.kind === "resistor" && p.value !== null ? currentRms * p.value : null;
}

function checkWords(c: VoltageCheck): string {
  return `${sig3(c.stress_v)} V ${c.basis} against its ${sig3(c.limit_v)} V ${c.rating} (${sig3((100 * c.stress_v) / c.limit_v)} %)`;
}

function voltageFlag(ctx: RiskContext, p: Part, peakV: number, currentRms: number): Flag | null {
  const checks = voltageChecks(p, peakV, rmsAcross(ctx, p, currentRms)).filter(
    (c) => c.limit_v > 0,
  );
  // A check that passes stands on its default as much as one that fails: list it either way.
  for (const c of checks) assume(ctx, c.assumption);
  const judged = checks
    .map((c) => ({ c, sev: checkSeverity(c) }))
    .filter((x): x is { c: VoltageCheck; sev: "danger" | "warning" } => x.sev !== null)
    .sort(
      (x, y) =>
        SEVERITY_RANK[y.sev] - SEVERITY_RANK[x.sev] ||
        y.c.stress_v / y.c.limit_v - x.c.stress_v / x.c.limit_v,
    );
  const worst = judged[0];
  if (worst === undefined) return null;
  const others = checks.filter((c) => c !== worst.c);
  const assumed = checks.filter((c) => c.assumption !== null).map((c) => c.rating);
  const isResistor = p.kind === "resistor";
  return {
    code: "overstress-voltage",
    severity: worst.sev,
    parts: [p.ref],
    nets: Object.values(p.pins),
    message:
      `${p.ref} sees ${checkWords(worst.c)}: the ${worst.c.basis} voltage is compared because the ${worst.c.rating} is stated on that basis.` +
      others.map((c) => ` It sees ${checkWords(c)}.`).join("") +
      (assumed.length > 0
        ? ` The ${assumed.join(" and the ")} ${assumed.length > 1 ? "are defaults" : "is a default"} for its package or power class, not read from the part.`
        : ""),
    evidence: checks.flatMap((c) => [
      ev(`${c.basis} voltage across the part`, c.stress_v, "V"),
      ev(c.rating, c.limit_v, "V"),
      evPercent(`${c.basis} voltage against the ${c.rating}`, c.stress_v / c.limit_v),
      evPercent(`warning threshold of the ${c.rating}`, c.warnAt),
      ev(`basis of the ${c.rating}`, c.basis, ""),
      ev(`${c.rating} taken from`, c.assumption === null ? "the record" : c.assumption.why, ""),
    ]),
    ...cite(isResistor && assumed ? "resistor-datasheet-ratings" : "part-rating"),
    caution: MAINS_CAUTION,
  };
}

function powerFlag(ctx: RiskContext, p: Part, powerW: number): Flag | null {
  const pr = powerRating(p);
  if (pr === null || pr.value <= 0) return null;
  assume(ctx, pr.assumption);
  const ratio = Math.abs(powerW) / pr.value;
  const sev = ratio > 1 ? "danger" : ratio > POWER_WARNING_FRACTION ? "warning" : null;
  if (sev === null) return null;
  return {
    code: "overstress-power",
    severity: sev,
    parts: [p.ref],
    nets: Object.values(p.pins),
    message: `${p.ref} dissipates ${sig3(Math.abs(powerW))} W on average against its ${sig3(pr.value)} W rated continuous power (${sig3(100 * ratio)} %).`,
    evidence: [
      ev("mean dissipation", Math.abs(powerW), "W"),
      ev("rated power", pr.value, "W"),
      evPercent("dissipation against the rated power", ratio),
      evPercent("warning threshold of the rated power", POWER_WARNING_FRACTION),
      ev("basis of the rated power", "continuous (mean)", ""),
      ev("rated power taken from", pr.assumption === null ? "the record" : pr.assumption.why, ""),
    ],
    ...cite(pr.assumption !== null ? "resistor-datasheet-ratings" : "power-derating"),
    caution:
      "A hot part ages and can fail short or open; check the real temperature before relying on the estimate.",
  };
}

/** The overstress flags of every part the solver figured. */
export function overstressFlags(ctx: RiskContext): Flag[] {
  const flags: Flag[] = [];
  for (const p of ctx.record.parts) {
    const fig = ctx.analysis.parts[p.ref];
    if (fig === undefined) continue;
    const v = voltageFlag(ctx, p, fig.voltage_peak, fig.current_rms);
    if (v !== null) flags.push(v);
    const w = powerFlag(ctx, p, fig.power);
    if (w !== null) flags.push(w);
  }
  return flags;
}
