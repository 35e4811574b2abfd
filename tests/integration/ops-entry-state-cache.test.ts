// Issue 17, entry page speed: a finished analysis is parsed once per process and kept under its
// id and finish time, and the entry row is read without the search index's columns. The
// expectation here is independent of that path: the full analyses row read straight from the
// table and parsed by the engine's own reader. A re-run that writes a new result must show the
// new one at once (the cache never serves a stale view), and a cache hit must not need the
// result's JSON from the database at all.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq, sql } from "drizzle-orm";
import { schema } from "@teardown/db";
import {
  ENGINE_VERSION,
  analyzeStoredRecord,
  parseStoredResult,
  type AnalysisOutput,
} from "@teardown/engine";
import { readableEntry } from "@/lib/access";
import { entryState } from "@/lib/entry-state";
import {
  loadRevision,
  markRunning,
  storeDone,
  storeNominal,
} from "../../analysis-worker/src/analysis-store.js";
import {
  call,
  signUp,
  openTestWebApp,
  type TestUser,
  type TestWebApp,
} from "../support/api-client.js";
import { nightLightDoc } from "../support/record-docs.js";

let app: TestWebApp;
let owner: TestUser;
let entryId = "";
let revisionId = "";

beforeAll(async () => {
  app = await openTestWebApp();
  owner = await signUp("Cora Cache", "cora@lab.test");
  const team = (await call("POST", "/api/teams", { as: owner.as, json: { name: "Cache lab" } }))
    .body.team.id;
  const made = await call("POST", `/api/teams/${team}/entries`, {
    as: owner.as,
    json: { record: nightLightDoc(12), message: "first trace" },
  });
  expect(made.status).toBe(201);
  entryId = made.body.entryId;
  const loaded = await loadRevision(
    app.db.db,
    (
      await app.db.db
        .select({ id: schema.revisions.id })
        .from(schema.revisions)
        .where(eq(schema.revisions.entryId, entryId))
    )[0]!.id,
  );
  revisionId = loaded!.id;
  const outcome = await analyzeStoredRecord(loaded!.record);
  if (!outcome.ok) throw new Error(outcome.message);
  await storeDone(app.db.db, loaded!, ENGINE_VERSION, outcome.output);
});

afterAll(async () => {
  await app?.close();
});

async function stateNow() {
  const { entry, role } = await readableEntry(
    app.db.db,
    { userId: owner.id, name: "Cora Cache", email: "cora@lab.test", via: "session" },
    entryId,
  );
  return entryState(app.db.db, entry, role);
}

async function storedRow() {
  const [row] = await app.db.db
    .select()
    .from(schema.analyses)
    .where(
      and(
        eq(schema.analyses.revisionId, revisionId),
        eq(schema.analyses.engineVersion, ENGINE_VERSION),
      ),
    );
  return row!;
}

describe("the entry state's finished analysis", () => {
  it("equals the stored row read in full and parsed by the engine's reader", async () => {
    const row = await storedRow();
    const read = parseStoredResult(row.result);
    expect(read.ok).toBe(true);
    const state = await stateNow();
    expect(state.analysis).toMatchObject({ state: "done", engineVersion: ENGINE_VERSION });
    const done = state.analysis as Extract<typeof state.analysis, { state: "done" }>;
    // Entry reads leave the waveforms out (the waveform route sends them); everything else is whole.
    const { waveforms, ...rest } = (read.ok ? read.result : {}) as Record<string, unknown>;
    expect(waveforms).toBeDefined();
    expect(done.result).not.toHaveProperty("waveforms");
    expect(JSON.parse(JSON.stringify(done.result))).toEqual(JSON.parse(JSON.stringify(rest)));
    expect(done.layout).toEqual(row.layout);
    expect(done.timings).toEqual(row.timings);
    expect(done.finishedAt?.getTime()).toBe(row.finishedAt?.getTime());
    // The entry row shown is the stored one, the search columns left out of the read.
    expect(state.entry).toMatchObject({ id: entryId, title: String(nightLightDoc(12).title) });
  });

  it("is served again without reading the result's JSON from the database", async () => {
    await stateNow();
    // Hide the stored result from any second read: a view that still has its figures came
    // from the process's cache, not from the table.
    const before = await storedRow();
    await app.db.db
      .update(schema.analyses)
      .set({ layout: { hidden: true } })
      .where(eq(schema.analyses.id, before.id));
    const again = (await stateNow()).analysis as { layout: unknown; result: unknown };
    expect(again.layout).toEqual(before.layout);
    expect(again.result).not.toBeNull();
    await app.db.db
      .update(schema.analyses)
      .set({ layout: before.layout })
      .where(eq(schema.analyses.id, before.id));
  });

  it("shows a re-run's new result at once: a new finish time is a new key", async () => {
    const before = await storedRow();
    const changedLayout = { ...(before.layout as Record<string, unknown>), rerun: 2 };
    await app.db.db
      .update(schema.analyses)
      .set({ layout: changedLayout, finishedAt: sql`finished_at + interval '1 second'` })
      .where(eq(schema.analyses.id, before.id));
    const after = (await stateNow()).analysis as { layout: unknown; finishedAt: Date };
    expect(after.layout).toEqual(changedLayout);
    expect(after.finishedAt.getTime()).toBe(before.finishedAt!.getTime() + 1000);
  });

  it("shows a re-queued analysis as queued, not its cached earlier result", async () => {
    const before = await storedRow();
    await app.db.db
      .update(schema.analyses)
      .set({ state: "queued", result: null, finishedAt: null, startedAt: null })
      .where(eq(schema.analyses.id, before.id));
    const state = await stateNow();
    expect(state.analysis?.state).toBe("queued");
  });

  it("shows a running analysis's nominal part, variants pending, until the full result is done", async () => {
    const rev = (await loadRevision(app.db.db, revisionId))!;
    let cheap: AnalysisOutput | null = null;
    const full = await analyzeStoredRecord(rev.record, { onNominal: (o) => (cheap = o) });
    if (!full.ok || cheap === null) throw new Error("no nominal part was handed out");
    await markRunning(app.db.db, revisionId, ENGINE_VERSION);
    await storeNominal(app.db.db, revisionId, ENGINE_VERSION, cheap);
    const running = (await stateNow()).analysis;
    expect(running?.state).toBe("running");
    const shown = running as { result: { status: string; variants?: { state: string } } | null };
    expect(shown.result?.status).toBe("partial");
    expect(shown.result?.variants?.state).toBe("pending");
    await storeDone(app.db.db, rev, ENGINE_VERSION, full.output);
    const done = (await stateNow()).analysis as { state: string; result: object | null };
    expect(done.state).toBe("done");
    expect(done.result).not.toHaveProperty("variants");
  });
});
