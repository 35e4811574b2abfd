/**
 * The team archive: one UTF-8 file of JSON lines (docs/team-archive.md). The first line says
 * what the file is, each following line is one row (a person, a membership, an entry, a
 * revision, an analysis, a comment, a photo) or one photo's bytes, and the last line counts the
 * lines and gives the SHA-256 of everything before it. Every line is validated here before an
 * import writes anything; ids are kept, so a round trip gives back the same rows.
 */
import { z } from "zod";
import { MAX_PHOTO_BYTES } from "@teardown/db/schema";

export const ARCHIVE_FORMAT = "teardown-team-archive";
export const ARCHIVE_VERSION = 1;
/** The media type of an archive, and its file name ending. */
export const ARCHIVE_MEDIA_TYPE = "application/x-teardown-team-archive";
export const ARCHIVE_SUFFIX = ".teardown-team.jsonl";

/** The largest archive an import reads (env TEAM_ARCHIVE_MAX_BYTES). */
export const maxArchiveBytes = () =>
  Number(process.env.TEAM_ARCHIVE_MAX_BYTES ?? 512 * 1024 * 1024);
/** The longest row line: a record is at most 2 MB of text, an analysis result a few MB. */
export const MAX_ROW_LINE_CHARS = 32 * 1024 * 1024;
/** The longest photo line: the photo limit in base64, plus room for the line's fields. */
export const MAX_FILE_LINE_CHARS = Math.ceil(MAX_PHOTO_BYTES / 3) * 4 + 1024;

const uuid = z.string().uuid();
const userId = z.string().min(1).max(200);
const time = z.string().datetime({ offset: true });
const sha256 = z.string().regex(/^[0-9a-f]{64}$/);
const role = z.enum(["owner", "editor", "viewer"]);
const json = z.unknown();

/** The kinds of line, each with the exact fields it carries. */
export const lineSchemas = {
  header: z.object({
    kind: z.literal("header"),
    format: z.literal(ARCHIVE_FORMAT),
    version: z.literal(ARCHIVE_VERSION),
    team: z.object({ name: z.string().min(1).max(100), slug: z.string().max(63) }),
    exportedAt: time,
  }),
  person: z.object({
    kind: z.literal("person"),
    id: userId,
    name: z.string().max(10_000),
    email: z.string().email().max(320),
  }),
  member: z.object({ kind: z.literal("member"), userId, role, createdAt: time }),
  entry: z.object({
    kind: z.literal("entry"),
    id: uuid,
    title: z.string().min(1).max(200),
    category: z.string().max(100).nullable(),
    visibility: z.enum(["team", "public"]),
    currentRevision: z.number().int().positive().nullable(),
    createdBy: userId.nullable(),
    createdAt: time,
    updatedAt: time,
    archivedAt: time.nullable(),
    searchText: z.string(),
    searchBlocks: z.array(z.string()),
    searchFlags: z.array(z.string()),
    fingerprint: z.array(z.number().int()),
    facets: json,
  }),
  revision: z.object({
    kind: z.literal("revision"),
    id: uuid,
    entryId: uuid,
    number: z.number().int().positive(),
    record: json,
    recordHash: sha256,
    authorId: userId.nullable(),
    message: z.string().max(2000),
    createdAt: time,
  }),
  analysis: z.object({
    kind: z.literal("analysis"),
    id: uuid,
    revisionId: uuid,
    engineVersion: z.string().min(1).max(100),
    state: z.enum(["queued", "running", "done", "failed"]),
    error: z.string().nullable(),
    errorStage: z.string().nullable(),
    result: json,
    layout: json,
    timings: json,
    queuedAt: time,
    startedAt: time.nullable(),
    finishedAt: time.nullable(),
  }),
  comment: z.object({
    kind: z.literal("comment"),
    id: uuid,
    entryId: uuid,
    partRef: z.string().max(100).nullable(),
    authorId: userId.nullable(),
    body: z.string().min(1).max(10_000),
    mentions: z.array(z.string()),
    createdAt: time,
  }),
  photo: z.object({
    kind: z.literal("photo"),
    id: uuid,
    entryId: uuid,
    side: z.enum(["component", "track", "other"]),
    storageKey: z.string().max(300),
    contentType: z.enum(["image/jpeg", "image/png", "image/webp"]),
    sizeBytes: z.number().int().positive().max(MAX_PHOTO_BYTES),
    sha256,
    caption: z.string().max(2000).nullable(),
    uploadedBy: userId.nullable(),
    createdAt: time,
  }),
  file: z.object({
    kind: z.literal("file"),
    photoId: uuid,
    sha256,
    base64: z.string().regex(/^[A-Za-z0-9+/]*={0,2}$/),
  }),
  end: z.object({ kind: z.literal("end"), lines: z.number().int().nonnegative(), sha256 }),
} as const;

export type LineKind = keyof typeof lineSchemas;
export type ArchiveLine<K extends LineKind> = z.infer<(typeof lineSchemas)[K]>;

/**
 * The one shape a photo's storage key may have in an archive: under its own entry and id. Any
 * other key (a `..`, an absolute path, another entry's folder) is refused, never written.
 */
export function photoKeyIsSafe(key: string, entryId: string, photoId: string): boolean {
  const m =
    /^photos\/([0-9a-f-]{36})\/([0-9a-f-]{36})\.[0-9]{1,5}x[0-9]{1,5}\.(jpg|png|webp)$/.exec(key);
  return m !== null && m[1] === entryId && m[2] === photoId;
}
