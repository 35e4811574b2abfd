/**
 * Comments on an entry or on one of its parts, with @mentions of team members. A mention is
 * `@` followed by a member's email, the part of it before the `@`, or their name without
 * spaces (any case); it is stored as the user's id. A mention that names nobody (or more than
 * one member) stays plain text.
 */
import { and, asc, eq } from "drizzle-orm";
import { schema, type Database } from "@teardown/db";
import { ApiError } from "./api-error";
import type { EntryRow } from "./access";
import { audit } from "./audit";
import type { Caller } from "./caller";
import { revisionByNumber, storedRecord } from "./revisions";
import { listMembers, type MemberView } from "./teams";

const MENTION = /(?:^|[^A-Za-z0-9._%+-])@([A-Za-z0-9._%+-]+(?:@[A-Za-z0-9.-]+\.[A-Za-z]{2,})?)/g;

/** The members a comment's @mentions name, by user id, each once, in order of first mention. */
export function resolveMentions(
  body: string,
  members: Pick<MemberView, "userId" | "name" | "email">[],
): string[] {
  const found: string[] = [];
  for (const m of body.matchAll(MENTION)) {
    const handle = m[1]!.replace(/[.]+$/, "").toLowerCase();
    const matches = members.filter(
      (u) =>
        u.email.toLowerCase() === handle ||
        u.email.toLowerCase().split("@")[0] === handle ||
        u.name.replace(/\s+/g, "").toLowerCase() === handle,
    );
    if (matches.length === 1 && !found.includes(matches[0]!.userId)) found.push(matches[0]!.userId);
  }
  return found;
}

/** A comment as the API shows it. */
export interface CommentView {
  id: string;
  partRef: string | null;
  authorId: string | null;
  authorName: string | null;
  body: string;
  mentions: string[];
  createdAt: Date;
}

const columns = {
  id: schema.comments.id,
  partRef: schema.comments.partRef,
  authorId: schema.comments.authorId,
  authorName: schema.users.name,
  body: schema.comments.body,
  mentions: schema.comments.mentions,
  createdAt: schema.comments.createdAt,
};

/** The entry's comments, oldest first; only those on one part when `partRef` is given. */
export async function listComments(
  db: Database,
  entryId: string,
  partRef?: string,
): Promise<CommentView[]> {
  const where =
    partRef === undefined
      ? eq(schema.comments.entryId, entryId)
      : and(eq(schema.comments.entryId, entryId), eq(schema.comments.partRef, partRef));
  return db
    .select(columns)
    .from(schema.comments)
    .leftJoin(schema.users, eq(schema.users.id, schema.comments.authorId))
    .where(where)
    .orderBy(asc(schema.comments.createdAt));
}

/** Adds a comment (any member); a part ref must name a part of the current revision. */
export async function addComment(
  db: Database,
  caller: Caller,
  entry: EntryRow,
  input: { body: string; partRef?: string | undefined },
): Promise<CommentView> {
  if (input.partRef !== undefined) {
    const current = await revisionByNumber(db, entry.id, entry.currentRevision ?? 1);
    if (!storedRecord(current.record).parts.some((p) => p.ref === input.partRef)) {
      throw new ApiError(
        422,
        "unknown-part",
        `the current revision has no part ${JSON.stringify(input.partRef)}`,
        { path: "partRef" },
      );
    }
  }
  const mentions = resolveMentions(input.body, await listMembers(db, entry.teamId));
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(schema.comments)
      .values({
        entryId: entry.id,
        partRef: input.partRef ?? null,
        authorId: caller.userId,
        body: input.body,
        mentions,
      })
      .returning();
    await audit(tx, {
      actorId: caller.userId,
      teamId: entry.teamId,
      action: "comment.add",
      targetType: "comment",
      targetId: row!.id,
      detail: { entryId: entry.id, partRef: input.partRef ?? null, mentions },
    });
    return {
      id: row!.id,
      partRef: row!.partRef,
      authorId: row!.authorId,
      authorName: caller.name,
      body: row!.body,
      mentions: row!.mentions,
      createdAt: row!.createdAt,
    };
  });
}
