/** Board photos and comments on an entry (or on one part of it). */
import { sql, type SQL } from "drizzle-orm";
import { check, index, integer, pgEnum, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { users } from "./auth.js";
import { entries } from "./entries.js";
import { tsvector } from "./tsvector.js";

/** The largest photo accepted, in bytes (15 MB). */
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;

export const photoSide = pgEnum("photo_side", ["component", "track", "other"]);

export const photos = pgTable(
  "photos",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    entryId: uuid("entry_id")
      .notNull()
      .references(() => entries.id, { onDelete: "cascade" }),
    side: photoSide("side").notNull(),
    storageKey: text("storage_key").notNull().unique(),
    contentType: text("content_type").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    sha256: text("sha256").notNull(),
    caption: text("caption"),
    uploadedBy: text("uploaded_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    check(
      "photos_content_type",
      sql`${t.contentType} in ('image/jpeg', 'image/png', 'image/webp')`,
    ),
    check(
      "photos_size",
      sql`${t.sizeBytes} > 0 and ${t.sizeBytes} <= ${sql.raw(String(MAX_PHOTO_BYTES))}`,
    ),
    check("photos_sha256_format", sql`${t.sha256} ~ '^[0-9a-f]{64}$'`),
    index("photos_entry_idx").on(t.entryId),
  ],
);

export const comments = pgTable(
  "comments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    entryId: uuid("entry_id")
      .notNull()
      .references(() => entries.id, { onDelete: "cascade" }),
    /** Set when the comment is about one part (by its ref in the current record). */
    partRef: text("part_ref"),
    authorId: text("author_id").references(() => users.id, { onDelete: "set null" }),
    body: text("body").notNull(),
    mentions: text("mentions")
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    // Comments are searched only for members of the entry's team (search checks that).
    searchVector: tsvector("search_vector").generatedAlwaysAs(
      (): SQL => sql`to_tsvector('simple', ${comments.body})`,
    ),
  },
  (t) => [
    check("comments_body_length", sql`char_length(${t.body}) between 1 and 10000`),
    index("comments_entry_idx").on(t.entryId, t.createdAt),
    index("comments_search_vector_idx").using("gin", t.searchVector),
  ],
);
