/**
 * Information flags of the trade: a high-voltage output (a net above 1 kV peak), and ozone,
 * where the record's category or tags name an ionizer, ozone or air cleaner, or a high-voltage
 * net drives a discharge load (a load modelled as a capacitance). The ozone note carries the
 * commonly cited exposure limits with their sources (reference-values.md §9).
 */
import type { Flag } from "./flag-types.js";
import type { RiskContext } from "./risk-context.js";
import { sig3 } from "./risk-context.js";

/** A net above this peak voltage is a high-voltage output (common practice). */
export const HIGH_VOLTAGE_PEAK_V = 1000;
const OZONE_WORDS = /ioni[sz]er|ozone|air (purifier|cleaner)|plasma/i;

/** Commonly cited ozone limits, with their marks. */
export const OZONE_LIMITS: ReadonlyArray<{ limit: string; ppm: number; source: string }> = [
  { limit: "OSHA PEL, 8-h TWA (29 CFR 1910.1000 Table Z-1)", ppm: 0.1, source: "FOUND" },
  { limit: "NIOSH REL, ceiling", ppm: 0.1, source: "FOUND" },
  { limit: "FDA 21 CFR 801.415, devices that generate ozone", ppm: 0.05, source: "FOUND" },
  {
    limit: "California CARB indoor air cleaners (17 CCR 94800 ff.), UL 867 test",
    ppm: 0.05,
    source: "FOUND",
  },
  { limit: "ACGIH TLV, heavy work", ppm: 0.05, source: "FOUND" },
  { limit: "IEC 60335-2-65, clause 32", ppm: 0.05, source: "MEMORY" },
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
      evidence: { peak_v: peak, threshold_v: HIGH_VOLTAGE_PEAK_V, output: isOutput },
      source: "common practice",
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
      evidence: {
        described_as_ozone_device: byWords,
        discharge_loads: discharge.map((p) => p.ref),
        limits: OZONE_LIMITS.map((l) => ({ limit: l.limit, ppm: l.ppm, mark: l.source })),
      },
      source:
        "reference-values.md §9: OSHA PEL and NIOSH REL 0.1 ppm (FOUND), FDA 21 CFR 801.415 0.05 ppm (FOUND), CARB 0.050 ppm (FOUND), IEC 60335-2-65 (MEMORY)",
      caution:
        "Ozone irritates lungs at low concentrations: run the device only in a ventilated space and measure, do not estimate, the concentration.",
    });
  }
  return flags;
}
