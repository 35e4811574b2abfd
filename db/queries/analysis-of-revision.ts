/** The analysis of one revision for one engine version: shared by the web app and the worker. */
import { and, eq } from "drizzle-orm";
import type { Database } from "../client.js";
import { analyses } from "../schema/analyses.js";

export type AnalysisRow = typeof analyses.$inferSelect;

/** The analysis row of a revision for an engine version, or null when none was queued. */
export async function analysisOfRevision(
  db: Database,
  revisionId: string,
  engineVersion: string,
): Promise<AnalysisRow | null> {
  const [row] = await db
    .select()
    .from(analyses)
    .where(and(eq(analyses.revisionId, revisionId), eq(analyses.engineVersion, engineVersion)));
  return row ?? null;
}
