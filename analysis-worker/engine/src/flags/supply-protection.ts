/**
 * no-fuse and no-surge-limit: the protection in the supply path of a mains-connected circuit.
 * - no-fuse: no fuse in series in a supply chain (blocks/supply-path.ts).
 * - no-surge-limit: the crest switch-on (solved before the checks, figures/risk-variants.ts); a diode whose peak exceeds its
 *   surge rating (rating.surge_amps, else 30 A for a 1 A silicon rectifier), or no series
 *   resistor in any supply chain while the mains-side surge is limited by less than 10 Ω
 *   (supply peak / peak current), i.e. only by parasitic resistance.
 */
import type { Flag } from "./flag-types.js";
import { MAINS_CAUTION, ev } from "./flag-types.js";
import { safetyClassOf } from "./capacitor-class.js";
import { diodeSurgeRating } from "./rating-defaults.js";
import type { RiskContext } from "./risk-context.js";
import { assume, sig3 } from "./risk-context.js";
import { cite } from "./citations.js";
import { SURGE_KINDS } from "../figures/risk-variants.js";

/** A surge limited by less than this (supply peak over peak current) counts as unlimited (common practice). */
export const MIN_SURGE_LIMIT_OHMS = 10;
const SURGE_CAUTION =
  "The simulated peak ignores wiring inductance and capacitor ESR; the real first peak depends on them and on the mains impedance.";

/** The no-fuse flag when a mains circuit has no fuse in its supply path. */
export function fuseFlags(ctx: RiskContext): Flag[] {
  if (ctx.paths.lineNets.length === 0 || ctx.paths.neutralNets.length === 0) return [];
  const inPath = ctx.paths.chains.some((c) =>
    c.steps.some((s) => s.parts.some((p) => p.kind === "fuse")),
  );
  if (inPath) return [];
  const elsewhere = ctx.record.parts.filter((p) => p.kind === "fuse").map((p) => p.ref);
  return [
    {
      code: "no-fuse",
      severity: "warning",
      parts: elsewhere,
      nets: [...ctx.paths.lineNets, ...ctx.paths.neutralNets],
      message:
        elsewhere.length > 0
          ? `There is a fuse (${elsewhere.join(", ")}) but not in series with the supply.`
          : "No fuse in the supply path: a shorted part draws whatever the mains circuit breaker allows.",
      evidence: [
        ev("fuses in the supply path", 0, ""),
        ev("fuses elsewhere", elsewhere.length ? elsewhere.join(", ") : "none", ""),
        ev("supply paths traced", ctx.paths.chains.length, ""),
      ],
      ...cite("common-practice"),
      caution: MAINS_CAUTION,
    },
  ];
}

/** Parts that take the plug-in surge: diodes, LEDs, zeners and capacitors, less the X/Y capacitors straight across the mains. */
function surgeParts(ctx: RiskContext): Set<string> {
  const l = ctx.paths.mainsLine;
  const n = ctx.paths.mainsNeutral;
  return new Set(
    ctx.record.parts
      .filter((p) => SURGE_KINDS.has(p.kind))
      .filter((p) => {
        if (p.kind !== "capacitor") return true;
        const [a, b] = Object.values(p.pins);
        const across =
          a !== undefined && b !== undefined && ((l.has(a) && n.has(b)) || (l.has(b) && n.has(a)));
        return !(across && safetyClassOf(p) !== null);
      })
      .map((p) => p.ref),
  );
}

/** The no-surge-limit flags of a mains circuit. */
export function surgeFlags(ctx: RiskContext): Flag[] {
  if (ctx.solved === null || ctx.paths.lineNets.length === 0) return [];
  const watch = surgeParts(ctx);
  if (watch.size === 0) return [];
  const run = ctx.variants.plugIn;
  if (run === null) return [];
  if (!run.ok) {
    ctx.notes.push(
      `plug-in surge: the run failed (${run.error.code}: ${run.error.message}); no surge flag was computed`,
    );
    return [];
  }
  const { at_s, window_s } = run.value;
  // The run records every part that can take a surge; the X/Y capacitors across the mains are not judged.
  const peak_a = Object.fromEntries(
    Object.entries(run.value.peak_a).filter(([ref]) => watch.has(ref)),
  );
  const flags: Flag[] = [];
  for (const p of ctx.record.parts) {
    if (p.kind !== "diode" || peak_a[p.ref] === undefined) continue;
    const rating = diodeSurgeRating(p);
    assume(ctx, rating.assumption);
    if (peak_a[p.ref]! <= rating.value) continue;
    flags.push({
      code: "no-surge-limit",
      severity: "warning",
      parts: [p.ref],
      nets: Object.values(p.pins),
      message: `Plugged in at the crest, ${p.ref} takes ${sig3(peak_a[p.ref]!)} A, above its ${sig3(rating.value)} A peak surge rating (a non-repetitive peak figure, compared with the peak).`,
      evidence: [
        ev("peak current at switch-on", peak_a[p.ref]!, "A"),
        ev("peak surge rating", rating.value, "A"),
        ev("basis of the surge rating", "non-repetitive peak", ""),
        ev(
          "surge rating taken from",
          rating.assumption === null ? "the record" : rating.assumption.why,
          "",
        ),
        ev("time of the peak after switch-on", at_s[p.ref]!, "s"),
        ev("simulated window", window_s, "s"),
      ],
      ...cite(rating.assumption === null ? "common-practice" : "rectifier-surge"),
      caution: SURGE_CAUTION,
    });
  }
  const mainsSide = [...watch].filter((r) => {
    const part = ctx.record.parts.find((q) => q.ref === r)!;
    return Object.values(part.pins).some((net) => ctx.mainsConnected.has(net));
  });
  if (mainsSide.length === 0) return flags;
  const worst = mainsSide.reduce((a, b) => (peak_a[b]! > peak_a[a]! ? b : a));
  const vpk = ctx.analysis.supply.vrms * Math.SQRT2;
  const limitOhms = peak_a[worst]! > 0 ? vpk / peak_a[worst]! : Infinity;
  const seriesResistor = ctx.paths.chains.some((c) =>
    c.steps.some((s) => s.parts.every((q) => q.kind === "resistor")),
  );
  if (
    !seriesResistor &&
    limitOhms < MIN_SURGE_LIMIT_OHMS &&
    !flags.some((f) => f.parts.includes(worst))
  ) {
    flags.push({
      code: "no-surge-limit",
      severity: "warning",
      parts: [worst],
      nets: [...ctx.paths.lineNets],
      message: `No series resistance limits the plug-in surge: switched on at the crest, ${worst} takes ${sig3(peak_a[worst]!)} A (limited by ${sig3(limitOhms)} Ω of parasitics).`,
      evidence: [
        ev("peak current at switch-on", peak_a[worst]!, "A"),
        ev("supply peak voltage", vpk, "V"),
        ev("resistance limiting the surge", limitOhms, "Ω"),
        ev("least resistance counted as a limit", MIN_SURGE_LIMIT_OHMS, "Ω"),
        ev("series resistors in the supply path", 0, ""),
        ev("simulated window", window_s, "s"),
      ],
      ...cite("common-practice"),
      caution: SURGE_CAUTION,
    });
  }
  return flags;
}
