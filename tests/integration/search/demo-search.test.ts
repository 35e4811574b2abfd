// Search on the demo data through the app's own route handlers: each variant pair ranks its twin
// first under "similar"; fragment search returns exactly the entries a brute-force matcher
// written here finds, with the same placements; an outsider never finds, counts or ranks a
// team-only entry in text, facet, similar or fragment search; cursors page without repeats and a
// crafted one is a 400. The search columns are written the way the worker writes them, with the
// scenario's intended flags standing in for a full analysis (which takes minutes per board).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import path from "node:path";
import { sql } from "drizzle-orm";
import type { PgBoss } from "pg-boss";
import { createQueue, startQueue, writeSearchColumns } from "@teardown/db";
import {
  findBlocks,
  fingerprint,
  FINGERPRINT_VERSION,
  parseRecord,
  searchTextOf,
  topologyColumnsFor,
  type TeardownRecord,
} from "@teardown/engine";
import { DEMO_ENTRIES, demoRecordDocs, loadDemoData } from "@teardown/seed-demo";
import { REVISION_EXPECTATIONS, VARIANT_PAIRS } from "@teardown/seed-demo/scenario-expectations";
import { backfillFingerprints } from "../../../analysis-worker/src/fingerprint-backfill.js";
import {
  call,
  openTestWebApp,
  signIn,
  signUp,
  type As,
  type TestUser,
  type TestWebApp,
} from "../../support/api-client.js";
import { bruteForcePlacements, type PlainCircuit } from "./brute-force-fragment.js";

let app: TestWebApp;
let boss: PgBoss;
let member: As;
let outsider: TestUser;
/** Demo slug -> entry id, and each entry's current record and visibility. */
const ids = new Map<string, string>();
const demo = new Map<
  string,
  { record: TeardownRecord; visibility: string; flags: string[]; blocks: string[] }
>();

function parsed(doc: unknown): TeardownRecord {
  const p = parseRecord(JSON.stringify(doc), { filename: "demo.json" });
  if (!p.ok) throw new Error(p.errors[0]!.message);
  return p.record;
}

beforeAll(async () => {
  app = await openTestWebApp();
  boss = createQueue(app.db.url, { supervise: false });
  await startQueue(boss);
  const seeded = await loadDemoData(app.db.db, boss, {
    uploadsDir: path.join(app.dataDir, "uploads"),
  });
  member = (await signIn(seeded.signIn.email, seeded.signIn.password)).as;
  outsider = await signUp("Outside Person", "outsider@example.test");
  const rows = await app.db.db.execute<{ id: string; title: string }>(
    sql`select id, title from entries`,
  );
  for (const e of demoRecordDocs()) {
    const current = e.revisions[e.revisions.length - 1]!;
    const id = rows.rows.find((r) => r.title === current.doc.title)!.id;
    ids.set(e.slug, id);
    const record = parsed(current.doc);
    const intended = REVISION_EXPECTATIONS[current.file]!;
    const flags = [...new Set(intended.flags.map((f) => f.code))].sort();
    const blocks = [...new Set(findBlocks(record).map((b) => b.kind))].sort() as string[];
    demo.set(e.slug, {
      record,
      visibility: DEMO_ENTRIES.find((d) => d.slug === e.slug)!.visibility,
      flags,
      blocks,
    });
  }
}, 120_000);
afterAll(async () => {
  await boss?.stop({ close: true });
  await app?.close();
});

describe("indexing", () => {
  it("the start-up backfill brings every demo entry's fingerprint to the topology-only definition", async () => {
    const before = await app.db.db.execute<{ n: number }>(
      sql`select count(*)::int as n from entries where fingerprint_version = ${FINGERPRINT_VERSION}`,
    );
    expect(before.rows[0]!.n).toBe(0);
    const done = await backfillFingerprints(app.db.db);
    expect(done).toEqual({ updated: DEMO_ENTRIES.length, unreadable: 0 });
    const rows = await app.db.db.execute<{ id: string; fingerprint: number[] }>(
      sql`select id, fingerprint from entries where fingerprint_version = ${FINGERPRINT_VERSION}`,
    );
    expect(rows.rows).toHaveLength(DEMO_ENTRIES.length);
    for (const [slug, id] of ids)
      expect(rows.rows.find((r) => r.id === id)!.fingerprint).toEqual(
        fingerprint(demo.get(slug)!.record),
      );
    // A second run finds nothing left to do.
    expect(await backfillFingerprints(app.db.db)).toEqual({ updated: 0, unreadable: 0 });
  });

  it("writes the rest of the search columns as the worker does", async () => {
    for (const [slug, d] of demo) {
      const file = DEMO_ENTRIES.find((e) => e.slug === slug)!.revisions.at(-1)!.file;
      await writeSearchColumns(
        app.db.db,
        ids.get(slug)!,
        DEMO_ENTRIES.find((e) => e.slug === slug)!.revisions.length,
        {
          ...topologyColumnsFor(d.record),
          blocks: d.blocks,
          flags: d.flags,
          facets: {
            supply_vrms: d.record.device.rated_supply.vrms,
            supply_hz: d.record.device.rated_supply.hz,
          },
          text: searchTextOf(d.record),
          tags: d.record.device.tags.join(" "),
          mismatch: REVISION_EXPECTATIONS[file]!.mismatches.length > 0,
        },
      );
    }
    await app.db.db.execute(sql`analyze entries`);
  });
});

type SimilarBody = {
  results: Array<{
    entry: { id: string; visibility: string };
    score: number;
    sharedBlocks: string[];
  }>;
};

describe("similar circuits", () => {
  for (const pair of VARIANT_PAIRS)
    for (const [from, twin] of [
      [pair.a, pair.b],
      [pair.b, pair.a],
    ] as const)
      it(`ranks ${twin} first for ${from}, and names the blocks both have`, async () => {
        const res = await call("GET", `/api/entries/${ids.get(from)}/similar?limit=5`, {
          as: member,
        });
        expect(res.status).toBe(200);
        const results = (res.body as SimilarBody).results;
        expect(results[0]!.entry.id).toBe(ids.get(twin));
        expect(results.map((r) => r.entry.id)).not.toContain(ids.get(from));
        const a = new Set(demo.get(from)!.blocks);
        expect(results[0]!.sharedBlocks).toEqual(
          demo
            .get(twin)!
            .blocks.filter((b) => a.has(b))
            .sort(),
        );
        // Best first.
        const scores = results.map((r) => r.score);
        expect(scores).toEqual([...scores].sort((x, y) => y - x));
      });

  it("shows an outsider only public neighbours of a public entry, and 404 for a team-only one", async () => {
    const res = await call(
      "GET",
      `/api/entries/${ids.get("lumora-led-bulb-l24a")}/similar?limit=100`,
      {
        as: outsider.as,
      },
    );
    expect(res.status).toBe(200);
    const results = (res.body as SimilarBody).results;
    expect(results.length).toBeGreaterThan(0);
    expect(results.every((r) => r.entry.visibility === "public")).toBe(true);
    expect(results.map((r) => r.entry.id)).not.toContain(ids.get("lumora-led-bulb-l24c"));
    const hidden = await call("GET", `/api/entries/${ids.get("lumora-led-bulb-l24c")}/similar`, {
      as: outsider.as,
    });
    expect(hidden.status).toBe(404);
  });
});

/** A fragment as text for the API and, written separately, as the brute-force matcher reads it. */
interface FragmentCase {
  name: string;
  format: "record" | "deck" | "csv";
  text: string;
  plain: PlainCircuit;
}

const two = (ref: string, kind: string, a: string, b: string) => ({
  ref,
  kind,
  polarised: false,
  pins: { a, b },
});
const diode = (ref: string, kind: string, anode: string, cathode: string) => ({
  ref,
  kind,
  polarised: false,
  pins: { anode, cathode },
});

const FRAGMENTS: FragmentCase[] = [
  {
    name: "a dropper capacitor with a resistor across it (deck, no values)",
    format: "deck",
    text: "* dropper and bleeder\nC1 X Y\nR1 X Y\n",
    plain: { parts: [two("C1", "capacitor", "X", "Y"), two("R1", "resistor", "X", "Y")], nets: {} },
  },
  {
    name: "the same pair on the line net (record, roles given)",
    format: "record",
    text: "parts:\n  - { ref: C1, kind: capacitor, pins: [L, Y] }\n  - { ref: R1, kind: resistor, pins: [L, Y] }\nnets:\n  L: { role: line }\n",
    plain: {
      parts: [two("C1", "capacitor", "L", "Y"), two("R1", "resistor", "L", "Y")],
      nets: { L: { role: "line" } },
    },
  },
  {
    name: "two LEDs in series (CSV)",
    format: "csv",
    text: "ref,kind,pins\nLA,led,anode=P cathode=Q\nLB,led,anode=Q cathode=S\n",
    plain: { parts: [diode("LA", "led", "P", "Q"), diode("LB", "led", "Q", "S")], nets: {} },
  },
  {
    name: "half a bridge: two diodes into one node",
    format: "record",
    text: "parts:\n  - { ref: D1, kind: diode, pins: { anode: A, cathode: P } }\n  - { ref: D2, kind: diode, pins: { anode: B, cathode: P } }\n",
    plain: { parts: [diode("D1", "diode", "A", "P"), diode("D2", "diode", "B", "P")], nets: {} },
  },
];

function plainOf(r: TeardownRecord): PlainCircuit {
  return {
    parts: r.parts.map((p) => ({ ref: p.ref, kind: p.kind, polarised: p.polarised, pins: p.pins })),
    nets: Object.fromEntries(Object.entries(r.nets).map(([k, v]) => [k, { role: v.role }])),
  };
}

type FragmentBody = {
  results: Array<{
    entry: { id: string; visibility: string };
    matches: Array<{ parts: Record<string, string> }>;
  }>;
};

describe("fragment search", () => {
  for (const f of FRAGMENTS)
    it(`finds exactly the entries holding ${f.name}, with every placement`, async () => {
      const res = await call("POST", "/api/search/fragment", {
        as: member,
        json: { text: f.text, format: f.format, limit: 100 },
      });
      expect(res.status).toBe(200);
      const got = new Map(
        (res.body as FragmentBody).results.map((r) => [
          r.entry.id,
          new Set(
            r.matches.map((m) =>
              JSON.stringify(Object.fromEntries(Object.entries(m.parts).sort())),
            ),
          ),
        ]),
      );
      const want = new Map<string, Set<string>>();
      for (const [slug, d] of demo) {
        const placements = bruteForcePlacements(f.plain, plainOf(d.record));
        if (placements.size > 0) want.set(ids.get(slug)!, placements);
      }
      expect(want.size).toBeGreaterThan(0);
      expect([...got.keys()].sort()).toEqual([...want.keys()].sort());
      for (const [id, placements] of want)
        if (placements.size <= 20) expect(got.get(id)).toEqual(placements);

      const outside = await call("POST", "/api/search/fragment", {
        as: outsider.as,
        json: { text: f.text, format: f.format, limit: 100 },
      });
      const publicIds = [...want.keys()].filter((id) =>
        [...ids].some(([slug, x]) => x === id && demo.get(slug)!.visibility === "public"),
      );
      expect((outside.body as FragmentBody).results.map((r) => r.entry.id).sort()).toEqual(
        publicIds.sort(),
      );
    });

  it("answers a fragment that does not read with 422, the line and the path", async () => {
    const res = await call("POST", "/api/search/fragment", {
      as: member,
      json: {
        text: "parts:\n  - { ref: C1, kind: capacitor, pins: [X, Y] }\n  - { ref: R1, kind: resistor, value: 10 ohms of course, pins: [X, Y] }\n",
        format: "record",
      },
    });
    expect(res.status).toBe(422);
    const problem = res.body.error.errors[0];
    expect(problem.line).toBe(3);
    expect(problem.path).toMatch(/^parts\[1\]/);
  });
});

type SearchBody = {
  results: Array<{
    entry: { id: string; visibility: string; title: string };
    score: number;
    snippet: string;
  }>;
  facets: Record<string, Array<{ value: string; count: number }>>;
  nextCursor: string | null;
};

/** Counts of each value over the given demo entries, as a facet would list them. */
function counts(values: string[]): Array<{ value: string; count: number }> {
  const m = new Map<string, number>();
  for (const v of values) m.set(v, (m.get(v) ?? 0) + 1);
  return [...m]
    .map(([value, count]) => ({ value, count }))
    .sort((a, b) => b.count - a.count || (a.value < b.value ? -1 : 1));
}

describe("text search and facets", () => {
  it("counts each facet over exactly the entries a reader may see", async () => {
    for (const [as, seen] of [
      [member, [...demo.values()]],
      [outsider.as, [...demo.values()].filter((d) => d.visibility === "public")],
      [null, [...demo.values()].filter((d) => d.visibility === "public")],
    ] as const) {
      const res = await call("GET", "/api/search?limit=100", { as });
      expect(res.status).toBe(200);
      const body = res.body as SearchBody;
      expect(body.results).toHaveLength(seen.length);
      expect(body.facets.category).toEqual(
        counts(seen.map((d) => d.record.device.category!).filter(Boolean)),
      );
      expect(body.facets.flag).toEqual(counts(seen.flatMap((d) => d.flags)));
      expect(body.facets.block).toEqual(counts(seen.flatMap((d) => d.blocks)));
      expect(body.facets.supply).toEqual(
        counts(
          seen.map(
            (d) => `${d.record.device.rated_supply.vrms}/${d.record.device.rated_supply.hz}`,
          ),
        ),
      );
      // The team facet names only the reader's own teams: the member sees the demo team by
      // name; others see no team at all (not its id, not its name), though they find its
      // public entries.
      const team = await app.db.db.execute<{ id: string; name: string }>(
        sql`select distinct t.id::text as id, t.name from teams t join entries e on e.team_id = t.id`,
      );
      expect(team.rows).toHaveLength(1);
      const { id: teamId, name: teamName } = team.rows[0]!;
      if (as === member)
        expect(body.facets.team).toEqual([{ value: teamId, count: seen.length, label: teamName }]);
      else {
        expect(body.facets.team).toEqual([]);
        expect(JSON.stringify(body.facets)).not.toContain(teamId);
        expect(JSON.stringify(body.facets)).not.toContain(teamName);
      }
    }
  });

  it("never finds a team-only entry for an outsider by its title or its team's comments", async () => {
    const secret = demo.get("breezel-desk-ionizer")!;
    expect(secret.visibility).toBe("team");
    const mine = await call("GET", "/api/search?q=ionizer", { as: member });
    expect((mine.body as SearchBody).results.map((r) => r.entry.id)).toContain(
      ids.get("breezel-desk-ionizer"),
    );
    const theirs = await call("GET", "/api/search?q=ionizer", { as: outsider.as });
    const body = theirs.body as SearchBody;
    expect(body.results).toEqual([]);
    for (const list of Object.values(body.facets)) expect(list).toEqual([]);
    // "desoldering" is only in a comment on a public entry: members find the entry by it,
    // outsiders (who cannot read comments) do not.
    const byComment = await call("GET", "/api/search?q=desoldering", { as: member });
    expect((byComment.body as SearchBody).results.map((r) => r.entry.id)).toContain(
      ids.get("glowmoth-night-light"),
    );
    const outsiderComment = await call("GET", "/api/search?q=desoldering", { as: outsider.as });
    expect((outsiderComment.body as SearchBody).results).toEqual([]);
  });

  it("narrows by two facets, several values in one, and keeps the other facets' counts", async () => {
    const res = await call(
      "GET",
      "/api/search?limit=100&category=night%20light&category=led%20lamp&flag=no-fuse",
      { as: member },
    );
    expect(res.status).toBe(200);
    const body = res.body as SearchBody;
    const expected = [...demo.entries()].filter(
      ([, d]) =>
        ["night light", "led lamp"].includes(d.record.device.category ?? "") &&
        d.flags.includes("no-fuse"),
    );
    expect(body.results.map((r) => r.entry.id).sort()).toEqual(
      expected.map(([s]) => ids.get(s)!).sort(),
    );
    // The category facet is counted without its own filter (but with the flag filter).
    expect(body.facets.category).toEqual(
      counts(
        [...demo.values()]
          .filter((d) => d.flags.includes("no-fuse"))
          .map((d) => d.record.device.category!),
      ),
    );
  });

  it("ranks a title match first, highlights it, and pages by cursor without repeats", async () => {
    const res = await call("GET", "/api/search?q=glowmoth", { as: member });
    const body = res.body as SearchBody;
    expect(body.results.length).toBe(2);
    for (const r of body.results) expect(r.snippet).toMatch(/<mark>glowmoth<\/mark>/i);
    const all = (await call("GET", "/api/search?q=capacitor&limit=100", { as: member }))
      .body as SearchBody;
    expect(all.results.length).toBeGreaterThan(3);
    const paged: string[] = [];
    let cursor: string | null = null;
    do {
      const page: SearchBody = (
        await call("GET", `/api/search?q=capacitor&limit=2${cursor ? `&cursor=${cursor}` : ""}`, {
          as: member,
        })
      ).body;
      paged.push(...page.results.map((r) => r.entry.id));
      cursor = page.nextCursor;
    } while (cursor);
    expect(paged).toEqual(all.results.map((r) => r.entry.id));
  });

  it("answers a crafted cursor with 400 naming `cursor`, never a 500", async () => {
    const crafted = [
      "not-base64!",
      Buffer.from(
        JSON.stringify({ r: "1e400", id: "00000000-0000-0000-0000-000000000000" }),
      ).toString("base64url"),
      Buffer.from(JSON.stringify({ r: "0.5'; drop table entries; --", id: "x" })).toString(
        "base64url",
      ),
      Buffer.from(
        JSON.stringify({ t: "2026-02-31 10:00:00+00", id: "00000000-0000-0000-0000-000000000000" }),
      ).toString("base64url"),
      Buffer.from(
        JSON.stringify({ t: "2026-01-01 10:00:00+99", id: "00000000-0000-0000-0000-000000000000" }),
      ).toString("base64url"),
      Buffer.from("[1,2]").toString("base64url"),
    ];
    for (const c of crafted) {
      const res = await call("GET", `/api/search?q=capacitor&cursor=${encodeURIComponent(c)}`, {
        as: member,
      });
      expect(res.status).toBe(400);
      expect(res.body.error.path).toBe("cursor");
    }
  });
});
