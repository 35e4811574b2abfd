/**
 * Ratings used when a record gives none: a resistor's limiting element voltage, overload voltage
 * and power by package or power class, and a 1 A silicon rectifier's surge current. Each default
 * comes back with the assumption that names it, so the result lists what the checks stood on.
 *
 * Values from the Yageo CFR (carbon film) and RC (thick-film chip) datasheet tables, FOUND in
 * vendor copies; the 0603 row is the older, lower 50 V (75 V in newer sheets, MEMORY). Both
 * families state the limiting element voltage as "DC or AC RMS" and the overload voltage as a
 * short-time (5 s) figure, which is why the checks compare them with RMS and peak respectively.
 */
import type { Assumption } from "../record/gaps-and-assumptions.js";
import type { Part } from "../record/types.js";

/** One package's row: limiting element voltage (V, DC or AC RMS), overload voltage (V), power (W). */
interface ResistorRow {
  volts: number;
  overloadVolts: number;
  watts: number;
  family: string;
}

const CFR = "carbon-film resistor datasheet table (Yageo CFR series)";
const RC = "thick-film chip resistor datasheet table (Yageo RC series)";

const RESISTOR_ROWS: Record<string, ResistorRow> = {
  "CFR-25": { volts: 250, overloadVolts: 500, watts: 0.25, family: CFR },
  CFR25S: { volts: 200, overloadVolts: 400, watts: 0.25, family: CFR },
  "CFR-12": { volts: 150, overloadVolts: 300, watts: 1 / 6, family: CFR },
  "CFR-50": { volts: 350, overloadVolts: 700, watts: 0.5, family: CFR },
  "0201": { volts: 25, overloadVolts: 50, watts: 1 / 20, family: RC },
  "0402": { volts: 50, overloadVolts: 100, watts: 1 / 16, family: RC },
  "0603": { volts: 50, overloadVolts: 100, watts: 1 / 10, family: RC },
  "0805": { volts: 150, overloadVolts: 300, watts: 1 / 8, family: RC },
  "1206": { volts: 200, overloadVolts: 400, watts: 1 / 4, family: RC },
  // The table gives 1/3–1 W for 1210/2010/2512; the low end is taken.
  "1210": { volts: 200, overloadVolts: 400, watts: 1 / 3, family: RC },
  "2010": { volts: 200, overloadVolts: 400, watts: 1 / 3, family: RC },
  "2512": { volts: 200, overloadVolts: 400, watts: 1 / 3, family: RC },
};

/** A through-hole resistor known only by its power class is taken as the carbon-film part of that class. */
const PACKAGE_BY_WATTS: Array<{ watts: number; key: string; words: string }> = [
  { watts: 1 / 6, key: "CFR-12", words: "1/6 W" },
  { watts: 0.25, key: "CFR-25", words: "1/4 W" },
  { watts: 0.5, key: "CFR-50", words: "1/2 W" },
];

/** 1N400x I_FSM, 8.3 ms half-sine (checked against the document in several vendor datasheets). */
export const RECTIFIER_SURGE_DEFAULT_A = 30;

/** A rating and, when the record did not give it, the assumption that stands in for it. */
export interface Rated {
  value: number;
  /** Null when the value is the record's own. */
  assumption: Assumption | null;
}

/** The package row of a resistor (by its package, else its power class) and how it was chosen. */
function resistorRow(p: Part): { key: string; row: ResistorRow; how: string } | null {
  if (p.kind !== "resistor") return null;
  const raw = p.rating.package?.trim().toUpperCase().replace(/\s+/g, "") ?? null;
  if (raw !== null) {
    const key = Object.keys(RESISTOR_ROWS).find(
      (k) => k.toUpperCase() === raw || k.replace("-", "").toUpperCase() === raw.replace("-", ""),
    );
    if (key !== undefined) return { key, row: RESISTOR_ROWS[key]!, how: `a ${key} resistor` };
  }
  const w = p.rating.watts;
  const byWatts =
    w === undefined ? undefined : PACKAGE_BY_WATTS.find((r) => Math.abs(r.watts - w) < 1e-9);
  if (byWatts === undefined) return null;
  return {
    key: byWatts.key,
    row: RESISTOR_ROWS[byWatts.key]!,
    how: `a ${byWatts.words} through-hole resistor taken as ${byWatts.key}`,
  };
}

/** A resistor's limiting element voltage (DC or AC RMS): the record's, else by package or power class. */
export function resistorVoltageRating(p: Part): Rated | null {
  if (p.rating.volts !== undefined) return { value: p.rating.volts, assumption: null };
  const r = resistorRow(p);
  if (r === null) return null;
  return {
    value: r.row.volts,
    assumption: {
      part: p.ref,
      field: "rating.volts",
      value: r.row.volts,
      why: `limiting element voltage (DC or AC RMS) of ${r.how}, from the ${r.row.family}`,
    },
  };
}

/**
 * A resistor's short-time overload voltage (a peak figure), known only from its package or power
 * class. When the record states the limiting element voltage, the package's overload-to-limiting
 * ratio is applied to the stated figure instead: a part rated above its package's row (a
 * high-voltage type in a 1/2 W body) has an overload figure above it too, never one below its
 * own continuous rating.
 */
export function resistorOverloadRating(p: Part): Rated | null {
  const r = resistorRow(p);
  if (r === null) return null;
  const stated = p.rating.volts;
  const value =
    stated === undefined ? r.row.overloadVolts : stated * (r.row.overloadVolts / r.row.volts);
  const why =
    stated === undefined
      ? `short-time overload voltage of ${r.how}, from the ${r.row.family}`
      : `the stated limiting element voltage times the overload-to-limiting ratio (${r.row.overloadVolts / r.row.volts}) of ${r.how}, from the ${r.row.family}`;
  return { value, assumption: { part: p.ref, field: "rating.overload_volts", value, why } };
}

/** A part's power rating: the record's, else (resistors) by package; null when unknown. */
export function powerRating(p: Part): Rated | null {
  if (p.rating.watts !== undefined) return { value: p.rating.watts, assumption: null };
  const r = resistorRow(p);
  if (r === null) return null;
  return {
    value: r.row.watts,
    assumption: {
      part: p.ref,
      field: "rating.watts",
      value: r.row.watts,
      why: `rated power of ${r.how}, from the ${r.row.family}`,
    },
  };
}

/** A diode's surge rating: the record's, else the 1 A silicon rectifier's 30 A. */
export function diodeSurgeRating(p: Part): Rated {
  if (p.rating.surge_amps !== undefined) return { value: p.rating.surge_amps, assumption: null };
  return {
    value: RECTIFIER_SURGE_DEFAULT_A,
    assumption: {
      part: p.ref,
      field: "rating.surge_amps",
      value: RECTIFIER_SURGE_DEFAULT_A,
      why: "peak surge current (8.3 ms half-sine) of a 1 A silicon rectifier, from 1N4001–1N4007 datasheets",
    },
  };
}
