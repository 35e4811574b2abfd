/** Reading revisions: history, one revision's record, and the diff between two. */
import { and, desc, eq } from "drizzle-orm";
import { schema, type Database } from "@teardown/db";
import { parseRecord, type TeardownRecord } from "@teardown/engine";
import { notFound } from "./api-error";
import type { Tx } from "./audit";
import { diffRevisions, type RevisionDiff } from "./revision-diff";

/** A stored revision document back as a normalised record; stored documents were validated on the way in. */
export function storedRecord(doc: unknown): TeardownRecord {
  const read = parseRecord(JSON.stringify(doc), { filename: "revision.json" });
  // Every stored document passed the engine when it was written, so failing here is a bug.
  if (!read.ok)
    throw new Error(
      `a stored revision no longer reads: ${read.errors[0]?.path}: ${read.errors[0]?.message}`,
    );
  return read.record;
}

/** One line of an entry's history. */
export interface RevisionSummary {
  number: number;
  message: string;
  authorId: string | null;
  authorName: string | null;
  recordHash: string;
  createdAt: Date;
}

/** The entry's revisions, newest first. */
export async function revisionHistory(db: Database, entryId: string): Promise<RevisionSummary[]> {
  return db
    .select({
      number: schema.revisions.number,
      message: schema.revisions.message,
      authorId: schema.revisions.authorId,
      authorName: schema.users.name,
      recordHash: schema.revisions.recordHash,
      createdAt: schema.revisions.createdAt,
    })
    .from(schema.revisions)
    .leftJoin(schema.users, eq(schema.users.id, schema.revisions.authorId))
    .where(eq(schema.revisions.entryId, entryId))
    .orderBy(desc(schema.revisions.number));
}

export type RevisionRow = typeof schema.revisions.$inferSelect;

/** One revision by number (404 when the entry has none such). */
export async function revisionByNumber(
  db: Database | Tx,
  entryId: string,
  number: number,
): Promise<RevisionRow> {
  const [row] = await db
    .select()
    .from(schema.revisions)
    .where(and(eq(schema.revisions.entryId, entryId), eq(schema.revisions.number, number)));
  if (!row) throw notFound("revision");
  return row;
}

/** The diff from revision `from` to revision `to` of one entry. */
export async function diffBetween(
  db: Database | Tx,
  entryId: string,
  from: number,
  to: number,
): Promise<RevisionDiff> {
  const [a, b] = await Promise.all([
    revisionByNumber(db, entryId, from),
    revisionByNumber(db, entryId, to),
  ]);
  return diffRevisions(storedRecord(a.record), storedRecord(b.record));
}
