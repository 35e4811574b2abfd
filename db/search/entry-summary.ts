/**
 * The entry as every list and search answer shows it (one type for the list, text, similar and
 * fragment search), loaded for one page of ids at a time.
 */
import { sql } from "drizzle-orm";
import type { Database } from "../client.js";
import { textArrayParam } from "./array-param.js";

/** One entry in a list or a search result. */
export interface EntrySummary {
  id: string;
  teamId: string;
  title: string;
  category: string | null;
  visibility: "team" | "public";
  currentRevision: number | null;
  updatedAt: Date;
  archived: boolean;
  flags: string[];
  blocks: string[];
  analysisState: "queued" | "running" | "done" | "failed" | null;
}

interface SummaryRow {
  id: string;
  team_id: string;
  title: string;
  category: string | null;
  visibility: "team" | "public";
  current_revision: number | null;
  updated_at: Date | string;
  archived_at: Date | string | null;
  search_flags: string[];
  search_blocks: string[];
  analysis_state: EntrySummary["analysisState"];
}

/** The summaries of the given entries by id (ids the caller already filtered for visibility). */
export async function loadEntrySummaries(
  db: Database,
  ids: readonly string[],
  engineVersion: string,
): Promise<Map<string, EntrySummary>> {
  const out = new Map<string, EntrySummary>();
  if (ids.length === 0) return out;
  const rows = await db.execute<SummaryRow & Record<string, unknown>>(sql`
    select e.id, e.team_id, e.title, e.category, e.visibility, e.current_revision, e.updated_at,
      e.archived_at, e.search_flags, e.search_blocks,
      (select a.state from analyses a join revisions r on r.id = a.revision_id
        where r.entry_id = e.id and r.number = e.current_revision
          and a.engine_version = ${engineVersion}) as analysis_state
    from entries e where e.id = any(${textArrayParam(ids)}::uuid[])`);
  for (const r of rows.rows)
    out.set(r.id, {
      id: r.id,
      teamId: r.team_id,
      title: r.title,
      category: r.category,
      visibility: r.visibility,
      currentRevision: r.current_revision,
      updatedAt: new Date(r.updated_at),
      archived: r.archived_at !== null,
      flags: r.search_flags,
      blocks: r.search_blocks,
      analysisState: r.analysis_state,
    });
  return out;
}
