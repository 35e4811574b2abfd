/**
 * The JSON Schema of the raw record, generated from the zod schema with zod's own converter,
 * so that editors and other tools can check a record file. The committed copy lives in
 * schema/record-v1.schema.json and a test keeps it equal to this.
 */
import { z } from "zod";
import { RecordInput } from "./record-schema.js";

/** The schema's identifier, also its committed file name. */
export const RECORD_JSON_SCHEMA_ID = "record-v1.schema.json";

/** The JSON Schema (draft 2020-12) of a version-1 record file. */
export function recordJsonSchema(): Record<string, unknown> {
  const schema = z.toJSONSchema(RecordInput, { target: "draft-2020-12", io: "input" }) as Record<
    string,
    unknown
  >;
  return { ...schema, $id: RECORD_JSON_SCHEMA_ID };
}
