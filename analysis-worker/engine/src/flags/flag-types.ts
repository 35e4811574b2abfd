/**
 * What the risk assessment returns: flags (each with its numbers, its source and a caution) and
 * the measured-versus-predicted comparisons. See shared/record-format.md, section 2.
 */
import type { MeasurementKind } from "../record/types.js";

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
] as const;
export type FlagCode = (typeof FLAG_CODES)[number];

export type FlagSeverity = "danger" | "warning" | "info";

/** Evidence values: plain SI numbers (the unit is in the key name), words, lists, or null when unknown. */
export type EvidenceValue =
  | number
  | string
  | boolean
  | null
  | string[]
  | number[]
  | Array<Record<string, number | string | null>>;

/** One risk flag. Flags never claim compliance: they say what to look at. */
export interface Flag {
  code: FlagCode;
  severity: FlagSeverity;
  parts: string[];
  nets: string[];
  message: string;
  evidence: Record<string, EvidenceValue>;
  /** The standard and clause with its confidence mark (FOUND/MEMORY per reference-values.md), or "common practice". */
  source: string;
  /** One sentence: what the figure does not decide. */
  caution: string;
}

/** One measurement against its predicted band. */
export interface Comparison {
  /** Index of the measurement in the record. */
  measurement: number;
  what: MeasurementKind;
  measured: number;
  predicted: number;
  low: number;
  high: number;
  verdict: "agrees" | "disagrees";
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
}

/** The assessment: flags, comparisons, and notes on what was assumed or left out. */
export interface RiskAssessment {
  flags: Flag[];
  comparisons: Comparison[];
  notes: string[];
}

/** The caution every mains flag carries unless a more specific one applies. */
export const MAINS_CAUTION =
  "An estimate from a traced netlist, not a compliance verdict: mains circuits can kill, and local codes and a qualified person decide.";
