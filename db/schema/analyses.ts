/**
 * One analysis per (revision, engine version). The worker upserts it idempotently; older
 * engine versions' rows stay readable until the new one is done.
 */
import { sql } from "drizzle-orm";
import {
  check,
  index,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  unique,
  uuid,
} from "drizzle-orm/pg-core";
import { revisions } from "./entries.js";

export const analysisState = pgEnum("analysis_state", ["queued", "running", "done", "failed"]);

export const analyses = pgTable(
  "analyses",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    revisionId: uuid("revision_id")
      .notNull()
      .references(() => revisions.id, { onDelete: "cascade" }),
    engineVersion: text("engine_version").notNull(),
    state: analysisState("state").notNull().default("queued"),
    error: text("error"),
    errorStage: text("error_stage"),
    result: jsonb("result"),
    layout: jsonb("layout"),
    timings: jsonb("timings")
      .notNull()
      .default(sql`'{}'::jsonb`),
    queuedAt: timestamp("queued_at", { withTimezone: true }).notNull().defaultNow(),
    startedAt: timestamp("started_at", { withTimezone: true }),
    finishedAt: timestamp("finished_at", { withTimezone: true }),
  },
  (t) => [
    unique("analyses_revision_engine_unique").on(t.revisionId, t.engineVersion),
    check("analyses_failed_has_error", sql`${t.state} <> 'failed' or ${t.error} is not null`),
    check("analyses_done_has_result", sql`${t.state} <> 'done' or ${t.result} is not null`),
    check(
      "analyses_running_has_start",
      sql`${t.state} not in ('running', 'done') or ${t.startedAt} is not null`,
    ),
    index("analyses_state_idx").on(t.state),
  ],
);
