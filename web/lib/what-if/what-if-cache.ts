/** Cached what-if results in the database, one row per (revision, engine version, input). */
import { and, eq } from "drizzle-orm";
import { schema, type Database } from "@teardown/db";
import { parseStoredResult, type AnalysisResult } from "@teardown/engine";
import type { WhatIfInput } from "./what-if-key";

/** The cached result, or null when there is none (or it no longer reads, which counts as a miss). */
export async function cachedWhatIf(
  db: Database,
  revisionId: string,
  engineVersion: string,
  key: string,
): Promise<AnalysisResult | null> {
  const [row] = await db
    .select({ result: schema.whatIfResults.result })
    .from(schema.whatIfResults)
    .where(
      and(
        eq(schema.whatIfResults.revisionId, revisionId),
        eq(schema.whatIfResults.engineVersion, engineVersion),
        eq(schema.whatIfResults.inputKey, key),
      ),
    );
  if (!row) return null;
  const read = parseStoredResult(row.result);
  return read.ok ? read.result : null;
}

/** Stores a result; two requests that computed the same one at once leave one row. */
export async function storeWhatIf(
  db: Database,
  row: {
    revisionId: string;
    engineVersion: string;
    key: string;
    input: WhatIfInput;
    result: AnalysisResult;
  },
): Promise<void> {
  await db
    .insert(schema.whatIfResults)
    .values({
      revisionId: row.revisionId,
      engineVersion: row.engineVersion,
      inputKey: row.key,
      input: row.input,
      result: row.result,
    })
    .onConflictDoNothing();
}
