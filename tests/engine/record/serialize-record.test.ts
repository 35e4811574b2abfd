import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { stringify } from "yaml";
import { parseRecord, serializeRecord, type TeardownRecord } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { validRawRecord } from "./record-arbitraries.js";

const example = readFileSync(new URL("./fixtures/fragrance-warmer.yaml", import.meta.url), "utf8");

function parsed(text: string): TeardownRecord {
  const r = parseRecord(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors, null, 1));
  return r.record;
}

describe("serializeRecord", () => {
  it("writes the example record so that it reads back equal, as YAML and as JSON", () => {
    const r = parsed(example);
    expect(parsed(serializeRecord(r, "yaml"))).toEqual(r);
    expect(parsed(serializeRecord(r, "json"))).toEqual(r);
  });

  it("prefers each value's own text", () => {
    const text = serializeRecord(parsed(example), "yaml");
    expect(text).toContain("value: 330n");
    expect(text).toContain("tolerance: 10%");
  });

  it("writes records built in code (no value text of their own) readably", () => {
    const r = record([
      part("R1", "resistor", ["L", "A"], 2.2e6),
      part("C9", "capacitor", ["A", "N"], 4.7e-9, { value_text: null }),
    ]);
    const back = parsed(serializeRecord(r, "yaml"));
    expect(back.parts.map((p) => [p.value, p.value_text])).toEqual([
      [2.2e6, "2200000"],
      [4.7e-9, "4.7n"],
    ]);
    expect(back.nets).toEqual(r.nets);
  });

  it("round-trips generated records through YAML and JSON", () => {
    fc.assert(
      fc.property(
        validRawRecord,
        fc.constantFrom("yaml" as const, "json" as const),
        (raw, format) => {
          const first = parseRecord(stringify(raw));
          if (!first.ok)
            throw new Error(`generator made an invalid record: ${JSON.stringify(first.errors)}`);
          const again = parseRecord(serializeRecord(first.record, format), {
            filename: `r.${format}`,
          });
          expect(again.ok && again.record).toEqual(first.record);
        },
      ),
      { numRuns: 300 },
    );
  });
});
