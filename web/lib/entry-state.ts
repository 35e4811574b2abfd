/**
 * An entry as the client needs it: the entry, its current revision (record and number), the
 * analysis of that revision for this engine version with its state, and, while that one is not
 * done, the newest finished analysis by an older engine version so the page has something to show.
 *
 * A finished result goes out without its waveforms: they were over half of a solved entry's
 * answer (7-50 kB of 26-72 kB on the demo entries) and only the "nets and waveforms" tab draws
 * them, so the page fetches them on their own when that tab opens (`shownWaveforms`).
 */
import { and, desc, eq, ne } from "drizzle-orm";
import { cachedDoneView, doneKey, keepDoneView } from "./analysis-view-cache";
import { analysisOfRevision, schema, type AnalysisRow, type Database } from "@teardown/db";
import { ENGINE_VERSION, parseStoredResult, type AnalysisResult } from "@teardown/engine";
import type { EntryRow, Role } from "./access";
import { revisionByNumber } from "./revisions";

/** An analysis as the API shows it; which fields are set depends on the state. */
export type AnalysisView =
  | { state: "queued"; engineVersion: string; queuedAt: Date }
  | {
      state: "running";
      engineVersion: string;
      queuedAt: Date;
      startedAt: Date | null;
      /** The nominal part while the variants run (partial, variants pending); null before it is stored. */
      result: AnalysisResult | null;
      layout: unknown;
    }
  | {
      state: "done";
      engineVersion: string;
      startedAt: Date | null;
      finishedAt: Date | null;
      /** The parsed result; null when the stored one cannot be read (then `resultProblem` says why). */
      result: AnalysisResult | null;
      /** Set when the stored result was written by an older engine and upgraded for reading. */
      upgradedFrom: string | null;
      resultProblem: string | null;
      layout: unknown;
      timings: unknown;
    }
  | {
      state: "failed";
      engineVersion: string;
      finishedAt: Date | null;
      error: string;
      stage: string | null;
    };

/** A finished result as entry reads send it: everything but the waveforms. */
export type ResultWithoutWaveforms = AnalysisResult extends infer R
  ? R extends unknown
    ? Omit<R, "waveforms">
    : never
  : never;

/** The stored waveforms of a solved result (time in seconds and named series). */
export type Waveforms = Extract<AnalysisResult, { waveforms: unknown }>["waveforms"];

/** The API view of an analysis row. */
export function analysisView(row: AnalysisRow): AnalysisView {
  switch (row.state) {
    case "queued":
      return { state: "queued", engineVersion: row.engineVersion, queuedAt: row.queuedAt };
    case "running": {
      // The worker stores the nominal part here while the variants run; an unreadable one is not shown.
      const read = row.result === null ? null : parseStoredResult(row.result);
      return {
        state: "running",
        engineVersion: row.engineVersion,
        queuedAt: row.queuedAt,
        startedAt: row.startedAt,
        result: read?.ok ? read.result : null,
        layout: read?.ok ? row.layout : null,
      };
    }
    case "done": {
      // Read back through the engine's schema: the page gets a typed result or a reason.
      const read = parseStoredResult(row.result);
      return {
        state: "done",
        engineVersion: row.engineVersion,
        startedAt: row.startedAt,
        finishedAt: row.finishedAt,
        result: read.ok ? read.result : null,
        upgradedFrom: read.ok ? read.upgradedFrom : null,
        resultProblem: read.ok ? null : read.message,
        layout: row.layout,
        timings: row.timings,
      };
    }
    case "failed":
      return {
        state: "failed",
        engineVersion: row.engineVersion,
        finishedAt: row.finishedAt,
        error: row.error ?? "unknown failure",
        stage: row.errorStage,
      };
  }
}

/** The entry's columns that the API shows. */
export function entryView(entry: EntryRow) {
  return {
    id: entry.id,
    teamId: entry.teamId,
    title: entry.title,
    category: entry.category,
    visibility: entry.visibility,
    currentRevision: entry.currentRevision,
    createdBy: entry.createdBy,
    createdAt: entry.createdAt,
    updatedAt: entry.updatedAt,
    archived: entry.archivedAt !== null,
    archivedAt: entry.archivedAt,
    flags: entry.searchFlags,
    blocks: entry.searchBlocks,
  };
}

/** The analysis of a revision for an engine version (the shared query in db/), or null. */
export function analysisFor(
  db: Database,
  revisionId: string,
  engineVersion = ENGINE_VERSION,
): Promise<AnalysisRow | null> {
  return analysisOfRevision(db, revisionId, engineVersion);
}

/** An analysis row without its large JSON columns (result, layout, timings). */
const LIGHT_COLUMNS = {
  id: schema.analyses.id,
  revisionId: schema.analyses.revisionId,
  engineVersion: schema.analyses.engineVersion,
  state: schema.analyses.state,
  error: schema.analyses.error,
  errorStage: schema.analyses.errorStage,
  queuedAt: schema.analyses.queuedAt,
  startedAt: schema.analyses.startedAt,
  finishedAt: schema.analyses.finishedAt,
};
type LightAnalysisRow = Omit<AnalysisRow, "result" | "layout" | "timings">;

/**
 * The view of an analysis found by its light row: a finished one comes from the process's
 * cache, or has its JSON fetched and parsed once; the others need nothing more.
 */
async function viewOfLight(db: Database, light: LightAnalysisRow): Promise<AnalysisView> {
  if (light.state === "running") {
    // A running row may hold the nominal part already; it changes once, so it is not cached.
    const [nominal] = await db
      .select({ result: schema.analyses.result, layout: schema.analyses.layout })
      .from(schema.analyses)
      .where(eq(schema.analyses.id, light.id));
    return analysisView({
      ...light,
      result: nominal?.result ?? null,
      layout: nominal?.layout ?? null,
      timings: {},
    });
  }
  if (light.state !== "done")
    return analysisView({ ...light, result: null, layout: null, timings: {} });
  const key = doneKey(light.id, light.finishedAt);
  const hit = cachedDoneView(key);
  if (hit) return hit;
  const [heavy] = await db
    .select({
      result: schema.analyses.result,
      layout: schema.analyses.layout,
      timings: schema.analyses.timings,
      finishedAt: schema.analyses.finishedAt,
    })
    .from(schema.analyses)
    .where(eq(schema.analyses.id, light.id));
  // Re-run between the two reads: show what the second read saw, and cache nothing.
  if (!heavy || heavy.finishedAt?.getTime() !== light.finishedAt?.getTime())
    return analysisView({ ...light, result: null, layout: null, timings: {}, state: "queued" });
  const view = analysisView({ ...light, ...heavy });
  if (view.state === "done") keepDoneView(key, view);
  return view;
}

/** The entry state with every finished result whole (waveforms included); callers trim it. */
async function fullEntryState(
  db: Database,
  entry: EntryRow,
  role: Role | null,
  revisionNumber?: number,
) {
  const number = revisionNumber ?? entry.currentRevision ?? 1;
  const revision = await revisionByNumber(db, entry.id, number);
  const [current] = await db
    .select(LIGHT_COLUMNS)
    .from(schema.analyses)
    .where(
      and(
        eq(schema.analyses.revisionId, revision.id),
        eq(schema.analyses.engineVersion, ENGINE_VERSION),
      ),
    );
  let previous: AnalysisView | null = null;
  if (current?.state !== "done") {
    const [older] = await db
      .select(LIGHT_COLUMNS)
      .from(schema.analyses)
      .where(
        and(
          eq(schema.analyses.revisionId, revision.id),
          ne(schema.analyses.engineVersion, ENGINE_VERSION),
          eq(schema.analyses.state, "done"),
        ),
      )
      .orderBy(desc(schema.analyses.finishedAt))
      .limit(1);
    previous = older ? await viewOfLight(db, older) : null;
  }
  return {
    entry: entryView(entry),
    role,
    revision: {
      number: revision.number,
      message: revision.message,
      authorId: revision.authorId,
      createdAt: revision.createdAt,
      recordHash: revision.recordHash,
      record: revision.record,
    },
    engineVersion: ENGINE_VERSION,
    analysis: current ? await viewOfLight(db, current) : null,
    olderAnalysis: previous,
  };
}

/** A view as entry reads send it: a finished result without its waveforms. */
function withoutWaveforms(view: AnalysisView | null) {
  if (view?.state !== "done" || view.result === null) return view;
  // A copy: the view is shared through the cache (analysis-view-cache.ts) and must stay whole.
  const result = Object.fromEntries(
    Object.entries(view.result).filter(([key]) => key !== "waveforms"),
  ) as ResultWithoutWaveforms;
  return { ...view, result };
}

/** Everything the entry page shows first, for a caller who may read the entry (no waveforms). */
export async function entryState(
  db: Database,
  entry: EntryRow,
  role: Role | null,
  revisionNumber?: number,
) {
  const full = await fullEntryState(db, entry, role, revisionNumber);
  return {
    ...full,
    analysis: withoutWaveforms(full.analysis),
    olderAnalysis: withoutWaveforms(full.olderAnalysis),
  };
}

/**
 * The waveforms of the finished analysis the page shows for a revision (this engine's, else the
 * newest older one), with which analysis that is; null waveforms when none is finished and solved.
 */
export async function shownWaveforms(
  db: Database,
  entry: EntryRow,
  revisionNumber: number,
): Promise<{ engineVersion: string | null; finishedAt: Date | null; waveforms: Waveforms | null }> {
  const { analysis, olderAnalysis } = await fullEntryState(db, entry, null, revisionNumber);
  const shown =
    analysis?.state === "done" ? analysis : olderAnalysis?.state === "done" ? olderAnalysis : null;
  if (shown?.state !== "done") return { engineVersion: null, finishedAt: null, waveforms: null };
  const result = shown.result;
  return {
    engineVersion: shown.engineVersion,
    finishedAt: shown.finishedAt,
    waveforms: result !== null && "waveforms" in result ? result.waveforms : null,
  };
}
