/**
 * Writing entries: create (first revision), revise (a new revision on a stated base; a stale
 * base is 409 with what changed since, and nothing is written), archive and visibility. Each
 * write is one transaction with its audit row; revisions carry their analysis job.
 */
import { eq, sql } from "drizzle-orm";
import { addRevision, createEntry, schema, type Database } from "@teardown/db";
import { ENGINE_VERSION } from "@teardown/engine";
import { ApiError } from "./api-error";
import { entryWithRole, requireTeamRole, type EntryRow } from "./access";
import { audit } from "./audit";
import type { Caller } from "./caller";
import { analysisQueue } from "./queue";
import type { AcceptedRecord, SubmissionFields } from "./record-input";
import { diffBetween } from "./revisions";

/** Creates an entry on the team (editor or owner) from an accepted record. */
export async function createTeamEntry(
  db: Database,
  caller: Caller,
  teamId: string,
  accepted: AcceptedRecord,
  fields: SubmissionFields,
): Promise<{ entryId: string; revision: number }> {
  await requireTeamRole(db, caller, teamId, "editor");
  const boss = await analysisQueue();
  const { entryId } = await createEntry(db, boss, {
    teamId,
    title: fields.title ?? accepted.record.title,
    category: fields.category !== undefined ? fields.category : accepted.record.device.category,
    visibility: fields.visibility ?? "team",
    record: accepted.document,
    authorId: caller.userId,
    message: fields.message ?? "",
    engineVersion: ENGINE_VERSION,
  });
  return { entryId, revision: 1 };
}

/** Adds a revision on `fields.baseRevision` (editor or owner); 409 with the diff when someone saved first. */
export async function reviseEntry(
  db: Database,
  caller: Caller,
  entryId: string,
  accepted: AcceptedRecord,
  fields: SubmissionFields,
): Promise<{ entryId: string; revision: number }> {
  await entryWithRole(db, caller, entryId, "editor");
  if (fields.baseRevision === undefined) {
    throw new ApiError(
      422,
      "invalid-request",
      "say which revision this edit is based on (`baseRevision`)",
      { path: "baseRevision" },
    );
  }
  const boss = await analysisQueue();
  const saved = await addRevision(db, boss, {
    entryId,
    baseRevision: fields.baseRevision,
    record: accepted.document,
    authorId: caller.userId,
    message: fields.message ?? "",
    engineVersion: ENGINE_VERSION,
    ...(fields.title !== undefined ? { title: fields.title } : {}),
    ...(fields.category !== undefined ? { category: fields.category } : {}),
  });
  if (saved.ok) return { entryId, revision: saved.number };
  if (saved.code === "not-found") throw new ApiError(404, "not-found", "no such entry");
  // The base is stale: show what the other save changed, so the editor can redo theirs on top.
  const known = saved.currentRevision >= fields.baseRevision && fields.baseRevision >= 1;
  const changedSince = known
    ? await diffBetween(db, entryId, fields.baseRevision, saved.currentRevision)
    : null;
  throw new ApiError(
    409,
    "stale-revision",
    `this edit is based on revision ${fields.baseRevision}, but the entry is at revision ${saved.currentRevision}; nothing was saved`,
    {
      baseRevision: fields.baseRevision,
      currentRevision: saved.currentRevision,
      changedSince,
    },
  );
}

/** Archives or unarchives an entry and sets its visibility (editor or owner). */
export async function updateEntry(
  db: Database,
  caller: Caller,
  entryId: string,
  change: { archived?: boolean | undefined; visibility?: "team" | "public" | undefined },
): Promise<EntryRow> {
  const { entry } = await entryWithRole(db, caller, entryId, "editor");
  return db.transaction(async (tx) => {
    const archivedAt =
      change.archived === undefined
        ? {}
        : {
            archivedAt: change.archived ? sql`coalesce(${schema.entries.archivedAt}, now())` : null,
          };
    const visibility = change.visibility === undefined ? {} : { visibility: change.visibility };
    const [row] = await tx
      .update(schema.entries)
      .set({ ...archivedAt, ...visibility, updatedAt: sql`now()` })
      .where(eq(schema.entries.id, entryId))
      .returning();
    await audit(tx, {
      actorId: caller.userId,
      teamId: entry.teamId,
      action: "entry.update",
      targetType: "entry",
      targetId: entryId,
      detail: change,
    });
    return row!;
  });
}
