/**
 * Teardown entries and their immutable revisions. An entry points at its current revision by
 * number; the revision rows are never updated, so history and diffs are always reproducible.
 * The search columns are written by the worker from each analysis.
 */
import { sql, type SQL } from "drizzle-orm";
import {
  boolean,
  check,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  unique,
  uuid,
} from "drizzle-orm/pg-core";
import { users } from "./auth.js";
import { teams } from "./teams.js";
import { tsvector } from "./tsvector.js";

export const visibility = pgEnum("entry_visibility", ["team", "public"]);

export const entries = pgTable(
  "entries",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    teamId: uuid("team_id")
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    title: text("title").notNull(),
    category: text("category"),
    visibility: visibility("visibility").notNull().default("team"),
    currentRevision: integer("current_revision"),
    createdBy: text("created_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    archivedAt: timestamp("archived_at", { withTimezone: true }),
    // Search columns, filled by the worker from the current revision's analysis.
    searchText: text("search_text").notNull().default(""),
    searchBlocks: text("search_blocks")
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    searchFlags: text("search_flags")
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    fingerprint: integer("fingerprint")
      .array()
      .notNull()
      .default(sql`'{}'::integer[]`),
    facets: jsonb("facets")
      .notNull()
      .default(sql`'{}'::jsonb`),
    // Part labels with value decades: they only order entries whose topology scores tie.
    valueFeatures: integer("value_features")
      .array()
      .notNull()
      .default(sql`'{}'::integer[]`),
    // Kind counts and part-to-part links: fragment search's candidates (`@>` on a GIN index).
    fragmentFeatures: integer("fragment_features")
      .array()
      .notNull()
      .default(sql`'{}'::integer[]`),
    // The circuit's structure (parts' kinds and pins, nets' roles): fragment search confirms on it.
    topology: jsonb("topology")
      .notNull()
      .default(sql`'{}'::jsonb`),
    // The engine's feature definitions these columns were computed under; 0 = not yet.
    fingerprintVersion: integer("fingerprint_version").notNull().default(0),
    searchTags: text("search_tags").notNull().default(""),
    hasMismatch: boolean("has_mismatch").notNull().default(false),
    // The rated supply as "230/50", the supply facet's value.
    searchSupply: text("search_supply").generatedAlwaysAs(
      (): SQL =>
        sql`(${entries.facets} ->> 'supply_vrms') || '/' || (${entries.facets} ->> 'supply_hz')`,
    ),
    searchVector: tsvector("search_vector").generatedAlwaysAs(
      (): SQL =>
        sql`setweight(to_tsvector('simple', coalesce(${entries.title}, '')), 'A') || setweight(to_tsvector('simple', coalesce(${entries.category}, '') || ' ' || ${entries.searchTags}), 'B') || setweight(to_tsvector('simple', ${entries.searchText}), 'C')`,
    ),
  },
  (t) => [
    check("entries_title_length", sql`char_length(${t.title}) between 1 and 200`),
    check(
      "entries_current_revision_positive",
      sql`${t.currentRevision} is null or ${t.currentRevision} > 0`,
    ),
    index("entries_team_idx").on(t.teamId, t.updatedAt),
    // Search without words lists the newest first; this lets it stop at a page.
    index("entries_updated_idx").on(t.updatedAt, t.id),
    index("entries_search_vector_idx").using("gin", t.searchVector),
    index("entries_search_blocks_idx").using("gin", t.searchBlocks),
    index("entries_search_flags_idx").using("gin", t.searchFlags),
    index("entries_fingerprint_idx").using("gin", t.fingerprint),
    index("entries_fragment_features_idx").using("gin", t.fragmentFeatures),
    index("entries_fingerprint_version_idx").on(t.fingerprintVersion),
  ],
);

export const revisions = pgTable(
  "revisions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    entryId: uuid("entry_id")
      .notNull()
      .references(() => entries.id, { onDelete: "cascade" }),
    number: integer("number").notNull(),
    record: jsonb("record").notNull(),
    recordHash: text("record_hash").notNull(),
    authorId: text("author_id").references(() => users.id, { onDelete: "set null" }),
    message: text("message").notNull().default(""),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("revisions_entry_number_unique").on(t.entryId, t.number),
    check("revisions_number_positive", sql`${t.number} > 0`),
    check("revisions_hash_format", sql`${t.recordHash} ~ '^[0-9a-f]{64}$'`),
    check("revisions_message_length", sql`char_length(${t.message}) <= 2000`),
  ],
);

// The entry -> current revision key is circular (entries <-> revisions), so it is added in a
// hand-written migration as DEFERRABLE INITIALLY DEFERRED: see migrations/*_current_revision_fk.sql.
