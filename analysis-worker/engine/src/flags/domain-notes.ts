/**
 * Information flags of the trade: a high-voltage output (a net above 1 kV peak), and ozone,
 * where the record's category or tags name an ionizer, ozone or air cleaner, or a high-voltage
 * net drives a discharge load (a load modelled as a capacitance). The ozone note carries the
 * commonly cited exposure limits with their sources (OSHA, NIOSH, FDA, CARB, ACGIH values FOUND
 * in copies of the agency pages; IEC 60335-2-65 clause 32 MEMORY).
 */
import type { Flag } from "./flag-types.js";
import { cite } from "./citations.js";
import { ev, evYes } from "./flag-types.js";
import type { RiskContext } from "./risk-context.js";
import { sig3 } from "./risk-context.js";

/** A net above this peak voltage is a high-voltage output (common practice). */
export const HIGH_VOLTAGE_PEAK_V = 1000;
const OZONE_WORDS = /ioni[sz]er|ozone|air (purifier|cleaner)|plasma/i;

/** Commonly cited ozone limits (the first five FOUND, the IEC clause MEMORY). */
export const OZONE_LIMITS: ReadonlyArray<{ limit: string; ppm: number }> = [
  { limit: "OSHA PEL, 8-h TWA (29 CFR 1910.1000 Table Z-1)", ppm: 0.1 },
  { limit: "NIOSH REL, ceiling", ppm: 0.1 },
  { limit: "FDA 21 CFR 801.415, devices that generate ozone", ppm: 0.05 },
  { limit: "California CARB indoor air cleaners (17 CCR 94800 ff.), UL 867 test", ppm: 0.05 },
  { limit: "ACGIH TLV, heavy work", ppm: 0.05 },
  { limit: "IEC 60335-2-65, clause 32", ppm: 0.05 },
];

/** The high-voltage and ozone notes. */
export function domainNotes(ctx: RiskContext): Flag[] {
  const flags: Flag[] = [];
  const hv = Object.entries(ctx.analysis.nets)
    .filter(([, f]) => f.peak > HIGH_VOLTAGE_PEAK_V)
    .map(([n]) => n)
    .sort();
  for (const net of hv) {
    const peak = ctx.analysis.nets[net]!.peak;
    const isOutput = ctx.record.nets[net]?.role === "output";
    flags.push({
      code: "high-voltage-output",
      severity: "info",
      parts: [],
      nets: [net],
      message: `${net}${isOutput ? " (an output)" : ""} reaches ${sig3(peak)} V peak.`,
      evidence: [
        ev("peak voltage", peak, "V"),
        ev("high-voltage threshold", HIGH_VOLTAGE_PEAK_V, "V"),
        evYes("declared an output", isOutput),
      ],
      ...cite("common-practice"),
      caution:
        "High voltage can arc across gaps and through skin; discharge it before touching and keep clear while powered.",
    });
  }
  const words = [ctx.record.device.category ?? "", ...ctx.record.device.tags].join(" ");
  const discharge = ctx.record.parts.filter(
    (p) =>
      p.kind === "load" &&
      p.model.c !== undefined &&
      p.model.r === undefined &&
      Object.values(p.pins).some((n) => hv.includes(n)),
  );
  const byWords = OZONE_WORDS.test(words);
  if (byWords || discharge.length > 0) {
    flags.push({
      code: "ozone",
      severity: "info",
      parts: discharge.map((p) => p.ref),
      nets: [
        ...new Set(discharge.flatMap((p) => Object.values(p.pins)).filter((n) => hv.includes(n))),
      ],
      message:
        (byWords
          ? "The device is described as an ionizer, ozone or air-cleaning device"
          : "A high-voltage output drives a discharge load") +
        "; corona makes ozone. Commonly cited limits: " +
        OZONE_LIMITS.map((l) => `${l.limit} ${l.ppm} ppm`).join("; ") +
        ".",
      evidence: [
        evYes("described as an ozone-making device", byWords),
        ev(
          "discharge loads",
          discharge.length ? discharge.map((p) => p.ref).join(", ") : "none",
          "",
        ),
        ...OZONE_LIMITS.map((l) => ev(l.limit, l.ppm, "ppm")),
      ],
      ...cite("ozone-limits"),
      caution:
        "Ozone irritates lungs at low concentrations: run the device only in a ventilated space and measure, do not estimate, the concentration.",
    });
  }
  return flags;
}
