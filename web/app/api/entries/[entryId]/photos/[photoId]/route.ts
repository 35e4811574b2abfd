/** GET /api/entries/:entryId/photos/:photoId: the photo's bytes (entry's visibility rules). DELETE: removes it (editor or owner). */
import { entryWithRole, readableEntry } from "@/lib/access";
import { answer } from "@/lib/api-error";
import { findCaller, requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { deletePhoto, readPhoto } from "@/lib/photos";
import { json, uuidParam } from "@/lib/route-input";
import { uploadStore } from "@/lib/storage/local-disk-store";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ entryId: string; photoId: string }> };

export function GET(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const params = await ctx.params;
    const { entry } = await readableEntry(db, await findCaller(req), uuidParam(params.entryId));
    const { row, bytes } = await readPhoto(
      db,
      uploadStore(),
      entry.id,
      uuidParam(params.photoId, "photo"),
    );
    const etag = `"${row.sha256}"`;
    const cache = entry.visibility === "public" ? "public, max-age=3600" : "private, max-age=3600";
    if (req.headers.get("if-none-match") === etag)
      return new Response(null, { status: 304, headers: { etag, "cache-control": cache } });
    return new Response(bytes as BodyInit, {
      headers: {
        "content-type": row.contentType,
        "content-length": String(bytes.byteLength),
        etag,
        "cache-control": cache,
        "x-content-type-options": "nosniff",
      },
    });
  });
}

export function DELETE(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const params = await ctx.params;
    const caller = await requireCaller(req);
    const { entry } = await entryWithRole(db, caller, uuidParam(params.entryId), "editor");
    await deletePhoto(db, uploadStore(), caller, entry, uuidParam(params.photoId, "photo"));
    return json({ deleted: true });
  });
}
