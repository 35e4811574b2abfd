import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { recordJsonSchema } from "@teardown/engine";

const committed = new URL(
  "../../../analysis-worker/engine/schema/record-v1.schema.json",
  import.meta.url,
);

describe("the committed JSON Schema", () => {
  it("equals what the zod schema generates now (run npm run schema:record after a schema change)", () => {
    expect(readFileSync(committed, "utf8")).toBe(
      `${JSON.stringify(recordJsonSchema(), null, 2)}\n`,
    );
  });

  it("requires record, title and parts and pins the version to 1", () => {
    const schema = recordJsonSchema() as {
      required: string[];
      properties: { record: { const: number }; title: { maxLength: number } };
    };
    expect(schema.required).toEqual(["record", "title", "parts"]);
    expect(schema.properties.record.const).toBe(1);
    expect(schema.properties.title.maxLength).toBe(200);
  });
});
