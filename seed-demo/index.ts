/**
 * The demo scenario's loader: idempotent (a second run adds nothing) and deterministic. It goes
 * through the same functions the app uses (the engine's file reader, the shared createEntry),
 * so it breaks when they change.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { eq, sql } from "drizzle-orm";
import type { PgBoss } from "pg-boss";
import { createEntry, schema, type Database } from "@teardown/db";
import { ENGINE_VERSION, readCircuitFile, serializeRecord } from "@teardown/engine";
import { DEMO_ENTRIES, DEMO_TEAM } from "./scenario.js";

export interface SeedOutcome {
  loaded: boolean;
  entries: number;
}

const RECORDS_DIR = path.join(path.dirname(fileURLToPath(import.meta.url)), "records");

/** The demo record documents (record format, as stored in revisions), in scenario order. */
export function demoRecordDocs(): Array<{
  file: string;
  doc: Record<string, unknown>;
  visibility: "team" | "public";
  message: string;
}> {
  return DEMO_ENTRIES.map((e) => {
    const text = readFileSync(path.join(RECORDS_DIR, e.file), "utf8");
    const parsed = readCircuitFile(text, { filename: e.file });
    if (!parsed.ok)
      throw new Error(
        `demo record ${e.file} is invalid: ${parsed.errors.map((x) => `${x.line}: ${x.path}: ${x.message}`).join("; ")}`,
      );
    return {
      ...e,
      doc: JSON.parse(serializeRecord(parsed.record, "json")) as Record<string, unknown>,
    };
  });
}

/** Loads the demo team and its entries unless the demo team already exists. */
export async function loadDemoData(db: Database, boss: PgBoss): Promise<SeedOutcome> {
  const docs = demoRecordDocs();
  // One transaction for the team and all its entries: an interrupted load leaves nothing, so
  // the next start loads it whole.
  return db.transaction(async (tx) => {
    // Serialise concurrent starts (several replicas) on one lock for the seed.
    await tx.execute(sql`select pg_advisory_xact_lock(72450020)`);
    const found = await tx
      .select({ id: schema.teams.id })
      .from(schema.teams)
      .where(eq(schema.teams.slug, DEMO_TEAM.slug));
    if (found.length > 0) return { loaded: false, entries: 0 };
    const [team] = await tx
      .insert(schema.teams)
      .values({ name: DEMO_TEAM.name, slug: DEMO_TEAM.slug })
      .returning({ id: schema.teams.id });
    for (const d of docs)
      await createEntry(tx, boss, {
        teamId: team!.id,
        title: String(d.doc.title),
        category:
          ((d.doc.device as Record<string, unknown> | undefined)?.category as string | undefined) ??
          null,
        visibility: d.visibility,
        record: d.doc,
        authorId: null,
        message: d.message,
        engineVersion: ENGINE_VERSION,
      });
    return { loaded: true, entries: docs.length };
  });
}
