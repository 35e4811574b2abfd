/**
 * The demo scenario's loader: idempotent (a second run adds nothing) and deterministic in its
 * records. It goes through the same functions the app uses (the engine's file reader, the
 * shared createEntry and addRevision), so it breaks when they change.
 */
import { createHash, randomUUID } from "node:crypto";
import { mkdir, writeFile } from "node:fs/promises";
import path from "node:path";
import { eq, sql } from "drizzle-orm";
import type { PgBoss } from "pg-boss";
import { addRevision, createEntry, dataDir, schema, type Database } from "@teardown/db";
import { ENGINE_VERSION } from "@teardown/engine";
import { drawBoardSketch, type SketchRecord } from "./board-sketch/draw-board.js";
import { addDemoMembers, hashDemoPasswords } from "./demo-members.js";
import { demoRecordDocs } from "./demo-records.js";
import { DEMO_MEMBERS, DEMO_PASSWORD, DEMO_SIGN_IN, DEMO_TEAM } from "./scenario.js";

export { demoRecordDocs, readDemoRecord, RECORDS_DIR } from "./demo-records.js";
export { demoUserId } from "./demo-members.js";
export * from "./scenario.js";

export interface SeedOutcome {
  loaded: boolean;
  entries: number;
  revisions: number;
  /** The demo member to sign in as (printed by `npm start`). */
  signIn: { email: string; password: string };
}

export interface SeedOptions {
  /** Where uploaded files live; the web app serves photos from `<data dir>/uploads`. */
  uploadsDir?: string;
}

/** The sign-in line's member. */
function signIn(): SeedOutcome["signIn"] {
  return {
    email: DEMO_MEMBERS.find((m) => m.key === DEMO_SIGN_IN)!.email,
    password: DEMO_PASSWORD,
  };
}

function sketchOf(doc: Record<string, unknown>): SketchRecord {
  const parts = (doc.parts as Array<Record<string, unknown>>).map((p) => ({
    ref: String(p.ref),
    kind: String(p.kind),
    polarised: p.polarised === true,
  }));
  const spacings = ((doc.board as Record<string, unknown> | undefined)?.spacings ?? []) as Array<
    Record<string, unknown>
  >;
  return { parts, hasSlot: spacings.some((s) => s.slot === true) };
}

function categoryOf(doc: Record<string, unknown>): string | null {
  return (
    ((doc.device as Record<string, unknown> | undefined)?.category as string | undefined) ?? null
  );
}

async function demoTeamExists(db: Pick<Database, "select">): Promise<boolean> {
  const found = await db
    .select({ id: schema.teams.id })
    .from(schema.teams)
    .where(eq(schema.teams.slug, DEMO_TEAM.slug));
  return found.length > 0;
}

/** Loads the demo team, its members and its entries unless the demo team already exists. */
export async function loadDemoData(
  db: Database,
  boss: PgBoss,
  opts: SeedOptions = {},
): Promise<SeedOutcome> {
  const uploadsDir = opts.uploadsDir ?? path.join(dataDir(), "uploads");
  const entries = demoRecordDocs();
  // Password hashing is slow by design, so a start that finds the demo loaded skips it; the
  // check under the lock below is the one that counts.
  if (await demoTeamExists(db))
    return { loaded: false, entries: 0, revisions: 0, signIn: signIn() };
  const hashes = await hashDemoPasswords();
  // One transaction for the team, its members and all its entries: an interrupted load leaves
  // nothing in the database, so the next start loads it whole. (A sketch file written before a
  // failed commit stays behind unreferenced, which is harmless.)
  return db.transaction(async (tx) => {
    // Serialise concurrent starts (several replicas) on one lock for the seed.
    await tx.execute(sql`select pg_advisory_xact_lock(72450020)`);
    if (await demoTeamExists(tx))
      return { loaded: false, entries: 0, revisions: 0, signIn: signIn() };
    const [team] = await tx
      .insert(schema.teams)
      .values({ name: DEMO_TEAM.name, slug: DEMO_TEAM.slug })
      .returning({ id: schema.teams.id });
    const teamId = team!.id;
    const members = await addDemoMembers(tx, teamId, hashes);
    let revisions = 0;
    for (const e of entries) {
      const [first, ...later] = e.revisions;
      const current = e.revisions[e.revisions.length - 1]!;
      const { entryId, revisionId } = await createEntry(tx, boss, {
        teamId,
        title: String(first!.doc.title),
        category: categoryOf(first!.doc),
        visibility: e.visibility,
        record: first!.doc,
        authorId: members.get(first!.author) ?? null,
        message: first!.message,
        engineVersion: ENGINE_VERSION,
      });
      await tx
        .update(schema.revisions)
        .set({ createdAt: new Date(first!.at) })
        .where(eq(schema.revisions.id, revisionId));
      for (const [i, r] of later.entries()) {
        const added = await addRevision(tx, boss, {
          entryId,
          baseRevision: i + 1,
          record: r.doc,
          title: String(r.doc.title),
          category: categoryOf(r.doc),
          authorId: members.get(r.author) ?? null,
          message: r.message,
          engineVersion: ENGINE_VERSION,
        });
        if (!added.ok)
          throw new Error(`demo entry ${e.slug}: revision ${i + 2} was not added (${added.code})`);
        await tx
          .update(schema.revisions)
          .set({ createdAt: new Date(r.at) })
          .where(eq(schema.revisions.id, added.revisionId));
      }
      revisions += e.revisions.length;
      await tx
        .update(schema.entries)
        .set({ createdAt: new Date(first!.at), updatedAt: new Date(current.at) })
        .where(eq(schema.entries.id, entryId));
      for (const c of e.comments)
        await tx.insert(schema.comments).values({
          entryId,
          authorId: members.get(c.author) ?? null,
          body: c.body,
          partRef: c.partRef ?? null,
          createdAt: new Date(c.at),
        });
      // A drawn sketch of the current board, stored like an uploaded photo.
      const sketch = drawBoardSketch(sketchOf(current.doc));
      const photoId = randomUUID();
      const key = `photos/${entryId}/${photoId}.${sketch.width}x${sketch.height}.png`;
      const file = path.join(uploadsDir, ...key.split("/"));
      await mkdir(path.dirname(file), { recursive: true });
      await writeFile(file, sketch.png);
      await tx.insert(schema.photos).values({
        id: photoId,
        entryId,
        side: "component",
        storageKey: key,
        contentType: "image/png",
        sizeBytes: sketch.png.byteLength,
        sha256: createHash("sha256").update(sketch.png).digest("hex"),
        caption: "Drawn sketch of the board layout (not a photograph)",
        uploadedBy: members.get(current.author) ?? null,
        createdAt: new Date(current.at),
      });
    }
    return { loaded: true, entries: entries.length, revisions, signIn: signIn() };
  });
}
