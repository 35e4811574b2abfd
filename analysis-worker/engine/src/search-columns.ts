/**
 * What the worker writes into an entry's search columns from one analysis: block kinds, flag
 * codes, the topology features of similar-circuit and fragment search, facet figures and the
 * text that full-text search reads (tags apart, because they weigh more than the body text).
 */
import type { AnalysisResult } from "./analysis-result.js";
import { fragmentFeatures } from "./fingerprint/fragment-features.js";
import { topologyOf, type StoredTopology } from "./fingerprint/stored-topology.js";
import { FINGERPRINT_VERSION, fingerprint, valueFeatures } from "./fingerprint/wl-fingerprint.js";
import type { TeardownRecord } from "./record/types.js";

/** The features of a record that similar-circuit and fragment search read. */
export interface TopologyColumns {
  /** Topology-only Weisfeiler-Lehman labels (no values). */
  fingerprint: number[];
  /** Part labels with value decades; only orders entries whose topology scores tie. */
  valueFeatures: number[];
  /** Kind counts and part-to-part links: the candidate index of fragment search. */
  fragmentFeatures: number[];
  /** The structure fragment search confirms candidates on. */
  topology: StoredTopology;
  /** The feature definitions' version these were computed under. */
  version: number;
}

export interface SearchColumns extends TopologyColumns {
  blocks: string[];
  flags: string[];
  facets: Record<string, string | number | boolean | null>;
  /** Summary, markings, notes, part kinds and refs, for full-text search. */
  text: string;
  /** The device's tags, weighted with the category. */
  tags: string;
  /** True when at least one measurement disagrees with the traced circuit's figures. */
  mismatch: boolean;
}

/** The topology columns of a record (no analysis needed: the backfill uses this alone). */
export function topologyColumnsFor(record: TeardownRecord, features?: number[]): TopologyColumns {
  const fp = features ?? fingerprint(record);
  return {
    fingerprint: fp,
    valueFeatures: valueFeatures(record),
    fragmentFeatures: fragmentFeatures(record),
    topology: topologyOf(record),
    version: FINGERPRINT_VERSION,
  };
}

/** The search columns of a record and its analysis result. */
export function searchColumnsFor(
  record: TeardownRecord,
  result: AnalysisResult,
  features: number[],
): SearchColumns {
  const blocks = [...new Set(result.blocks.map((b) => b.kind))].sort();
  const flags = [...new Set(result.flags.map((f) => f.code))].sort();
  const solved = result.status === "not-solved" ? null : result;
  const input = solved?.input ?? null;
  return {
    ...topologyColumnsFor(record, features),
    blocks,
    flags,
    facets: {
      supply_vrms: record.device.rated_supply.vrms,
      supply_hz: record.device.rated_supply.hz,
      parts: record.parts.length,
      input_power_w: input?.power ?? null,
      input_current_a: input?.current_rms ?? null,
      analysis_status: result.status,
    },
    text: searchTextOf(record),
    tags: record.device.tags.join(" "),
    mismatch: (solved?.comparisons ?? []).some((c) => c.verdict === "disagrees"),
  };
}

/** The body text full-text search reads: summary, each part's ref, kind, marking, value and note, net notes. */
export function searchTextOf(record: TeardownRecord): string {
  return [
    record.summary ?? "",
    ...record.parts.map((p) =>
      [p.ref, p.kind, p.marking ?? "", p.value_text ?? "", p.note ?? ""].join(" "),
    ),
    ...Object.values(record.nets).map((n) => n.note ?? ""),
  ]
    .join("\n")
    .replace(/\s+/g, " ")
    .trim();
}
