// Issue 17, entry page speed: entry reads leave a finished result's waveforms out (they are most
// of a solved entry's answer) and the page fetches them from their own route when it draws them.
// The expectation is independent of the web code: the analyses row read straight from the table
// and parsed by the engine's own reader. Access is the entry's own: an outsider and an anonymous
// caller learn nothing about a team-only entry (404, as for an unknown id), anyone may read a
// public one's waveforms.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { schema } from "@teardown/db";
import { ENGINE_VERSION, analyzeStoredRecord, parseStoredResult } from "@teardown/engine";
import { loadRevision, storeDone } from "../../../analysis-worker/src/analysis-store.js";
import {
  call,
  signUp,
  openTestWebApp,
  type TestUser,
  type TestWebApp,
} from "../../support/api-client.js";
import { ladderDoc, nightLightDoc } from "../../support/record-docs.js";

let app: TestWebApp;
let owner: TestUser;
let outsider: TestUser;
let solvedId = "";
let queuedId = "";
let revisionId = "";

async function makeEntry(team: string, doc: Record<string, unknown>): Promise<string> {
  const made = await call("POST", `/api/teams/${team}/entries`, {
    as: owner.as,
    json: { record: doc, message: "first trace" },
  });
  expect(made.status).toBe(201);
  return made.body.entryId as string;
}

beforeAll(async () => {
  app = await openTestWebApp();
  owner = await signUp("Wren Wave", "wren@lab.test");
  outsider = await signUp("Otto Outside", "otto@lab.test");
  const team = (await call("POST", "/api/teams", { as: owner.as, json: { name: "Wave lab" } })).body
    .team.id;
  solvedId = await makeEntry(team, nightLightDoc(7));
  queuedId = await makeEntry(team, ladderDoc(4));
  const [rev] = await app.db.db
    .select({ id: schema.revisions.id })
    .from(schema.revisions)
    .where(eq(schema.revisions.entryId, solvedId));
  const loaded = await loadRevision(app.db.db, rev!.id);
  revisionId = loaded!.id;
  const outcome = await analyzeStoredRecord(loaded!.record);
  if (!outcome.ok) throw new Error(outcome.message);
  await storeDone(app.db.db, loaded!, ENGINE_VERSION, outcome.output);
});

afterAll(async () => {
  await app?.close();
});

/** The stored result's waveforms, read from the table and parsed by the engine's reader. */
async function storedWaveforms(): Promise<unknown> {
  const [row] = await app.db.db
    .select()
    .from(schema.analyses)
    .where(
      and(
        eq(schema.analyses.revisionId, revisionId),
        eq(schema.analyses.engineVersion, ENGINE_VERSION),
      ),
    );
  const read = parseStoredResult(row!.result);
  if (!read.ok || !("waveforms" in read.result)) throw new Error("no stored waveforms");
  return JSON.parse(JSON.stringify(read.result.waveforms));
}

describe("an entry read and its waveforms", () => {
  it("leaves the waveforms out of the entry and keeps the rest of the result", async () => {
    const res = await call("GET", `/api/entries/${solvedId}`, { as: owner.as });
    expect(res.status).toBe(200);
    expect(res.body.analysis.state).toBe("done");
    expect(res.body.analysis.result).not.toHaveProperty("waveforms");
    expect(res.body.analysis.result.status).toBe("complete");
    // Every part of the record has its figures (night light: its parts listed in the record doc).
    const refs = (nightLightDoc(7).parts as { ref: string }[]).map((p) => p.ref).sort();
    expect(Object.keys(res.body.analysis.result.parts).sort()).toEqual(refs);
  });

  it("sends the stored waveforms, whole, from the revision's waveform route", async () => {
    const res = await call("GET", `/api/entries/${solvedId}/revisions/1/waveforms`, {
      as: owner.as,
    });
    expect(res.status).toBe(200);
    const stored = (await storedWaveforms()) as { t: number[]; series: Record<string, number[]> };
    expect(stored.t.length).toBeGreaterThan(1);
    expect(res.body.waveforms).toEqual(stored);
    expect(res.body.engineVersion).toBe(ENGINE_VERSION);
  });

  it("answers null waveforms while the revision has no finished analysis", async () => {
    const res = await call("GET", `/api/entries/${queuedId}/revisions/1/waveforms`, {
      as: owner.as,
    });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ engineVersion: null, finishedAt: null, waveforms: null });
  });

  it("answers 404 for a revision the entry does not have", async () => {
    const res = await call("GET", `/api/entries/${solvedId}/revisions/9/waveforms`, {
      as: owner.as,
    });
    expect(res.status).toBe(404);
  });

  it("answers an outsider and an anonymous caller 404 for a team-only entry, as for an unknown id", async () => {
    for (const as of [outsider.as, null]) {
      const res = await call("GET", `/api/entries/${solvedId}/revisions/1/waveforms`, { as });
      expect(res.status).toBe(404);
      const unknown = await call(
        "GET",
        `/api/entries/00000000-0000-4000-8000-000000000000/revisions/1/waveforms`,
        { as },
      );
      expect(unknown.status).toBe(404);
      expect(res.body).toEqual(unknown.body);
    }
  });

  it("lets anyone read a public entry's waveforms", async () => {
    const made = await call("PATCH", `/api/entries/${solvedId}`, {
      as: owner.as,
      json: { visibility: "public" },
    });
    expect(made.status).toBe(200);
    const res = await call("GET", `/api/entries/${solvedId}/revisions/1/waveforms`, { as: null });
    expect(res.status).toBe(200);
    expect(res.body.waveforms).toEqual(await storedWaveforms());
  });
});
