/**
 * GET /api/entries/:entryId/photos: the entry's photos with pixel sizes and URLs.
 * POST (multipart `file`, `side` component|track|other, `caption?`): uploads a JPEG, PNG or
 * WebP of at most 15 MB (413 above, 415 for anything else, judged by content). Editor or owner.
 */
import { entryWithRole, readableEntry } from "@/lib/access";
import { answer } from "@/lib/api-error";
import { findCaller, requireCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { listPhotos, uploadPhoto } from "@/lib/photos";
import { json, uuidParam } from "@/lib/route-input";
import { uploadStore } from "@/lib/storage/local-disk-store";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ entryId: string }> };

export function GET(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const { entry } = await readableEntry(
      db,
      await findCaller(req),
      uuidParam((await ctx.params).entryId),
    );
    return json({ photos: await listPhotos(db, entry.id) });
  });
}

export function POST(req: Request, ctx: Ctx): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const caller = await requireCaller(req);
    const { entry } = await entryWithRole(
      db,
      caller,
      uuidParam((await ctx.params).entryId),
      "editor",
    );
    return json({ photo: await uploadPhoto(db, uploadStore(), caller, entry, req) }, 201);
  });
}
