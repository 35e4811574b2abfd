// Finding 12: an upload just under the 2 MB limit was accepted, but its stored form (the record
// as compact JSON, which the worker reads back through the same 2,000,000-character reader) was
// longer, so its analysis failed. The limit now applies to the stored form at upload: an upload
// whose stored form is too long is refused with both sizes; every accepted one passes the reader.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { count, eq } from "drizzle-orm";
import { schema } from "@teardown/db";
import { MAX_RECORD_TEXT_CHARS, parseRecord } from "@teardown/engine";
import {
  call,
  signUp,
  openTestWebApp,
  type TestUser,
  type TestWebApp,
} from "../support/api-client.js";

let app: TestWebApp;
let ned: TestUser;
let teamId: string;
beforeAll(async () => {
  app = await openTestWebApp();
  ned = await signUp("Ned Example", "ned@lab.test");
  teamId = (await call("POST", "/api/teams", { as: ned.as, json: { name: "Ned's lab" } })).body.team
    .id;
});
afterAll(async () => {
  await app?.close();
});

/**
 * A valid YAML record whose notes are runs of double quotes: one character each in YAML's
 * single-quoted style, two (`\"`) in JSON, so the stored form is nearly twice the upload.
 */
function quoteHeavyYaml(noteChars: number, notes: number): string {
  const lines = ["record: 1", "title: Quote-heavy night light", "parts:"];
  for (let i = 0; i < notes; i++) {
    lines.push(`  - ref: R${i + 1}`, "    kind: resistor", "    value: 1k", `    pins: [L, N]`);
    lines.push(`    note: '${'"'.repeat(noteChars)}'`);
  }
  lines.push("nets: {L: {role: line}, N: {role: neutral}}");
  return lines.join("\n") + "\n";
}

function upload(text: string): FormData {
  const form = new FormData();
  form.set("file", new File([text], "big.yaml"));
  return form;
}

async function entries(): Promise<number> {
  const [r] = await app.db.db.select({ n: count() }).from(schema.entries);
  return r!.n;
}

describe("the stored form of an upload", () => {
  it("refuses a 1.99 MB upload whose stored form is longer than the reader takes, writing nothing", async () => {
    const text = quoteHeavyYaml(99_000, 20);
    expect(text.length).toBeGreaterThan(1_980_000);
    expect(text.length).toBeLessThan(MAX_RECORD_TEXT_CHARS);
    const before = await entries();
    const res = await call("POST", `/api/teams/${teamId}/entries`, {
      as: ned.as,
      form: upload(text),
    });
    expect(res.status).toBe(413);
    expect(res.body.error.limitChars).toBe(MAX_RECORD_TEXT_CHARS);
    // 20 notes of 99,000 quotes, each written as two characters, plus the rest of the record.
    expect(res.body.error.storedChars).toBeGreaterThan(20 * 99_000 * 2);
    expect(await entries()).toBe(before);
  });

  it("accepts an upload whose stored form fits, and that stored form passes the worker's reader", async () => {
    const text = quoteHeavyYaml(45_000, 20);
    const res = await call("POST", `/api/teams/${teamId}/entries`, {
      as: ned.as,
      form: upload(text),
    });
    expect(res.status, res.text).toBe(201);
    const [rev] = await app.db.db
      .select({ record: schema.revisions.record })
      .from(schema.revisions)
      .where(eq(schema.revisions.entryId, res.body.entryId));
    const stored = JSON.stringify(rev!.record);
    expect(stored.length).toBeGreaterThan(1_800_000);
    expect(stored.length).toBeLessThanOrEqual(MAX_RECORD_TEXT_CHARS);
    expect(parseRecord(stored, { filename: "revision.json" }).ok).toBe(true);
  });
});
