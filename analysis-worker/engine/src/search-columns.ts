/**
 * What the worker writes into an entry's search columns from one analysis: block kinds, flag
 * codes, fingerprint features, facet figures and the text that full-text search reads.
 */
import type { AnalysisResult } from "./analysis-result.js";
import type { TeardownRecord } from "./record/types.js";

export interface SearchColumns {
  blocks: string[];
  flags: string[];
  fingerprint: number[];
  facets: Record<string, string | number | boolean | null>;
  /** Summary, markings, notes, part kinds and refs, for full-text search. */
  text: string;
}

/** The search columns of a record and its analysis result. */
export function searchColumnsFor(
  record: TeardownRecord,
  result: AnalysisResult,
  features: number[],
): SearchColumns {
  const blocks = [...new Set(result.blocks.map((b) => b.kind))].sort();
  const flags = [...new Set(result.flags.map((f) => f.code))].sort();
  const input = result.status === "not-solved" ? null : result.input;
  const text = [
    record.summary ?? "",
    record.device.tags.join(" "),
    ...record.parts.map((p) =>
      [p.ref, p.kind, p.marking ?? "", p.value_text ?? "", p.note ?? ""].join(" "),
    ),
    ...Object.values(record.nets).map((n) => n.note ?? ""),
  ]
    .join("\n")
    .replace(/\s+/g, " ")
    .trim();
  return {
    blocks,
    flags,
    fingerprint: features,
    facets: {
      supply_vrms: record.device.rated_supply.vrms,
      supply_hz: record.device.rated_supply.hz,
      parts: record.parts.length,
      input_power_w: input?.power ?? null,
      input_current_a: input?.current_rms ?? null,
      analysis_status: result.status,
    },
    text,
  };
}
