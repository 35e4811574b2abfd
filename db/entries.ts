/**
 * Entries and revisions: every write is one transaction that also enqueues the revision's
 * analysis, so a committed revision always has its job. Shared by the web app, the seed and tests.
 */
import { createHash } from "node:crypto";
import { and, eq, sql } from "drizzle-orm";
import type { PgBoss } from "pg-boss";
import type { Database } from "./client.js";
import { enqueueAnalysis } from "./queue.js";
import * as schema from "./schema/index.js";

/** JSON with object keys sorted, so equal records hash equally whatever their key order. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(",")}]`;
  if (value && typeof value === "object") {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
  }
  return JSON.stringify(value ?? null);
}

/** The sha256 (hex) of a record document's canonical JSON. */
export function recordHash(doc: unknown): string {
  return createHash("sha256").update(canonicalJson(doc)).digest("hex");
}

/** The database or an open transaction (a nested call runs in a savepoint). */
export type DatabaseOrTx = Database | Parameters<Parameters<Database["transaction"]>[0]>[0];

export interface NewEntry {
  teamId: string;
  title: string;
  category: string | null;
  visibility?: "team" | "public";
  /** The record document (record format version 1, as JSON). */
  record: unknown;
  authorId: string | null;
  message: string;
  engineVersion: string;
}

/** Creates an entry with its first revision and queues its analysis, in one transaction. */
export async function createEntry(
  db: DatabaseOrTx,
  boss: PgBoss,
  input: NewEntry,
): Promise<{ entryId: string; revisionId: string }> {
  return db.transaction(async (tx) => {
    const [entry] = await tx
      .insert(schema.entries)
      .values({
        teamId: input.teamId,
        title: input.title,
        category: input.category,
        visibility: input.visibility ?? "team",
        createdBy: input.authorId,
        currentRevision: 1,
      })
      .returning({ id: schema.entries.id });
    const [rev] = await tx
      .insert(schema.revisions)
      .values({
        entryId: entry!.id,
        number: 1,
        record: input.record,
        recordHash: recordHash(input.record),
        authorId: input.authorId,
        message: input.message,
      })
      .returning({ id: schema.revisions.id });
    await enqueueAnalysis(tx, boss, { revisionId: rev!.id, engineVersion: input.engineVersion });
    await tx.insert(schema.auditLog).values({
      actorId: input.authorId,
      teamId: input.teamId,
      action: "entry.create",
      targetType: "entry",
      targetId: entry!.id,
      detail: { revision: 1 },
    });
    return { entryId: entry!.id, revisionId: rev!.id };
  });
}

export type AddRevisionResult =
  | { ok: true; revisionId: string; number: number }
  | { ok: false; code: "stale"; currentRevision: number }
  | { ok: false; code: "not-found" };

/**
 * Adds a revision on top of `baseRevision`. When someone saved in between, nothing is written
 * and the caller gets the current number, so it can show what changed (nothing is lost).
 */
export async function addRevision(
  db: DatabaseOrTx,
  boss: PgBoss,
  input: {
    entryId: string;
    baseRevision: number;
    record: unknown;
    title?: string;
    category?: string | null;
    authorId: string | null;
    message: string;
    engineVersion: string;
  },
): Promise<AddRevisionResult> {
  return db.transaction(async (tx) => {
    // Lock the entry row so two saves on the same base cannot both pass the check.
    const rows = await tx.execute<{ current_revision: number | null; team_id: string }>(
      sql`select current_revision, team_id from entries where id = ${input.entryId} for update`,
    );
    const row = rows.rows[0];
    if (!row) return { ok: false, code: "not-found" } as const;
    const current = row.current_revision ?? 0;
    if (current !== input.baseRevision)
      return { ok: false, code: "stale", currentRevision: current } as const;
    const number = current + 1;
    const [rev] = await tx
      .insert(schema.revisions)
      .values({
        entryId: input.entryId,
        number,
        record: input.record,
        recordHash: recordHash(input.record),
        authorId: input.authorId,
        message: input.message,
      })
      .returning({ id: schema.revisions.id });
    await tx
      .update(schema.entries)
      .set({
        currentRevision: number,
        updatedAt: sql`now()`,
        ...(input.title !== undefined ? { title: input.title } : {}),
        ...(input.category !== undefined ? { category: input.category } : {}),
      })
      .where(and(eq(schema.entries.id, input.entryId)));
    await enqueueAnalysis(tx, boss, { revisionId: rev!.id, engineVersion: input.engineVersion });
    await tx.insert(schema.auditLog).values({
      actorId: input.authorId,
      teamId: row.team_id,
      action: "entry.revise",
      targetType: "entry",
      targetId: input.entryId,
      detail: { revision: number },
    });
    return { ok: true, revisionId: rev!.id, number } as const;
  });
}
