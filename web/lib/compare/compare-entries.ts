/**
 * The comparison of two entries (or two revisions of one, or one revision of each) for a caller
 * who may read both: each side's record and newest finished analysis are read, and the engine
 * compares the boards. Either side unreadable is the same 404 as an unknown id.
 */
import { and, desc, eq } from "drizzle-orm";
import { z } from "zod";
import { schema, type Database } from "@teardown/db";
import {
  compareBoards,
  ENGINE_VERSION,
  parseStoredResult,
  type AnalysisResult,
  type BoardComparison,
} from "@teardown/engine";
import { readableEntry } from "../access";
import type { Caller } from "../caller";
import { revisionByNumber, storedRecord } from "../revisions";
import { uuidParam } from "../route-input";

/** The query of `GET /api/compare`. */
export const compareQuery = z.object({
  a: z.string().max(100),
  b: z.string().max(100),
  aRevision: z.coerce.number().int().positive().max(1e9).optional(),
  bRevision: z.coerce.number().int().positive().max(1e9).optional(),
});
export type CompareQuery = z.infer<typeof compareQuery>;

/** One side of a comparison as the API shows it. */
export interface CompareSide {
  entry: {
    id: string;
    teamId: string;
    title: string;
    category: string | null;
    visibility: "team" | "public";
    currentRevision: number | null;
  };
  revision: number;
  /** The analysis the figures and flags come from; null when none has finished. */
  analysis: { engineVersion: string; status: AnalysisResult["status"] } | null;
  /** The stored schematic layout of that analysis (drawn by the engine's renderer). */
  layout: unknown;
}

/** The whole answer of `GET /api/compare`. */
export type EntryComparison = { a: CompareSide; b: CompareSide } & BoardComparison;

interface SideRead {
  side: CompareSide;
  board: Parameters<typeof compareBoards>[0];
}

/** The newest finished analysis of a revision, this engine version first. */
async function finishedAnalysis(db: Database, revisionId: string) {
  const rows = await db
    .select()
    .from(schema.analyses)
    .where(and(eq(schema.analyses.revisionId, revisionId), eq(schema.analyses.state, "done")))
    .orderBy(desc(schema.analyses.finishedAt));
  return rows.find((r) => r.engineVersion === ENGINE_VERSION) ?? rows[0] ?? null;
}

async function readSide(
  db: Database,
  caller: Caller | null,
  id: string,
  revisionNumber: number | undefined,
): Promise<SideRead> {
  const { entry } = await readableEntry(db, caller, uuidParam(id));
  const revision = await revisionByNumber(
    db,
    entry.id,
    revisionNumber ?? entry.currentRevision ?? 1,
  );
  const row = await finishedAnalysis(db, revision.id);
  const read = row === null ? null : parseStoredResult(row.result);
  const result = read?.ok ? read.result : null;
  return {
    side: {
      entry: {
        id: entry.id,
        teamId: entry.teamId,
        title: entry.title,
        category: entry.category,
        visibility: entry.visibility,
        currentRevision: entry.currentRevision,
      },
      revision: revision.number,
      analysis:
        row !== null && result !== null
          ? { engineVersion: row.engineVersion, status: result.status }
          : null,
      layout: result !== null ? (row?.layout ?? null) : null,
    },
    board: { record: storedRecord(revision.record), result },
  };
}

/** Compare two entries the caller may read (404 when either is not readable). */
export async function compareEntries(
  db: Database,
  caller: Caller | null,
  q: CompareQuery,
): Promise<EntryComparison> {
  // One after the other: the first unreadable side answers 404 before anything else is read.
  const a = await readSide(db, caller, q.a, q.aRevision);
  const b = await readSide(db, caller, q.b, q.bRevision);
  return { a: a.side, b: b.side, ...compareBoards(a.board, b.board) };
}
