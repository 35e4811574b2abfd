/**
 * Writes a whole team as one archive (archive-format.ts): its members and everyone who wrote
 * something in it, every entry with all revisions, analyses, comments and photos with their
 * bytes. Rows are read in one repeatable-read transaction, so the archive is one moment's view.
 */
import { createHash } from "node:crypto";
import { asc, eq, inArray } from "drizzle-orm";
import { schema, type Database } from "@teardown/db";
import type { BlobStore } from "../storage/blob-store";
import { ARCHIVE_FORMAT, ARCHIVE_VERSION } from "./archive-format";

type Row = Record<string, unknown>;

/** JSON with dates as ISO strings and no undefined fields (the archive's one way to write a row). */
function line(kind: string, row: Row): string {
  const out: Row = { kind };
  for (const [k, v] of Object.entries(row)) out[k] = v instanceof Date ? v.toISOString() : v;
  return JSON.stringify(out);
}

/** The archive text of team `teamId`, or null when there is no such team. */
export async function exportTeam(
  db: Database,
  store: BlobStore,
  teamId: string,
  now: Date,
): Promise<string | null> {
  const snapshot = await db.transaction(
    async (tx) => {
      const [team] = await tx.select().from(schema.teams).where(eq(schema.teams.id, teamId));
      if (!team) return null;
      const members = await tx
        .select()
        .from(schema.memberships)
        .where(eq(schema.memberships.teamId, teamId))
        .orderBy(asc(schema.memberships.createdAt), asc(schema.memberships.userId));
      const entries = await tx
        .select()
        .from(schema.entries)
        .where(eq(schema.entries.teamId, teamId))
        .orderBy(asc(schema.entries.createdAt), asc(schema.entries.id));
      const entryIds = entries.map((e) => e.id);
      const none = entryIds.length === 0;
      const revisions = none
        ? []
        : await tx
            .select()
            .from(schema.revisions)
            .where(inArray(schema.revisions.entryId, entryIds))
            .orderBy(asc(schema.revisions.entryId), asc(schema.revisions.number));
      const revIds = revisions.map((r) => r.id);
      const analyses =
        revIds.length === 0
          ? []
          : await tx
              .select()
              .from(schema.analyses)
              .where(inArray(schema.analyses.revisionId, revIds))
              .orderBy(asc(schema.analyses.revisionId), asc(schema.analyses.engineVersion));
      const comments = none
        ? []
        : await tx
            .select()
            .from(schema.comments)
            .where(inArray(schema.comments.entryId, entryIds))
            .orderBy(asc(schema.comments.createdAt), asc(schema.comments.id));
      const photos = none
        ? []
        : await tx
            .select()
            .from(schema.photos)
            .where(inArray(schema.photos.entryId, entryIds))
            .orderBy(asc(schema.photos.createdAt), asc(schema.photos.id));
      // Everyone a row names: members, and authors who have since left the team.
      const people = new Set<string>(members.map((m) => m.userId));
      for (const e of entries) if (e.createdBy) people.add(e.createdBy);
      for (const r of revisions) if (r.authorId) people.add(r.authorId);
      for (const c of comments) if (c.authorId) people.add(c.authorId);
      for (const p of photos) if (p.uploadedBy) people.add(p.uploadedBy);
      const users =
        people.size === 0
          ? []
          : await tx
              .select({ id: schema.users.id, name: schema.users.name, email: schema.users.email })
              .from(schema.users)
              .where(inArray(schema.users.id, [...people]))
              .orderBy(asc(schema.users.id));
      return { team, members, entries, revisions, analyses, comments, photos, users };
    },
    { isolationLevel: "repeatable read", accessMode: "read only" },
  );
  if (!snapshot) return null;

  const lines: string[] = [
    line("header", {
      format: ARCHIVE_FORMAT,
      version: ARCHIVE_VERSION,
      team: { name: snapshot.team.name, slug: snapshot.team.slug },
      exportedAt: now,
    }),
  ];
  for (const u of snapshot.users) lines.push(line("person", u));
  for (const m of snapshot.members)
    lines.push(line("member", { userId: m.userId, role: m.role, createdAt: m.createdAt }));
  // The search features added after the archive format was fixed are left out: they are
  // derived from the record, and the worker recomputes them for imported entries.
  for (const {
    teamId: _t,
    searchVector: _v,
    searchSupply: _s,
    valueFeatures: _vf,
    fragmentFeatures: _ff,
    topology: _tp,
    fingerprintVersion: _fv,
    searchTags: _tg,
    hasMismatch: _m,
    ...e
  } of snapshot.entries)
    lines.push(line("entry", e));
  for (const r of snapshot.revisions) lines.push(line("revision", r));
  for (const a of snapshot.analyses) lines.push(line("analysis", a));
  for (const { searchVector: _v, ...c } of snapshot.comments) lines.push(line("comment", c));
  for (const p of snapshot.photos) {
    lines.push(line("photo", p));
    const bytes = await store.get(p.storageKey);
    if (!bytes) throw new Error(`photo ${p.id} has no stored file at ${p.storageKey}`);
    const sha256 = createHash("sha256").update(bytes).digest("hex");
    lines.push(
      line("file", { photoId: p.id, sha256, base64: Buffer.from(bytes).toString("base64") }),
    );
  }
  const body = lines.map((l) => `${l}\n`).join("");
  const digest = createHash("sha256").update(body).digest("hex");
  return `${body}${line("end", { lines: lines.length, sha256: digest })}\n`;
}
