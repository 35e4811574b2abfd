/**
 * What an analysis says about itself: the parts or nets it left out (gaps) and the defaults it
 * chose where the record was silent (assumptions). Every stage that leaves something out or picks
 * a default reports it in these shapes, so the result can state what its figures stand on.
 */

/** One part or net left out of the analysis, or not solvable, and why (plain words). */
export type Gap =
  { part: string; net?: never; reason: string } | { net: string; part?: never; reason: string };

/** One default the engine chose where the record was silent. */
export interface Assumption {
  /** The part the default applies to. */
  part: string;
  /** The record field path it stands in for, e.g. `model.rs` or `rating.power`. */
  field: string;
  /** The value chosen, in SI units (or a word for a model choice). */
  value: number | string;
  /** Why this value: where it comes from, in plain words (no internal file names). */
  why: string;
}

/** The three states of an analysis: every part simulated, something left out, or no solution. */
export const ANALYSIS_STATUSES = ["complete", "partial", "not-solved"] as const;
export type AnalysisStatus = (typeof ANALYSIS_STATUSES)[number];

/** One labelled quantity backing a finding: a label in words, a value, and its unit ("" for none). */
export interface Evidence {
  label: string;
  value: number | string | null;
  unit: string;
}
