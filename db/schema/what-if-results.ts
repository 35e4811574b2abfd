/**
 * Cached what-if analyses: one row per (revision, engine version, input). The input key is a hash
 * of the checked request (the supply and the part changes in SI units, in part order), so the
 * same question written another way ("22k" or 22000) finds the same row. Rows go with their
 * revision; a new engine version simply misses and computes afresh.
 */
import { index, jsonb, pgTable, text, timestamp, unique, uuid } from "drizzle-orm/pg-core";
import { revisions } from "./entries.js";

export const whatIfResults = pgTable(
  "what_if_results",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    revisionId: uuid("revision_id")
      .notNull()
      .references(() => revisions.id, { onDelete: "cascade" }),
    engineVersion: text("engine_version").notNull(),
    inputKey: text("input_key").notNull(),
    input: jsonb("input").notNull(),
    result: jsonb("result").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("what_if_results_key_unique").on(t.revisionId, t.engineVersion, t.inputKey),
    index("what_if_results_created_idx").on(t.createdAt),
  ],
);
