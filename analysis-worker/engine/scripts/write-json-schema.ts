/* eslint-disable no-restricted-imports -- a build script, not engine code: it writes the generated schema file, which the pure engine cannot do. */
/**
 * Writes schema/record-v1.schema.json from the zod schema of the record. Run it after a change
 * to record-schema.ts: `npm run schema:record`. A test fails while the committed file is stale.
 */
import { writeFileSync } from "node:fs";
import { recordJsonSchema, RECORD_JSON_SCHEMA_ID } from "../src/record/record-json-schema.js";

const target = new URL(`../schema/${RECORD_JSON_SCHEMA_ID}`, import.meta.url);
writeFileSync(target, `${JSON.stringify(recordJsonSchema(), null, 2)}\n`);
