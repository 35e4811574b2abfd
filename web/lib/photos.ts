/**
 * Board photos: JPEG, PNG or WebP up to 15 MB, the type taken from the bytes. The original is
 * stored as uploaded and served with its pixel size; pages show it size-constrained with CSS
 * (no image library may be installed, and a re-encoder in JS is slow and lossy for 15 MB photos).
 * The pixel size is read once at upload and kept in the storage key, so listing reads no files.
 */
import { createHash, randomUUID } from "node:crypto";
import { and, asc, eq } from "drizzle-orm";
import { z } from "zod";
import { schema, type Database } from "@teardown/db";
import { MAX_PHOTO_BYTES } from "@teardown/db/schema";
import { ApiError, notFound } from "./api-error";
import type { EntryRow } from "./access";
import { audit } from "./audit";
import type { Caller } from "./caller";
import { probeImage, type ImageType } from "./image-probe";
import {
  MULTIPART_OVERHEAD_BYTES,
  formFile,
  formText,
  readForm,
  tooLarge,
  validate,
} from "./request-body";
import type { BlobStore } from "./storage/blob-store";

const EXTENSION: Readonly<Record<ImageType, string>> = {
  "image/jpeg": "jpg",
  "image/png": "png",
  "image/webp": "webp",
};

const photoFields = z.object({
  side: z.enum(["component", "track", "other"]),
  caption: z.string().trim().max(500).optional(),
});

/** A photo as the API lists it. */
export interface PhotoView {
  id: string;
  side: "component" | "track" | "other";
  contentType: string;
  sizeBytes: number;
  width: number | null;
  height: number | null;
  sha256: string;
  caption: string | null;
  uploadedBy: string | null;
  createdAt: Date;
  url: string;
}

type PhotoRow = typeof schema.photos.$inferSelect;

/** The pixel size kept in a storage key (`.../<id>.<w>x<h>.<ext>`). */
function sizeFromKey(key: string): { width: number | null; height: number | null } {
  const m = /\.(\d+)x(\d+)\.[a-z]+$/.exec(key);
  return m ? { width: Number(m[1]), height: Number(m[2]) } : { width: null, height: null };
}

function photoView(row: PhotoRow): PhotoView {
  return {
    id: row.id,
    side: row.side,
    contentType: row.contentType,
    sizeBytes: row.sizeBytes,
    ...sizeFromKey(row.storageKey),
    sha256: row.sha256,
    caption: row.caption,
    uploadedBy: row.uploadedBy,
    createdAt: row.createdAt,
    url: `/api/entries/${row.entryId}/photos/${row.id}`,
  };
}

/** Reads a photo upload (multipart: `file`, `side`, optional `caption`) and stores it. */
export async function uploadPhoto(
  db: Database,
  store: BlobStore,
  caller: Caller,
  entry: EntryRow,
  req: Request,
): Promise<PhotoView> {
  const form = await readForm(
    req,
    MAX_PHOTO_BYTES + MULTIPART_OVERHEAD_BYTES,
    "photo",
    MAX_PHOTO_BYTES,
  );
  const file = formFile(form, "file");
  if (file.size > MAX_PHOTO_BYTES) throw tooLarge(MAX_PHOTO_BYTES, "photo");
  const fields = validate(photoFields, {
    side: formText(form, "side"),
    caption: formText(form, "caption") || undefined,
  });
  const bytes = new Uint8Array(await file.arrayBuffer());
  const info = probeImage(bytes);
  if (!info)
    throw new ApiError(
      415,
      "unsupported-media-type",
      "a photo must be a JPEG, PNG or WebP image (judged by its content, not its name)",
      { path: "file" },
    );
  const id = randomUUID();
  const key = `photos/${entry.id}/${id}.${info.width}x${info.height}.${EXTENSION[info.contentType]}`;
  const sha256 = createHash("sha256").update(bytes).digest("hex");
  await store.put(key, bytes);
  try {
    return await db.transaction(async (tx) => {
      const [row] = await tx
        .insert(schema.photos)
        .values({
          id,
          entryId: entry.id,
          side: fields.side,
          storageKey: key,
          contentType: info.contentType,
          sizeBytes: bytes.byteLength,
          sha256,
          caption: fields.caption ?? null,
          uploadedBy: caller.userId,
        })
        .returning();
      await audit(tx, {
        actorId: caller.userId,
        teamId: entry.teamId,
        action: "photo.upload",
        targetType: "photo",
        targetId: id,
        detail: { entryId: entry.id, side: fields.side, sha256 },
      });
      return photoView(row!);
    });
  } catch (err) {
    // The row did not commit, so the file must not stay behind.
    await store.delete(key).catch(() => {});
    throw err;
  }
}

/** The entry's photos, oldest first. */
export async function listPhotos(db: Database, entryId: string): Promise<PhotoView[]> {
  const rows = await db
    .select()
    .from(schema.photos)
    .where(eq(schema.photos.entryId, entryId))
    .orderBy(asc(schema.photos.createdAt));
  return rows.map(photoView);
}

async function photoRow(db: Database, entryId: string, photoId: string): Promise<PhotoRow> {
  const [row] = await db
    .select()
    .from(schema.photos)
    .where(and(eq(schema.photos.id, photoId), eq(schema.photos.entryId, entryId)));
  if (!row) throw notFound("photo");
  return row;
}

/** A photo's bytes and what to serve them as. */
export async function readPhoto(
  db: Database,
  store: BlobStore,
  entryId: string,
  photoId: string,
): Promise<{ row: PhotoRow; bytes: Uint8Array }> {
  const row = await photoRow(db, entryId, photoId);
  const bytes = await store.get(row.storageKey);
  if (!bytes) throw notFound("photo file");
  return { row, bytes };
}

/** Deletes a photo: the row (with its audit row) first, then the file. */
export async function deletePhoto(
  db: Database,
  store: BlobStore,
  caller: Caller,
  entry: EntryRow,
  photoId: string,
): Promise<void> {
  const row = await photoRow(db, entry.id, photoId);
  await db.transaction(async (tx) => {
    await tx.delete(schema.photos).where(eq(schema.photos.id, photoId));
    await audit(tx, {
      actorId: caller.userId,
      teamId: entry.teamId,
      action: "photo.delete",
      targetType: "photo",
      targetId: photoId,
      detail: { entryId: entry.id },
    });
  });
  // A file left by a failed delete is harmless (nothing points at it); a missing row is not.
  await store.delete(row.storageKey).catch(() => {});
}
