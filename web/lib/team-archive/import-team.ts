/**
 * Imports a checked archive into an EMPTY team of this instance, in one transaction: people are
 * matched by email to accounts here (or added without a way to sign in, so their names stay on
 * what they wrote), memberships are added with their archived roles (existing ones are kept),
 * then entries, revisions, analyses, comments and photos keep their ids. Photo files are stored
 * after the rows and before the commit, and removed again if it fails, so a refused import
 * leaves nothing behind.
 */
import { eq, inArray, sql } from "drizzle-orm";
import { schema, type Database } from "@teardown/db";
import { ApiError } from "../api-error";
import { audit } from "../audit";
import type { BlobStore } from "../storage/blob-store";
import type { CheckedArchive } from "./read-archive";

const date = (s: string) => new Date(s);
const maybeDate = (s: string | null) => (s === null ? null : new Date(s));

export interface ImportSummary {
  entries: number;
  revisions: number;
  analyses: number;
  comments: number;
  photos: number;
  members: number;
  peopleAdded: number;
}

/** Writes the archive into team `teamId` (which must hold no entries), as `actorId`. */
export async function importTeam(
  db: Database,
  store: BlobStore,
  teamId: string,
  actorId: string,
  a: CheckedArchive,
): Promise<ImportSummary> {
  const written: string[] = [];
  try {
    return await db.transaction(async (tx) => {
      // Lock the team row so two imports into one team cannot both see it empty.
      await tx.execute(sql`select id from teams where id = ${teamId} for update`);
      const [held] = await tx
        .select({ n: sql<number>`count(*)::int` })
        .from(schema.entries)
        .where(eq(schema.entries.teamId, teamId));
      if ((held?.n ?? 0) > 0)
        throw new ApiError(
          409,
          "team-not-empty",
          "a team archive imports only into a team with no entries",
        );
      if (a.entries.length > 0) {
        const clash = await tx
          .select({ id: schema.entries.id })
          .from(schema.entries)
          .where(
            inArray(
              schema.entries.id,
              a.entries.map((e) => e.id),
            ),
          );
        if (clash.length > 0)
          throw new ApiError(
            409,
            "archive-already-imported",
            "entries of this archive already exist on this instance (an archive imports once per instance)",
          );
      }
      // People: an account with the same email here is that person; else a row without sign-in.
      const idFor = new Map<string, string>();
      let peopleAdded = 0;
      if (a.people.length > 0) {
        const known = await tx
          .select({ id: schema.users.id, email: schema.users.email })
          .from(schema.users)
          .where(
            inArray(
              schema.users.email,
              a.people.map((p) => p.email),
            ),
          );
        const byEmail = new Map(known.map((u) => [u.email, u.id]));
        for (const p of a.people) {
          const here = byEmail.get(p.email);
          if (here) {
            idFor.set(p.id, here);
            continue;
          }
          const [taken] = await tx
            .select({ id: schema.users.id })
            .from(schema.users)
            .where(eq(schema.users.id, p.id));
          const id = taken ? crypto.randomUUID() : p.id;
          await tx
            .insert(schema.users)
            .values({ id, name: p.name, email: p.email, emailVerified: false });
          idFor.set(p.id, id);
          peopleAdded++;
        }
      }
      const who = (id: string | null) => (id === null ? null : idFor.get(id)!);
      if (a.members.length > 0)
        await tx
          .insert(schema.memberships)
          .values(
            a.members.map((m) => ({
              teamId,
              userId: who(m.userId)!,
              role: m.role,
              createdAt: date(m.createdAt),
            })),
          )
          .onConflictDoNothing();
      for (const e of a.entries)
        await tx.insert(schema.entries).values({
          ...withoutKind(e),
          teamId,
          createdBy: who(e.createdBy),
          createdAt: date(e.createdAt),
          updatedAt: date(e.updatedAt),
          archivedAt: maybeDate(e.archivedAt),
          facets: e.facets as Record<string, unknown>,
        });
      for (const r of a.revisions)
        await tx.insert(schema.revisions).values({
          ...withoutKind(r),
          record: r.record as Record<string, unknown>,
          authorId: who(r.authorId),
          createdAt: date(r.createdAt),
        });
      for (const x of a.analyses)
        await tx.insert(schema.analyses).values({
          ...withoutKind(x),
          result: x.result as never,
          layout: x.layout as never,
          timings: x.timings as never,
          queuedAt: date(x.queuedAt),
          startedAt: maybeDate(x.startedAt),
          finishedAt: maybeDate(x.finishedAt),
        });
      for (const c of a.comments)
        await tx
          .insert(schema.comments)
          .values({ ...withoutKind(c), authorId: who(c.authorId), createdAt: date(c.createdAt) });
      for (const p of a.photos)
        await tx.insert(schema.photos).values({
          ...withoutKind(p),
          uploadedBy: who(p.uploadedBy),
          createdAt: date(p.createdAt),
        });
      // Files last, once every row went in (a clash has rolled back before any file is touched);
      // a failed write or commit from here removes the files again (below).
      for (const p of a.photos) {
        written.push(p.storageKey);
        await store.put(p.storageKey, a.files.get(p.id)!);
      }
      await audit(tx, {
        actorId,
        teamId,
        action: "team.import",
        targetType: "team",
        targetId: teamId,
        detail: { entries: a.entries.length, exportedAt: a.header.exportedAt },
      });
      return {
        entries: a.entries.length,
        revisions: a.revisions.length,
        analyses: a.analyses.length,
        comments: a.comments.length,
        photos: a.photos.length,
        members: a.members.length,
        peopleAdded,
      };
    });
  } catch (err) {
    for (const key of written) await store.delete(key).catch(() => {});
    throw err;
  }
}

function withoutKind<T extends { kind: string }>(row: T): Omit<T, "kind"> {
  const { kind: _kind, ...rest } = row;
  void _kind;
  return rest;
}
