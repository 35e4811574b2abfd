/**
 * GET /api/entries/:entryId/export/:file?revision=n, file one of record.yaml, record.json,
 * analysis.json, schematic.svg (the last two once the analysis is done; 409 before).
 */
import { z } from "zod";
import { readableEntry } from "@/lib/access";
import { answer, notFound } from "@/lib/api-error";
import { findCaller } from "@/lib/caller";
import { database } from "@/lib/database";
import { EXPORT_KINDS, exportEntry, type ExportKind } from "@/lib/entry-export";
import { readQuery, uuidParam } from "@/lib/route-input";

export const dynamic = "force-dynamic";

const exportQuery = z.object({ revision: z.coerce.number().int().positive().optional() });

export function GET(
  req: Request,
  ctx: { params: Promise<{ entryId: string; file: string }> },
): Promise<Response> {
  return answer(async () => {
    const { db } = database();
    const params = await ctx.params;
    if (!(EXPORT_KINDS as readonly string[]).includes(params.file)) throw notFound("export");
    const { entry } = await readableEntry(db, await findCaller(req), uuidParam(params.entryId));
    const file = await exportEntry(
      db,
      entry,
      params.file as ExportKind,
      readQuery(req, exportQuery).revision,
    );
    return new Response(file.body, {
      headers: {
        "content-type": file.contentType,
        "content-disposition": `attachment; filename="${file.filename}"`,
      },
    });
  });
}
