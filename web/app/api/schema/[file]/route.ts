/**
 * GET /api/schema/:file: the JSON Schemas the project publishes, generated from the engine's zod
 * schemas so they can never drift from what the app accepts and stores. `record-v1.schema.json`
 * checks a record file in an editor; `analysis-result-v1.schema.json` describes a stored result.
 * Public: a schema holds nothing of any team's.
 */
import {
  analysisResultJsonSchema,
  RECORD_JSON_SCHEMA_ID,
  recordJsonSchema,
} from "@teardown/engine";
import { answer, notFound } from "@/lib/api-error";

const SCHEMAS: Record<string, () => Record<string, unknown>> = {
  [RECORD_JSON_SCHEMA_ID]: recordJsonSchema,
  "analysis-result-v1.schema.json": analysisResultJsonSchema,
};

export function GET(_req: Request, ctx: { params: Promise<{ file: string }> }): Promise<Response> {
  return answer(async () => {
    const { file } = await ctx.params;
    const make = Object.prototype.hasOwnProperty.call(SCHEMAS, file) ? SCHEMAS[file] : undefined;
    if (make === undefined) throw notFound("schema");
    return new Response(`${JSON.stringify(make(), null, 2)}\n`, {
      headers: {
        "content-type": "application/schema+json; charset=utf-8",
        "content-disposition": `attachment; filename="${file}"`,
      },
    });
  });
}
