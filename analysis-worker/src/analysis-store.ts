/**
 * The worker's reads and writes. Each write is one transaction; the result is an idempotent
 * upsert keyed by (revision, engine version), so a job that runs twice leaves one row. While
 * the variants run, the running row holds the cheap part (result partial, variants pending),
 * so the app can show it; `done` is written once, with the full result.
 */
import { and, eq, sql } from "drizzle-orm";
import { schema, writeSearchColumns, type Database } from "@teardown/db";
import type { AnalysisOutput, AnalysisStage } from "@teardown/engine";

export interface RevisionToAnalyse {
  id: string;
  entryId: string;
  number: number;
  record: unknown;
  currentRevision: number | null;
}

/** The revision and its entry's current revision number, or null when it no longer exists. */
export async function loadRevision(
  db: Database,
  revisionId: string,
): Promise<RevisionToAnalyse | null> {
  const rows = await db
    .select({
      id: schema.revisions.id,
      entryId: schema.revisions.entryId,
      number: schema.revisions.number,
      record: schema.revisions.record,
      currentRevision: schema.entries.currentRevision,
    })
    .from(schema.revisions)
    .innerJoin(schema.entries, eq(schema.entries.id, schema.revisions.entryId))
    .where(eq(schema.revisions.id, revisionId));
  return rows[0] ?? null;
}

/** The state of the analysis row, or null when none exists yet. */
export async function analysisState(
  db: Database,
  revisionId: string,
  engineVersion: string,
): Promise<string | null> {
  const [row] = await db
    .select({ state: schema.analyses.state })
    .from(schema.analyses)
    .where(
      and(
        eq(schema.analyses.revisionId, revisionId),
        eq(schema.analyses.engineVersion, engineVersion),
      ),
    );
  return row?.state ?? null;
}

/** Marks the analysis running (creating the row if a job arrived without one). */
export async function markRunning(
  db: Database,
  revisionId: string,
  engineVersion: string,
): Promise<void> {
  await db
    .insert(schema.analyses)
    .values({ revisionId, engineVersion, state: "running", startedAt: sql`now()` })
    .onConflictDoUpdate({
      target: [schema.analyses.revisionId, schema.analyses.engineVersion],
      set: { state: "running", startedAt: sql`now()`, error: null, errorStage: null },
      where: sql`${schema.analyses.state} <> 'done'`,
    });
}

/**
 * Puts the cheap part (nominal figures, layout; its variants pending) on the running row, for
 * the app to show until the full result is done. A row no longer running is left alone.
 */
export async function storeNominal(
  db: Database,
  revisionId: string,
  engineVersion: string,
  output: AnalysisOutput,
): Promise<void> {
  await db.transaction(async (tx) => {
    await tx
      .update(schema.analyses)
      .set({ result: output.result, layout: output.layout, timings: output.timings })
      .where(
        and(
          eq(schema.analyses.revisionId, revisionId),
          eq(schema.analyses.engineVersion, engineVersion),
          eq(schema.analyses.state, "running"),
        ),
      );
  });
}

/** Stores a finished analysis (replacing the cheap part) and, when it is of the entry's current revision, its search columns. */
export async function storeDone(
  db: Database,
  rev: RevisionToAnalyse,
  engineVersion: string,
  output: AnalysisOutput,
): Promise<void> {
  await db.transaction(async (tx) => {
    await tx
      .insert(schema.analyses)
      .values({
        revisionId: rev.id,
        engineVersion,
        state: "done",
        result: output.result,
        layout: output.layout,
        timings: output.timings,
        startedAt: sql`now()`,
        finishedAt: sql`now()`,
      })
      .onConflictDoUpdate({
        target: [schema.analyses.revisionId, schema.analyses.engineVersion],
        set: {
          state: "done",
          result: output.result,
          layout: output.layout,
          timings: output.timings,
          error: null,
          errorStage: null,
          startedAt: sql`coalesce(${schema.analyses.startedAt}, now())`,
          finishedAt: sql`now()`,
        },
      });
    // Only the current revision's analysis feeds search; an older revision's late result must not.
    await writeSearchColumns(tx, rev.entryId, rev.number, output.search);
  });
}

/** Stores a failed analysis with the stage and the reason. */
export async function storeFailed(
  db: Database,
  revisionId: string,
  engineVersion: string,
  stage: AnalysisStage | "timeout" | "engine",
  reason: string,
): Promise<void> {
  await db
    .insert(schema.analyses)
    .values({
      revisionId,
      engineVersion,
      state: "failed",
      error: reason,
      errorStage: stage,
      startedAt: sql`now()`,
      finishedAt: sql`now()`,
    })
    .onConflictDoUpdate({
      target: [schema.analyses.revisionId, schema.analyses.engineVersion],
      set: {
        state: "failed",
        error: reason,
        errorStage: stage,
        startedAt: sql`coalesce(${schema.analyses.startedAt}, now())`,
        finishedAt: sql`now()`,
      },
      where: sql`${schema.analyses.state} <> 'done'`,
    });
}
