/**
 * implausible-input: the solved input current or power is beyond what the parts could carry,
 * so the steady state the figures describe cannot exist and a value in the record is most
 * likely wrong (a milli value meant as mega, a missing resistance). Three tests, any one flags:
 * - the input RMS current is more than twice the rating of a fuse in the supply path: the fuse
 *   would open within seconds to minutes, so the circuit could not run on (common practice);
 * - the input RMS current is above 32 A, more than any household plug and socket carries
 *   (common practice);
 * - every part that takes a noticeable share of the input power has a power rating, and the
 *   input power is more than ten times their sum (common practice: "far above" is an order of
 *   magnitude, well past any short overload).
 */
import type { Flag } from "./flag-types.js";
import { cite } from "./citations.js";
import { ev } from "./flag-types.js";
import { powerRating } from "./rating-defaults.js";
import type { RiskContext } from "./risk-context.js";
import { assume, sig3 } from "./risk-context.js";

/** A steady current above this multiple of a fuse's rating opens the fuse (common practice). */
export const FUSE_OPEN_FACTOR = 2;
/** Largest current a household plug and socket carries, in A RMS (common practice). */
export const PLUG_MAX_CURRENT_A = 32;
/** Input power above this multiple of the parts' summed power ratings is implausible. */
export const POWER_RATING_FACTOR = 10;
/** A part taking at least this share of the input power must be rated for the power test to apply. */
export const NOTICEABLE_POWER_SHARE = 0.01;

const CAUTION =
  "The figures of this analysis rest on a record that is probably wrong: check the values as traced before relying on any of them; mains circuits can kill.";

/** The fuses in series in the supply path that state a current rating. */
function supplyFuses(ctx: RiskContext): Array<{ ref: string; amps: number }> {
  const refs = new Set(
    ctx.paths.chains.flatMap((c) =>
      c.steps.flatMap((s) => s.parts.filter((p) => p.kind === "fuse").map((p) => p.ref)),
    ),
  );
  return ctx.record.parts
    .filter((p) => refs.has(p.ref) && p.value !== null && p.value > 0)
    .map((p) => ({ ref: p.ref, amps: p.value! }));
}

/** The summed power ratings of the parts, when every part with a noticeable share is rated; else null. */
function ratedPowerSum(
  ctx: RiskContext,
  inputW: number,
): { watts: number; parts: string[] } | null {
  let watts = 0;
  const parts: string[] = [];
  for (const p of ctx.record.parts) {
    const fig = ctx.analysis.parts[p.ref];
    if (fig === undefined) continue;
    const rated = powerRating(p);
    if (rated === null) {
      if (Math.abs(fig.power) >= NOTICEABLE_POWER_SHARE * inputW) return null;
      continue;
    }
    assume(ctx, rated.assumption);
    watts += rated.value;
    parts.push(p.ref);
  }
  return parts.length > 0 ? { watts, parts } : null;
}

/** The implausible-input flag, when the input figures are beyond what the parts could carry. */
export function implausibleInputFlags(ctx: RiskContext): Flag[] {
  const amps = ctx.analysis.input.current_rms;
  const watts = ctx.analysis.input.power;
  if (!Number.isFinite(amps) || !Number.isFinite(watts)) return [];
  const reasons: string[] = [];
  const evidence = [ev("input current (RMS)", amps, "A"), ev("input power", watts, "W")];
  const parts: string[] = [];
  const fuse = supplyFuses(ctx).sort((a, b) => a.amps - b.amps)[0];
  if (fuse !== undefined && amps > FUSE_OPEN_FACTOR * fuse.amps) {
    reasons.push(
      `more than ${FUSE_OPEN_FACTOR} times the ${sig3(fuse.amps)} A rating of fuse ${fuse.ref}, which would open`,
    );
    evidence.push(ev(`rating of fuse ${fuse.ref}`, fuse.amps, "A"));
    parts.push(fuse.ref);
  }
  if (amps > PLUG_MAX_CURRENT_A) {
    reasons.push(`above the ${PLUG_MAX_CURRENT_A} A that any household plug and socket carries`);
    evidence.push(ev("largest current of a household plug", PLUG_MAX_CURRENT_A, "A"));
  }
  const rated = watts > 0 ? ratedPowerSum(ctx, watts) : null;
  if (rated !== null && watts > POWER_RATING_FACTOR * rated.watts) {
    reasons.push(
      `the ${sig3(watts)} W input power is more than ${POWER_RATING_FACTOR} times the ${sig3(rated.watts)} W the parts are rated to dissipate together`,
    );
    evidence.push(ev("summed power ratings of the parts", rated.watts, "W"));
    parts.push(...rated.parts.filter((r) => !parts.includes(r)));
  }
  if (reasons.length === 0) return [];
  return [
    {
      code: "implausible-input",
      severity: "warning",
      parts,
      nets: [...ctx.paths.lineNets, ...ctx.paths.neutralNets],
      message: `The solved input current of ${sig3(amps)} A RMS (${sig3(watts)} W) is beyond what the parts could carry: ${reasons.join("; ")}. A value in the record is most likely wrong (a milli value meant as mega, a missing resistance).`,
      evidence,
      ...cite("common-practice"),
      caution: CAUTION,
    },
  ];
}
