/** Creates a team and entries straight through the shared db functions, for integration tests. */
import { createEntry, schema, type Database } from "@teardown/db";
import type { PgBoss } from "pg-boss";
import { randomBytes } from "node:crypto";

/** A team with a random slug. */
export async function makeTeam(db: Database, name = "Test team"): Promise<string> {
  const [team] = await db
    .insert(schema.teams)
    .values({ name, slug: `t-${randomBytes(5).toString("hex")}` })
    .returning({ id: schema.teams.id });
  return team!.id;
}

/** An entry whose first revision holds `record`, with its analysis queued. */
export async function makeEntry(
  db: Database,
  boss: PgBoss,
  teamId: string,
  record: Record<string, unknown>,
  engineVersion: string,
) {
  return createEntry(db, boss, {
    teamId,
    title: String(record.title),
    category: "test",
    record,
    authorId: null,
    message: "first trace",
    engineVersion,
  });
}
