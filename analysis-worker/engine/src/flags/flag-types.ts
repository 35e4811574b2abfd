/**
 * What the risk assessment returns: flags (each with its labelled numbers, the document it
 * stands on and a caution), the measured-versus-predicted comparisons, and the defaults the
 * checks chose where the record was silent.
 */
import type { Assumption, Evidence, Gap } from "../record/gaps-and-assumptions.js";
import type { SolvedCircuit } from "../figures/solved-variant.js";
import type { Comparison } from "../figures/measurement-comparisons.js";
import type { CitationId } from "./citations.js";

export type { Comparison };

/** Every flag code the assessment can raise. */
export const FLAG_CODES = [
  "accessible-mains",
  "no-fuse",
  "no-surge-limit",
  "bleeder-missing",
  "bleeder-slow",
  "capacitor-class",
  "overstress-voltage",
  "overstress-power",
  "spacing-short",
  "no-trigger",
  "trigger-marginal",
  "measurement-mismatch",
  "high-voltage-output",
  "ozone",
  "implausible-input",
  "start-dependent-state",
] as const;
export type FlagCode = (typeof FLAG_CODES)[number];

export type FlagSeverity = "danger" | "warning" | "info";

/** One risk flag. Flags never claim compliance: they say what to look at. */
export interface Flag {
  code: FlagCode;
  severity: FlagSeverity;
  parts: string[];
  nets: string[];
  message: string;
  /** The numbers behind the flag, each labelled with its unit (flags/evidence.ts). */
  evidence: Evidence[];
  /** Key of the citations table (flags/citations.ts). */
  source_id: CitationId;
  /** The published document the rule comes from, or "common practice" (the table's text). */
  source: string;
  /** One sentence: what the figure does not decide. */
  caution: string;
}

/** Options of the assessment. */
export interface RiskOptions {
  /** Seed of the tolerance Monte Carlo (same seed, same bands). */
  seed?: number;
  /** Monte Carlo samples per supply. */
  samples?: number;
  /** Milliseconds clock; without one only the solver's step caps limit the run. */
  now?: () => number;
  /** Time budget of the whole assessment, in milliseconds (only enforced with a clock). */
  budgetMs?: number;
  /** The nominal solve at the analysed supply, when the caller has it (spares a re-solve). */
  nominal?: SolvedCircuit;
}

/** The assessment: flags, comparisons, the defaults it assumed, and notes on checks it could not run. */
export interface RiskAssessment {
  flags: Flag[];
  comparisons: Comparison[];
  /** Every default chosen where the record was silent (a rating by package, a tolerance by kind). */
  assumptions: Assumption[];
  /** Checks that were skipped or did not apply, and why. */
  notes: string[];
  /** What the variants could not finish within the budget (a band cut short), and why. */
  unfinished: Gap[];
}

/** The caution every mains flag carries unless a more specific one applies. */
export const MAINS_CAUTION =
  "An estimate from a traced netlist, not a compliance verdict: mains circuits can kill, and local codes and a qualified person decide.";

/*
 * Evidence entries. Values are SI numbers in the unit named ("V", "A", "s", "F", "Ω"), except
 * spacings in "mm", shares in "%", angles in "°" and concentrations in "ppm", the units the trade
 * reads them in; words are given with the unit "".
 */

/** One evidence entry; a non-finite number (no decay, no limit) becomes null, shown as unknown. */
export function ev(label: string, value: number | string | null, unit = ""): Evidence {
  return {
    label,
    value: typeof value === "number" && !Number.isFinite(value) ? null : value,
    unit,
  };
}

/** A yes/no fact as evidence. */
export function evYes(label: string, yes: boolean): Evidence {
  return { label, value: yes ? "yes" : "no", unit: "" };
}

/** A share (0.92) as a percentage evidence entry (92 %). */
export function evPercent(label: string, fraction: number): Evidence {
  return ev(label, 100 * fraction, "%");
}

/** The value of the evidence entry with this label (undefined when the flag has none). */
export function evidenceValue(
  flag: { evidence: readonly Evidence[] },
  label: string,
): number | string | null | undefined {
  return flag.evidence.find((e) => e.label === label)?.value;
}

// The citations table travels with the flag's type.
export * from "./citations.js";
