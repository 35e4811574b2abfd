/**
 * Ratings used when a record gives none (reference-values.md §8): a resistor's limiting element
 * voltage and power by package or power class, and a 1 A silicon rectifier's surge current.
 * Every value used is named in the flag's evidence with its mark, so a reader sees the guess.
 */
import type { Part } from "../record/types.js";

/** A default rating with where it comes from. */
export interface DefaultRating {
  value: number;
  source: string;
}

const YAGEO_CFR = "Yageo CFR datasheet (FOUND, reference-values.md §8)";
const YAGEO_RC = "Yageo RC chip datasheet (FOUND, reference-values.md §8)";

/** Limiting element voltage (max working voltage) by package or power class. */
const RESISTOR_VOLTS_BY_PACKAGE: Record<string, DefaultRating> = {
  "CFR-25": { value: 250, source: YAGEO_CFR },
  CFR25S: { value: 200, source: YAGEO_CFR },
  "CFR-12": { value: 150, source: YAGEO_CFR },
  "CFR-50": { value: 350, source: YAGEO_CFR },
  "0201": { value: 25, source: YAGEO_RC },
  "0402": { value: 50, source: YAGEO_RC },
  // 75 V in newer sheets (MEMORY, vendor-dependent); the conservative 50 V is FOUND.
  "0603": { value: 50, source: YAGEO_RC },
  "0805": { value: 150, source: YAGEO_RC },
  "1206": { value: 200, source: YAGEO_RC },
  "1210": { value: 200, source: YAGEO_RC },
  "2010": { value: 200, source: YAGEO_RC },
  "2512": { value: 200, source: YAGEO_RC },
};

/** Rated power by package (the power column of the same tables). */
const RESISTOR_WATTS_BY_PACKAGE: Record<string, DefaultRating> = {
  "CFR-25": { value: 0.25, source: YAGEO_CFR },
  CFR25S: { value: 0.25, source: YAGEO_CFR },
  "CFR-12": { value: 1 / 6, source: YAGEO_CFR },
  "CFR-50": { value: 0.5, source: YAGEO_CFR },
  "0201": { value: 1 / 20, source: YAGEO_RC },
  "0402": { value: 1 / 16, source: YAGEO_RC },
  "0603": { value: 1 / 10, source: YAGEO_RC },
  "0805": { value: 1 / 8, source: YAGEO_RC },
  "1206": { value: 1 / 4, source: YAGEO_RC },
  // The table gives 1/3–1 W for 1210/2010/2512; the low end is taken.
  "1210": { value: 1 / 3, source: YAGEO_RC },
  "2010": { value: 1 / 3, source: YAGEO_RC },
  "2512": { value: 1 / 3, source: YAGEO_RC },
};

/** A through-hole resistor known only by its power class: the carbon-film part of that class. */
const RESISTOR_VOLTS_BY_WATTS: Array<{ watts: number; rating: DefaultRating }> = [
  { watts: 1 / 6, rating: { value: 150, source: `${YAGEO_CFR}, CFR-12 taken for a 1/6 W part` } },
  { watts: 0.25, rating: { value: 250, source: `${YAGEO_CFR}, CFR-25 taken for a 1/4 W part` } },
  { watts: 0.5, rating: { value: 350, source: `${YAGEO_CFR}, CFR-50 taken for a 1/2 W part` } },
];

/** 1N400x I_FSM, 8.3 ms half-sine (FOUND in several vendor datasheets, reference-values.md §8). */
export const RECTIFIER_SURGE_DEFAULT_A = 30;

function packageKey(p: Part): string | null {
  const raw = p.rating.package?.trim().toUpperCase().replace(/\s+/g, "") ?? null;
  if (raw === null) return null;
  const key = Object.keys(RESISTOR_VOLTS_BY_PACKAGE).find(
    (k) => k.toUpperCase() === raw || k.replace("-", "").toUpperCase() === raw.replace("-", ""),
  );
  return key ?? null;
}

/** A resistor's voltage limit: the record's, else by package, else by power class; null when unknown. */
export function resistorVoltageRating(
  p: Part,
): { volts: number; source: string; assumed: boolean } | null {
  if (p.rating.volts !== undefined)
    return { volts: p.rating.volts, source: "the record", assumed: false };
  const key = packageKey(p);
  if (key !== null)
    return {
      volts: RESISTOR_VOLTS_BY_PACKAGE[key]!.value,
      source: `default for ${key}: ${RESISTOR_VOLTS_BY_PACKAGE[key]!.source}`,
      assumed: true,
    };
  const w = p.rating.watts;
  const byWatts =
    w === undefined ? undefined : RESISTOR_VOLTS_BY_WATTS.find((r) => Math.abs(r.watts - w) < 1e-9);
  if (byWatts !== undefined)
    return {
      volts: byWatts.rating.value,
      source: `default: ${byWatts.rating.source}`,
      assumed: true,
    };
  return null;
}

/** A part's power rating: the record's, else (resistors) by package; null when unknown. */
export function powerRating(p: Part): { watts: number; source: string; assumed: boolean } | null {
  if (p.rating.watts !== undefined)
    return { watts: p.rating.watts, source: "the record", assumed: false };
  if (p.kind !== "resistor") return null;
  const key = packageKey(p);
  if (key === null) return null;
  return {
    watts: RESISTOR_WATTS_BY_PACKAGE[key]!.value,
    source: `default for ${key}: ${RESISTOR_WATTS_BY_PACKAGE[key]!.source}`,
    assumed: true,
  };
}

/** A diode's surge rating: the record's, else the 1 A silicon rectifier's 30 A. */
export function diodeSurgeRating(p: Part): { amps: number; source: string; assumed: boolean } {
  if (p.rating.surge_amps !== undefined)
    return { amps: p.rating.surge_amps, source: "the record", assumed: false };
  return {
    amps: RECTIFIER_SURGE_DEFAULT_A,
    source: "default: 1N400x I_FSM 30 A (FOUND, reference-values.md §8)",
    assumed: true,
  };
}
