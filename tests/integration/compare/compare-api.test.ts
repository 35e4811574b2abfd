// GET /api/compare against the loaded demo: the variant pairs come back matched part for part as
// the scenario states (scenario-expectations.ts), a revision pair of one entry too, the figures
// and flags of analysed revisions side by side, and an outsider gets the same 404 as for an id
// that does not exist.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import type { PgBoss } from "pg-boss";
import { createQueue, schema, startQueue } from "@teardown/db";
import { analyzeStoredRecord, ENGINE_VERSION } from "@teardown/engine";
import { demoRecordDocs, loadDemoData, type SeedOutcome } from "@teardown/seed-demo";
import { VARIANT_PAIRS } from "@teardown/seed-demo/scenario-expectations";
import { GET } from "@/app/api/compare/route";
import {
  openTestWebApp,
  signIn,
  signUp,
  TEST_ORIGIN,
  type As,
  type TestWebApp,
} from "../../support/api-client.js";

let app: TestWebApp;
let boss: PgBoss;
let seeded: SeedOutcome;
let member: As;
const idOf = new Map<string, string>();

/** Writes a finished analysis for a revision, computed here by the same engine the worker runs. */
async function analyse(entryId: string, number: number): Promise<void> {
  const [rev] = await app.db.db
    .select()
    .from(schema.revisions)
    .where(and(eq(schema.revisions.entryId, entryId), eq(schema.revisions.number, number)));
  const out = await analyzeStoredRecord(rev!.record);
  if (!out.ok) throw new Error(out.message);
  const now = new Date();
  await app.db.db
    .update(schema.analyses)
    .set({
      state: "done",
      result: out.output.result,
      layout: out.output.layout,
      startedAt: now,
      finishedAt: now,
    })
    .where(
      and(
        eq(schema.analyses.revisionId, rev!.id),
        eq(schema.analyses.engineVersion, ENGINE_VERSION),
      ),
    );
}

beforeAll(async () => {
  app = await openTestWebApp();
  boss = createQueue(app.db.url, { supervise: false });
  await startQueue(boss);
  seeded = await loadDemoData(app.db.db, boss, { uploadsDir: path.join(app.dataDir, "uploads") });
  const rows = await app.db.db.select().from(schema.entries);
  for (const e of demoRecordDocs()) {
    const title = String(e.revisions[e.revisions.length - 1]!.doc.title);
    idOf.set(e.slug, rows.find((r) => r.title === title)!.id);
  }
  member = (await signIn(seeded.signIn.email, seeded.signIn.password)).as;
  await analyse(idOf.get("glowmoth-night-light")!, 1);
  await analyse(idOf.get("glowmoth-night-light-batch2")!, 1);
}, 300_000);
afterAll(async () => {
  await boss?.stop({ close: true });
  await app?.close();
});

/** The answer as loosely typed JSON: the test reads fields the way a client would. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Loose = any;

async function compare(
  query: string,
  as: As | null = member,
): Promise<{ status: number; body: Loose }> {
  const headers = new Headers({ origin: TEST_ORIGIN });
  if (as?.cookie) headers.set("cookie", as.cookie);
  const res = await GET(new Request(`${TEST_ORIGIN}/api/compare?${query}`, { headers }));
  return { status: res.status, body: await res.json() };
}

describe.each(VARIANT_PAIRS)("comparing the demo's $a with $b", (pair) => {
  it("answers the issue's shape with the parts matched as the scenario states", async () => {
    const res = await compare(`a=${idOf.get(pair.a)}&b=${idOf.get(pair.b)}`);
    expect(res.status).toBe(200);
    expect(Object.keys(res.body).sort()).toEqual(["a", "b", "figures", "flags", "nets", "parts"]);
    expect(res.body.a.entry.id).toBe(idOf.get(pair.a));
    expect(res.body.b.revision).toBe(res.body.b.entry.currentRevision);
    const kept = Object.entries(res.body.parts.pairs as Array<{ a: string; b: string }>).map(
      ([, p]) => [p.a, p.b],
    );
    for (const [a, b] of kept) expect(b, a).toBe(pair.renamed[a!] ?? a);
    expect(res.body.parts.onlyA).toEqual(pair.removed);
    expect(res.body.parts.onlyB).toEqual(pair.added);
    const valueChanged = new Set(
      pair.changed
        .filter((c) => c.field === "value" || c.field.startsWith("model."))
        .map((c) => c.ref),
    );
    for (const p of res.body.parts.pairs) {
      expect(Object.keys(p).sort()).toEqual(
        ["a", "b", "by", "confidence", "differs", "kind", "marking", "values"].sort(),
      );
      expect(p.differs, `${p.a} ↔ ${p.b}`).toBe(valueChanged.has(p.b));
    }
    expect(Object.keys(res.body.flags).sort()).toEqual(["both", "onlyA", "onlyB"]);
  });
});

describe("a compared pair with both revisions analysed", () => {
  it("puts the input figures side by side with difference and ratio", async () => {
    const res = await compare(
      `a=${idOf.get("glowmoth-night-light")}&b=${idOf.get("glowmoth-night-light-batch2")}`,
    );
    const current = res.body.figures.find((f: { what: string }) => f.what === "input.current_rms");
    expect(Object.keys(current).sort()).toEqual(
      ["a", "b", "difference", "ratio", "refs", "unit", "what"].sort(),
    );
    // Dropper closed form: the current follows the capacitance, 220 nF for 330 nF.
    expect(Math.abs(current.ratio - 220 / 330)).toBeLessThan(0.02);
    expect(res.body.a.analysis.status).toBe("complete");
    expect(res.body.a.layout).not.toBeNull();
    expect(res.body.flags.both).toEqual(expect.arrayContaining(["no-fuse", "overstress-voltage"]));
  });
});

describe("two revisions of one entry", () => {
  it("matches revision 1 of the L24C bulb with revision 2 and lists the added bleeder alone", async () => {
    const id = idOf.get("lumora-led-bulb-l24c");
    const res = await compare(`a=${id}&b=${id}&aRevision=1&bRevision=2`);
    expect(res.status).toBe(200);
    expect([res.body.a.revision, res.body.b.revision]).toEqual([1, 2]);
    expect(res.body.parts.onlyA).toEqual([]);
    expect(res.body.parts.onlyB).toEqual(["R3"]);
    for (const p of res.body.parts.pairs) {
      expect(p.b).toBe(p.a);
      expect(p.differs).toBe(false);
    }
  });

  it("answers 404 for a revision the entry does not have", async () => {
    const id = idOf.get("lumora-led-bulb-l24c");
    expect((await compare(`a=${id}&b=${id}&bRevision=9`)).status).toBe(404);
  });
});

describe("who may compare", () => {
  const unknown = "00000000-0000-4000-8000-000000000000";

  it("gives an outsider the same 404 for a team entry as for an id that does not exist", async () => {
    const outsider = (await signUp("Olwen Ashby", "olwen@outside.example")).as;
    const team = idOf.get("lumora-led-bulb-l24c");
    const pub = idOf.get("lumora-led-bulb-l24a");
    const hidden = await compare(`a=${pub}&b=${team}`, outsider);
    const missing = await compare(`a=${pub}&b=${unknown}`, outsider);
    expect(hidden.status).toBe(404);
    expect(hidden.body).toEqual(missing.body);
    expect((await compare(`a=${team}&b=${pub}`, outsider)).body).toEqual(
      (await compare(`a=${unknown}&b=${pub}`, outsider)).body,
    );
    expect((await compare(`a=${team}&b=${pub}`, null)).status).toBe(404);
  });

  it("lets anyone compare two public entries", async () => {
    const res = await compare(
      `a=${idOf.get("lumora-led-bulb-l24a")}&b=${idOf.get("glowmoth-night-light")}`,
      null,
    );
    expect(res.status).toBe(200);
  });

  it("names the missing field of a query without both entries", async () => {
    const res = await compare(`a=${unknown}`);
    expect(res.status).toBe(422);
    expect(JSON.stringify(res.body)).toContain("b");
  });
});
