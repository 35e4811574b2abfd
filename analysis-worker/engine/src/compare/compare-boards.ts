/**
 * The front door for comparing two traced boards: parts paired by structure with a confidence
 * each, values side by side, parts on one board only, nets that changed, computed figures side
 * by side and the risk flags on one board, the other or both. Pure: two records and their
 * analysis results (null when not analysed yet) in, one plain value out.
 */
import type { AnalysisResult } from "../analysis-result.js";
import type { TeardownRecord } from "../record/types.js";
import { figureRows, flagSets, type FigureRow } from "./figure-rows.js";
import { netChanges, type NetChange } from "./net-changes.js";
import { pairParts, type ComparedPair } from "./part-pairs.js";

export type { ComparedPair, PairedBy } from "./part-pairs.js";
export type { FigureRow } from "./figure-rows.js";
export type { NetChange } from "./net-changes.js";
export { pairConfidence, valuesText } from "./part-pairs.js";

/** One board of a comparison: its record and, when analysed, its result. */
export interface BoardToCompare {
  record: TeardownRecord;
  result: AnalysisResult | null;
}

/** What two boards have in common and where they differ. */
export interface BoardComparison {
  parts: { pairs: ComparedPair[]; onlyA: string[]; onlyB: string[] };
  nets: NetChange[];
  figures: FigureRow[];
  flags: { onlyA: string[]; onlyB: string[]; both: string[] };
}

/** Compare board A with board B. */
export function compareBoards(a: BoardToCompare, b: BoardToCompare): BoardComparison {
  const pairing = pairParts(a.record, b.record);
  return {
    parts: { pairs: pairing.pairs, onlyA: pairing.onlyA, onlyB: pairing.onlyB },
    nets: netChanges(a.record, b.record, pairing),
    figures: figureRows(a.result, b.result, pairing),
    flags: flagSets(a.result, b.result),
  };
}
