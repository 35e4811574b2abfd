// Entries through the HTTP API: create from a record or an uploaded file, the role matrix,
// lists and search that never show another team's entries, stale-revision conflicts that lose
// nothing, diffs, public entries for anonymous readers, archive, entry state and exports.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq, sql } from "drizzle-orm";
import { parse as parseYaml } from "yaml";
import { schema } from "@teardown/db";
import { ENGINE_VERSION, analyzeStoredRecord } from "@teardown/engine";
import { loadRevision, storeDone } from "../../../analysis-worker/src/analysis-store.js";
import {
  call,
  signUp,
  openTestWebApp,
  type TestUser,
  type TestWebApp,
} from "../../support/api-client.js";
import { nightLightDoc } from "../../support/record-docs.js";

let app: TestWebApp;
let owner: TestUser;
let editor: TestUser;
let viewer: TestUser;
let outsider: TestUser;
let teamA: string;
let teamB: string;

async function join(teamId: string, user: TestUser, role: string): Promise<void> {
  const made = await call("POST", `/api/teams/${teamId}/invites`, { as: owner.as, json: { role } });
  const res = await call("POST", `/api/invites/${made.body.invite.token}`, { as: user.as });
  expect(res.status).toBe(200);
}

async function createJson(
  teamId: string,
  as: TestUser,
  doc: Record<string, unknown>,
  extra: Record<string, unknown> = {},
) {
  return call("POST", `/api/teams/${teamId}/entries`, {
    as: as.as,
    json: { record: doc, message: "first trace", ...extra },
  });
}

function upload(filename: string, text: string, fields: Record<string, string> = {}): FormData {
  const form = new FormData();
  form.set("file", new File([text], filename, { type: "application/octet-stream" }));
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  return form;
}

/** Runs the engine on the entry's current revision and stores the result as the worker does. */
async function finishAnalysis(entryId: string): Promise<void> {
  const [rev] = await app.db.db
    .select()
    .from(schema.revisions)
    .where(eq(schema.revisions.entryId, entryId))
    .orderBy(sql`number desc`)
    .limit(1);
  const loaded = await loadRevision(app.db.db, rev!.id);
  const outcome = await analyzeStoredRecord(loaded!.record);
  if (!outcome.ok) throw new Error(outcome.message);
  await storeDone(app.db.db, loaded!, ENGINE_VERSION, outcome.output);
}

beforeAll(async () => {
  app = await openTestWebApp();
  owner = await signUp("Olga Owner", "olga@lab.test");
  editor = await signUp("Eve Editor", "eve@lab.test");
  viewer = await signUp("Vic Viewer", "vic@lab.test");
  outsider = await signUp("Otto Outsider", "otto@other.test");
  teamA = (await call("POST", "/api/teams", { as: owner.as, json: { name: "Team A" } })).body.team
    .id;
  teamB = (await call("POST", "/api/teams", { as: outsider.as, json: { name: "Team B" } })).body
    .team.id;
  await join(teamA, editor, "editor");
  await join(teamA, viewer, "viewer");
});
afterAll(async () => {
  await app?.close();
});

describe("creating entries", () => {
  it("creates an entry from a record document, stores the normalised record and queues its analysis", async () => {
    const res = await createJson(teamA, editor, nightLightDoc(1));
    expect(res.status).toBe(201);
    expect(res.body.revision).toBe(1);
    const got = await call("GET", `/api/entries/${res.body.entryId}`, { as: viewer.as });
    expect(got.status).toBe(200);
    expect(got.body.entry).toMatchObject({
      teamId: teamA,
      title: "Test night light 1",
      category: "night light",
      visibility: "team",
      currentRevision: 1,
    });
    expect(got.body.revision.number).toBe(1);
    expect(got.body.revision.record.parts).toHaveLength(9);
    expect(got.body.analysis).toMatchObject({ state: "queued", engineVersion: ENGINE_VERSION });
    expect(got.body.role).toBe("viewer");
    const jobs = await app.db.db.execute<{ n: number }>(
      sql`select count(*)::int as n from pgboss.job where data->>'engineVersion' = ${ENGINE_VERSION}`,
    );
    expect(jobs.rows[0]!.n).toBeGreaterThanOrEqual(1);
  });

  it("creates entries from an uploaded YAML record, a netlist deck and a CSV parts list", async () => {
    const yaml =
      "record: 1\ntitle: Uploaded YAML lamp\ndevice:\n  category: lamp\n  rated_supply: { vrms: 230, hz: 50 }\nparts:\n  - { ref: R1, kind: resistor, value: 10k, pins: [L, N] }\nnets:\n  L: { role: line }\n  N: { role: neutral }\n";
    const deck = "Uploaded deck heater\n.supply 230 50\n.line L\n.neutral N\nR1 L N 47\n.end\n";
    const csv =
      "# title: Uploaded CSV fan\n# line: L\n# neutral: N\nref,kind,value,pins\nR1,resistor,1k,L N\n";
    const titles: string[] = [];
    for (const [name, text] of [
      ["lamp.yaml", yaml],
      ["heater.cir", deck],
      ["fan.csv", csv],
    ] as const) {
      const res = await call("POST", `/api/teams/${teamA}/entries`, {
        as: editor.as,
        form: upload(name, text, { message: `from ${name}` }),
      });
      expect(res.status, res.text).toBe(201);
      titles.push(
        (await call("GET", `/api/entries/${res.body.entryId}`, { as: editor.as })).body.entry.title,
      );
    }
    expect(titles).toEqual(["Uploaded YAML lamp", "Uploaded deck heater", "Uploaded CSV fan"]);
  });

  it("answers a malformed record with 422 listing every problem's path and line, and writes nothing", async () => {
    const before = (await app.db.db.select().from(schema.entries)).length;
    const bad =
      "record: 1\ntitle: Broken\ndevice:\n  rated_supply: { vrms: 230, hz: 50 }\nparts:\n  - ref: R1\n    kind: resistor\n    value: lots\n    pins: [L, N]\n  - ref: C1\n    kind: capacitor\n    value: 100n\n    pins: { gate: L, b: N }\n";
    const res = await call("POST", `/api/teams/${teamA}/entries`, {
      as: editor.as,
      form: upload("broken.yaml", bad),
    });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe("invalid-record");
    const errors = res.body.error.errors as { path: string; line: number }[];
    expect(errors.length).toBeGreaterThanOrEqual(2);
    expect(errors.find((e) => e.path === "parts[0].value")?.line).toBe(8);
    expect(errors.some((e) => e.path.startsWith("parts[1].pins") && e.line >= 13)).toBe(true);
    expect((await app.db.db.select().from(schema.entries)).length).toBe(before);
  });

  it("answers 415 for a body that is neither JSON nor a form, and 413 past the size limit", async () => {
    const text = await call("POST", `/api/teams/${teamA}/entries`, {
      as: editor.as,
      body: "R1 L N 1k",
      headers: { "content-type": "text/plain" },
    });
    expect(text.status).toBe(415);
    const huge = await call("POST", `/api/teams/${teamA}/entries`, {
      as: editor.as,
      json: { record: nightLightDoc(2), pad: "x".repeat(2 * 1024 * 1024) },
    });
    expect(huge.status).toBe(413);
    expect(huge.body.error.message).toContain("2 MB");
  });
});

describe("the role matrix", () => {
  let entryId: string;
  beforeAll(async () => {
    entryId = (await createJson(teamA, owner, nightLightDoc(3))).body.entryId;
  });

  it("lets a viewer read but not create, edit, archive or publish (403)", async () => {
    expect((await call("GET", `/api/entries/${entryId}`, { as: viewer.as })).status).toBe(200);
    expect((await createJson(teamA, viewer, nightLightDoc(4))).status).toBe(403);
    const edit = await call("POST", `/api/entries/${entryId}/revisions`, {
      as: viewer.as,
      json: { record: nightLightDoc(5), baseRevision: 1 },
    });
    expect(edit.status).toBe(403);
    expect(
      (await call("PATCH", `/api/entries/${entryId}`, { as: viewer.as, json: { archived: true } }))
        .status,
    ).toBe(403);
  });

  it("gives a member of another team 404 for a team-only entry by id and on every sub-route", async () => {
    for (const p of ["", "/revisions", "/revisions/1", "/diff", "/photos", "/export/record.yaml"]) {
      const res = await call("GET", `/api/entries/${entryId}${p}`, { as: outsider.as });
      expect(res.status, p).toBe(404);
    }
    expect(
      (
        await call("POST", `/api/entries/${entryId}/revisions`, {
          as: outsider.as,
          json: { record: nightLightDoc(5), baseRevision: 1 },
        })
      ).status,
    ).toBe(404);
    expect((await createJson(teamA, outsider, nightLightDoc(6))).status).toBe(404);
    // The answer is the same as for an id that never existed.
    const unknown = await call("GET", "/api/entries/00000000-0000-4000-8000-000000000000", {
      as: outsider.as,
    });
    const hidden = await call("GET", `/api/entries/${entryId}`, { as: outsider.as });
    expect(hidden.body).toEqual(unknown.body);
    expect((await call("GET", "/api/entries/not-a-uuid", { as: owner.as })).status).toBe(404);
  });

  it("never lists or finds another team's entries", async () => {
    await createJson(teamB, outsider, { ...nightLightDoc(7), title: "Team B zebra lamp" });
    expect((await call("GET", `/api/teams/${teamA}/entries`, { as: outsider.as })).status).toBe(
      404,
    );
    const search = await call("GET", "/api/entries?q=night", { as: outsider.as });
    expect(search.body.entries.map((e: { teamId: string }) => e.teamId)).not.toContain(teamA);
    const mine = await call("GET", "/api/entries?q=zebra", { as: outsider.as });
    expect(mine.body.entries.map((e: { title: string }) => e.title)).toEqual(["Team B zebra lamp"]);
    expect((await call("GET", "/api/entries?q=zebra", { as: owner.as })).body.entries).toEqual([]);
  });
});

describe("revisions", () => {
  it("refuses a stale base with 409, the current number and what changed, and loses nothing", async () => {
    const entryId = (await createJson(teamA, owner, nightLightDoc(10))).body.entryId;
    const first = await call("POST", `/api/entries/${entryId}/revisions`, {
      as: editor.as,
      json: { record: nightLightDoc(11), baseRevision: 1, message: "dropper re-read" },
    });
    expect(first.status).toBe(201);
    expect(first.body.revision).toBe(2);
    const stale = await call("POST", `/api/entries/${entryId}/revisions`, {
      as: owner.as,
      json: { record: nightLightDoc(12), baseRevision: 1, message: "my edit" },
    });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatchObject({
      code: "stale-revision",
      baseRevision: 1,
      currentRevision: 2,
    });
    // nightLightDoc(10) has C1 = 320n, nightLightDoc(11) has 330n.
    expect(stale.body.error.changedSince.parts.changed).toEqual([
      {
        ref: "C1",
        kind: "capacitor",
        changes: [{ field: "value", from: "320n", to: "330n" }],
        pins: [],
      },
    ]);
    const history = await call("GET", `/api/entries/${entryId}/revisions`, { as: viewer.as });
    expect(
      history.body.revisions.map((r: { number: number; message: string }) => [r.number, r.message]),
    ).toEqual([
      [2, "dropper re-read"],
      [1, "first trace"],
    ]);
    const r2 = await call("GET", `/api/entries/${entryId}/revisions/2`, { as: viewer.as });
    expect(r2.body.revision.record.parts[0].value).toBe("330n");
    expect(
      (
        await call("POST", `/api/entries/${entryId}/revisions`, {
          as: owner.as,
          json: { record: nightLightDoc(12) },
        })
      ).status,
    ).toBe(422);
  });

  it("diffs two revisions by part ref: added, removed, changed values and connections", async () => {
    const base = nightLightDoc(0);
    const entryId = (await createJson(teamA, editor, base)).body.entryId;
    const next = structuredClone(base) as { parts: Record<string, unknown>[] };
    next.parts = next.parts.filter((p) => p.ref !== "R1");
    next.parts.push({ ref: "R3", kind: "resistor", value: "470k", pins: ["L", "A"] });
    next.parts[1] = { ...next.parts[1], pins: ["A", "P"] };
    await call("POST", `/api/entries/${entryId}/revisions`, {
      as: editor.as,
      json: { record: next, baseRevision: 1 },
    });
    const res = await call("GET", `/api/entries/${entryId}/diff?from=1&to=2`, { as: viewer.as });
    expect(res.status).toBe(200);
    expect(res.body.diff.parts.added.map((p: { ref: string }) => p.ref)).toEqual(["R3"]);
    expect(res.body.diff.parts.removed.map((p: { ref: string }) => p.ref)).toEqual(["R1"]);
    expect(res.body.diff.parts.changed).toEqual([
      { ref: "R2", kind: "resistor", changes: [], pins: [{ pin: "b", from: "B", to: "P" }] },
    ]);
    expect(
      (await call("GET", `/api/entries/${entryId}/diff?from=1&to=9`, { as: viewer.as })).status,
    ).toBe(404);
  });
});

describe("lists", () => {
  let listTeam: string;
  beforeAll(async () => {
    listTeam = (await call("POST", "/api/teams", { as: owner.as, json: { name: "List team" } }))
      .body.team.id;
    for (const [i, title, category] of [
      [20, "Charlie", "lamp"],
      [21, "alpha", "heater"],
      [22, "Bravo", "lamp"],
      [23, "delta", "lamp"],
      [24, "Echo", "fan"],
    ] as const) {
      await createJson(listTeam, owner, {
        ...nightLightDoc(i),
        title,
        device: { category, rated_supply: { vrms: 230, hz: 50 } },
      });
    }
  });

  it("sorts by title and pages with a cursor, every entry once", async () => {
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const res = await call(
        "GET",
        `/api/teams/${listTeam}/entries?sort=title&limit=2${cursor ? `&cursor=${cursor}` : ""}`,
        { as: owner.as },
      );
      expect(res.body.entries.length).toBeLessThanOrEqual(2);
      seen.push(...res.body.entries.map((e: { title: string }) => e.title));
      cursor = res.body.nextCursor;
    } while (cursor);
    // Postgres sorts by the database collation; compare against the same rule, not a hard-coded order.
    const expected = (
      await app.db.db.execute<{ title: string }>(
        sql`select title from entries where team_id = ${listTeam} order by title, id`,
      )
    ).rows.map((r) => r.title);
    expect(seen).toEqual(expected);
    expect(new Set(seen).size).toBe(5);
  });

  it("sorts by last update, newest first, across pages", async () => {
    const page1 = await call("GET", `/api/teams/${listTeam}/entries?limit=3`, { as: owner.as });
    const page2 = await call(
      "GET",
      `/api/teams/${listTeam}/entries?limit=3&cursor=${page1.body.nextCursor}`,
      { as: owner.as },
    );
    expect(
      [...page1.body.entries, ...page2.body.entries].map((e: { title: string }) => e.title),
    ).toEqual(["Echo", "delta", "Bravo", "alpha", "Charlie"]);
    expect(page2.body.nextCursor).toBeNull();
  });

  it("filters by category, flag code and block kind", async () => {
    const lamps = await call("GET", `/api/teams/${listTeam}/entries?category=lamp&sort=title`, {
      as: owner.as,
    });
    expect(lamps.body.entries).toHaveLength(3);
    await app.db.db.execute(
      sql`update entries set search_flags = array['touch-current'] where team_id = ${listTeam} and title = 'Bravo'`,
    );
    const flagged = await call("GET", `/api/teams/${listTeam}/entries?flag=touch-current`, {
      as: owner.as,
    });
    expect(flagged.body.entries.map((e: { title: string }) => e.title)).toEqual(["Bravo"]);
    const [echo] = await app.db.db
      .select()
      .from(schema.entries)
      .where(and(eq(schema.entries.teamId, listTeam), eq(schema.entries.title, "Echo")));
    await finishAnalysis(echo!.id);
    const bridges = await call("GET", `/api/teams/${listTeam}/entries?block=bridge-rectifier`, {
      as: owner.as,
    });
    expect(
      bridges.body.entries.map((e: { title: string; analysisState: string }) => [
        e.title,
        e.analysisState,
      ]),
    ).toEqual([["Echo", "done"]]);
    expect(
      (await call("GET", `/api/teams/${listTeam}/entries?limit=1000`, { as: owner.as })).status,
    ).toBe(422);
  });
});

describe("public entries, archive, state and exports", () => {
  let entryId: string;
  beforeAll(async () => {
    entryId = (await createJson(teamA, editor, nightLightDoc(30))).body.entryId;
  });

  it("hides a team-only entry from anonymous readers and shows a public one", async () => {
    expect((await call("GET", `/api/entries/${entryId}`)).status).toBe(404);
    const made = await call("PATCH", `/api/entries/${entryId}`, {
      as: editor.as,
      json: { visibility: "public" },
    });
    expect(made.status).toBe(200);
    const anon = await call("GET", `/api/entries/${entryId}`);
    expect(anon.status).toBe(200);
    expect(anon.body.role).toBeNull();
    const anonList = await call("GET", "/api/entries");
    expect(anonList.body.entries.map((e: { id: string }) => e.id)).toEqual([entryId]);
    expect((await call("GET", `/api/entries/${entryId}/export/record.json`)).status).toBe(200);
    // An outsider may read it but not change it.
    expect(
      (
        await call("PATCH", `/api/entries/${entryId}`, {
          as: outsider.as,
          json: { archived: true },
        })
      ).status,
    ).toBe(403);
    expect((await call("GET", `/api/entries/${entryId}/comments`)).status).toBe(401);
  });

  it("archives: gone from default lists and from anonymous readers, back on unarchive", async () => {
    await call("PATCH", `/api/entries/${entryId}`, { as: editor.as, json: { archived: true } });
    const list = await call("GET", `/api/teams/${teamA}/entries?limit=100`, { as: editor.as });
    expect(list.body.entries.map((e: { id: string }) => e.id)).not.toContain(entryId);
    const archived = await call("GET", `/api/teams/${teamA}/entries?archived=only`, {
      as: editor.as,
    });
    expect(archived.body.entries.map((e: { id: string }) => e.id)).toEqual([entryId]);
    expect((await call("GET", `/api/entries/${entryId}`)).status).toBe(404);
    expect(
      (await call("GET", `/api/entries/${entryId}`, { as: viewer.as })).body.entry.archived,
    ).toBe(true);
    await call("PATCH", `/api/entries/${entryId}`, { as: editor.as, json: { archived: false } });
    expect((await call("GET", `/api/entries/${entryId}`)).status).toBe(200);
  });

  it("shows an older engine's finished analysis while the current one is queued", async () => {
    const [rev] = await app.db.db
      .select()
      .from(schema.revisions)
      .where(eq(schema.revisions.entryId, entryId));
    await app.db.db.insert(schema.analyses).values({
      revisionId: rev!.id,
      engineVersion: "0.9.0",
      state: "done",
      result: { engine: "0.9.0" },
      startedAt: sql`now()`,
      finishedAt: sql`now()`,
    });
    const got = await call("GET", `/api/entries/${entryId}`, { as: viewer.as });
    expect(got.body.analysis.state).toBe("queued");
    // A stored result too old to read is not guessed at: the reader gets why, and no figures.
    expect(got.body.olderAnalysis).toMatchObject({
      state: "done",
      engineVersion: "0.9.0",
      result: null,
      upgradedFrom: null,
    });
    expect(got.body.olderAnalysis.resultProblem).toMatch(/supply/);
    expect(
      (await call("GET", `/api/entries/${entryId}/export/analysis.json`, { as: viewer.as })).status,
    ).toBe(409);
  });

  it("shows a running analysis with its start, then the done one with result and layout", async () => {
    const [rev] = await app.db.db
      .select()
      .from(schema.revisions)
      .where(eq(schema.revisions.entryId, entryId));
    await app.db.db
      .update(schema.analyses)
      .set({ state: "running", startedAt: sql`now()` })
      .where(
        and(
          eq(schema.analyses.revisionId, rev!.id),
          eq(schema.analyses.engineVersion, ENGINE_VERSION),
        ),
      );
    const running = await call("GET", `/api/entries/${entryId}`, { as: viewer.as });
    expect(running.body.analysis.state).toBe("running");
    expect(running.body.analysis.startedAt).toEqual(expect.any(String));
    await finishAnalysis(entryId);
    const done = await call("GET", `/api/entries/${entryId}`, { as: viewer.as });
    expect(done.body.analysis.state).toBe("done");
    expect(done.body.analysis.result.engine).toBe(ENGINE_VERSION);
    expect(done.body.analysis.result.status).toBe("complete");
    expect(done.body.analysis.result.gaps).toEqual([]);
    // The layout draws every part of the record once, each inside the drawing at finite
    // coordinates, with one placed pin per pin of the record.
    const layout = done.body.analysis.layout as {
      width: number;
      height: number;
      parts: Array<{
        ref: string;
        x: number;
        y: number;
        width: number;
        height: number;
        pins: unknown[];
      }>;
    };
    const doc = nightLightDoc(30);
    const refs = (doc.parts as Array<{ ref: string; pins: unknown }>).map((p) => p.ref);
    expect(layout.parts.map((p) => p.ref).sort()).toEqual([...refs].sort());
    for (const p of layout.parts) {
      for (const v of [p.x, p.y, p.width, p.height]) expect(Number.isFinite(v)).toBe(true);
      expect(p.width).toBeGreaterThan(0);
      expect(p.x).toBeGreaterThanOrEqual(0);
      expect(p.y).toBeGreaterThanOrEqual(0);
      expect(p.x + p.width).toBeLessThanOrEqual(layout.width);
      expect(p.y + p.height).toBeLessThanOrEqual(layout.height);
      const recordPins = (doc.parts as Array<{ ref: string; pins: unknown }>).find(
        (q) => q.ref === p.ref,
      )!.pins;
      const count = Array.isArray(recordPins)
        ? recordPins.length
        : Object.keys(recordPins as object).length;
      expect(p.pins).toHaveLength(count);
    }
    expect(done.body.olderAnalysis).toBeNull();
  });

  it("serves the record's JSON Schema and the analysis result's, and 404 for any other", async () => {
    const rec = await call("GET", "/api/schema/record-v1.schema.json");
    expect(rec.status).toBe(200);
    expect(rec.headers.get("content-type")).toContain("application/schema+json");
    const schemaDoc = JSON.parse(rec.text) as { $id: string; properties: Record<string, unknown> };
    expect(schemaDoc.$id).toBe("record-v1.schema.json");
    expect(Object.keys(schemaDoc.properties)).toEqual(expect.arrayContaining(["parts", "nets"]));
    const result = await call("GET", "/api/schema/analysis-result-v1.schema.json");
    expect(JSON.parse(result.text).$id).toBe("analysis-result-v1.schema.json");
    expect((await call("GET", "/api/schema/passwords.json")).status).toBe(404);
  });

  it("exports the record as YAML and JSON, the analysis as JSON and the schematic as SVG", async () => {
    const yaml = await call("GET", `/api/entries/${entryId}/export/record.yaml`);
    expect(yaml.headers.get("content-type")).toContain("yaml");
    const doc = parseYaml(yaml.text) as { title: string; parts: { ref: string; value: string }[] };
    expect(doc.title).toBe("Test night light 30");
    expect(doc.parts.find((p) => p.ref === "C1")?.value).toBe("520n");
    const asJson = await call("GET", `/api/entries/${entryId}/export/record.json`);
    expect(JSON.parse(asJson.text)).toEqual(doc);
    const analysis = await call("GET", `/api/entries/${entryId}/export/analysis.json`);
    expect(analysis.status).toBe(200);
    expect(JSON.parse(analysis.text)).toMatchObject({
      entryId,
      revision: 1,
      engineVersion: ENGINE_VERSION,
      result: { engine: ENGINE_VERSION },
    });
    const svg = await call("GET", `/api/entries/${entryId}/export/schematic.svg`);
    expect(svg.headers.get("content-type")).toContain("image/svg+xml");
    expect(svg.text).toMatch(/^<svg[\s\S]*<\/svg>\s*$/);
    expect(svg.text).toContain("C1");
    expect((await call("GET", `/api/entries/${entryId}/export/record.exe`)).status).toBe(404);
  });
});
