// Text search's bounded work, checked against a brute-force reading of invented entries: below
// the caps every count is exact and every match is ranked; above them the page says so, the
// counts are lower bounds taken over exactly the capped sample, and the capped ranked set still
// holds only entries the reader may read that match the words and every filter. The team facet
// names only the reader's own teams, and a team filter reaches only those.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomBytes, randomUUID } from "node:crypto";
import {
  decodeSearchCursor,
  schema,
  searchText,
  type SearchFacet,
  type TextSearchQuery,
} from "@teardown/db";
import { makeTeam } from "../../support/entry-fixtures.js";
import { createTestDatabase, type TestDatabase } from "../../support/test-database.js";

let t: TestDatabase;
const VIEWER = "caps-viewer";
const CATEGORIES = ["night light", "door chime", "mat heater"];
const FLAGS = ["no-fuse", "bleeder-slow"];
interface Made {
  id: string;
  team: "mine" | "theirs";
  visibility: "team" | "public";
  category: string;
  flags: string[];
  mismatch: boolean;
  /** Whether the title holds the searched word. */
  word: boolean;
}
const made: Made[] = [];
let myTeam = "";
let theirTeam = "";

beforeAll(async () => {
  t = await createTestDatabase();
  myTeam = await makeTeam(t.db, "Quillfen bench");
  theirTeam = await makeTeam(t.db, "Morrow lab");
  await t.db.insert(schema.users).values({ id: VIEWER, name: "Caps Viewer", email: "caps@x.test" });
  await t.db.insert(schema.memberships).values({ teamId: myTeam, userId: VIEWER, role: "viewer" });
  // 12 of my team's (team-only), 8 public of theirs, 6 team-only of theirs (never visible); a
  // third of each group lacks the word.
  const groups = [
    { team: "mine", visibility: "team", n: 12 },
    { team: "theirs", visibility: "public", n: 8 },
    { team: "theirs", visibility: "team", n: 6 },
  ] as const;
  let i = 0;
  for (const g of groups)
    for (let k = 0; k < g.n; k++, i++)
      made.push({
        id: randomUUID(),
        team: g.team,
        visibility: g.visibility,
        category: CATEGORIES[i % 3]!,
        flags: FLAGS.filter((_, j) => (i >> j) & 1),
        mismatch: i % 4 === 0,
        word: k % 3 !== 2,
      });
  await t.db.transaction(async (tx) => {
    await tx.insert(schema.entries).values(
      made.map((m, n) => ({
        id: m.id,
        teamId: m.team === "mine" ? myTeam : theirTeam,
        title: `${m.word ? "glimmerwick " : ""}board ${n}`,
        category: m.category,
        visibility: m.visibility,
        currentRevision: 1,
        searchText: `board number ${n}`,
        searchFlags: m.flags,
        hasMismatch: m.mismatch,
      })),
    );
    await tx.insert(schema.revisions).values(
      made.map((m) => ({
        entryId: m.id,
        number: 1,
        record: { record: 1, title: "x", parts: [] },
        recordHash: randomBytes(32).toString("hex"),
        message: "test",
      })),
    );
  });
});
afterAll(async () => {
  await t?.drop();
});

const readable = () => made.filter((m) => m.visibility === "public" || m.team === "mine");
const withWord = () => readable().filter((m) => m.word);

function countsOf(values: string[]): Map<string, number> {
  const out = new Map<string, number>();
  for (const v of values) out.set(v, (out.get(v) ?? 0) + 1);
  return out;
}

async function allPages(query: TextSearchQuery): Promise<string[]> {
  const ids: string[] = [];
  let cursor: string | null = null;
  do {
    const page = await searchText(t.db, VIEWER, {
      ...query,
      cursor: cursor ? decodeSearchCursor(cursor)! : undefined,
    });
    ids.push(...page.hits.map((h) => h.id));
    cursor = page.nextCursor;
  } while (cursor);
  return ids;
}

describe("text search caps", () => {
  it("below the caps counts exactly and ranks every match", async () => {
    const expected = withWord();
    expect(expected).toHaveLength(14);
    const page = await searchText(t.db, VIEWER, {
      q: "glimmerwick",
      filters: {},
      limit: 100,
      caps: { rank: 14, facets: 14 },
    });
    expect(page.facetsExact).toBe(true);
    expect(page.rankedAll).toBe(true);
    expect(page.hits.map((h) => h.id).sort()).toEqual(expected.map((m) => m.id).sort());
    expect(new Map(page.facets.category.map((c) => [c.value, c.count]))).toEqual(
      countsOf(expected.map((m) => m.category)),
    );
    expect(new Map(page.facets.flag.map((c) => [c.value, c.count]))).toEqual(
      countsOf(expected.flatMap((m) => m.flags)),
    );
    // Only my team is named; their public entries count everywhere but under no team.
    expect(page.facets.team).toEqual([
      {
        value: myTeam,
        count: expected.filter((m) => m.team === "mine").length,
        label: "Quillfen bench",
      },
    ]);
    expect(JSON.stringify(page.facets)).not.toContain(theirTeam);
    expect(JSON.stringify(page.facets)).not.toContain("Morrow lab");
  });

  it("one match over a cap turns exact into lower bounds over exactly the capped sample", async () => {
    const expected = withWord();
    const page = await searchText(t.db, VIEWER, {
      q: "glimmerwick",
      filters: {},
      limit: 100,
      caps: { rank: 13, facets: 13 },
    });
    expect(page.facetsExact).toBe(false);
    expect(page.rankedAll).toBe(false);
    // Every entry has a mismatch value, so those counts add up to the sample's size.
    expect(page.facets.mismatch.reduce((s, c) => s + c.count, 0)).toBe(13);
    const full = countsOf(expected.map((m) => m.category));
    for (const c of page.facets.category) expect(c.count).toBeLessThanOrEqual(full.get(c.value)!);
    // The ranked set: 13 readable matches, no repeats.
    const ids = page.hits.map((h) => h.id);
    expect(ids).toHaveLength(13);
    expect(new Set(ids).size).toBe(13);
    for (const id of ids) expect(expected.map((m) => m.id)).toContain(id);
  });

  it("pages through the capped ranked set, which holds only readable matches of every filter", async () => {
    const filters: Partial<Record<SearchFacet, string[]>> = { flag: ["no-fuse"] };
    const expected = withWord().filter((m) => m.flags.includes("no-fuse"));
    expect(expected.length).toBeGreaterThan(4);
    const caps = { rank: 4, facets: 4 };
    const first = await searchText(t.db, VIEWER, { q: "glimmerwick", filters, limit: 3, caps });
    expect(first.rankedAll).toBe(false);
    const ids = await allPages({ q: "glimmerwick", filters, limit: 3, caps });
    expect(ids).toHaveLength(4);
    expect(new Set(ids).size).toBe(4);
    for (const id of ids) expect(expected.map((m) => m.id)).toContain(id);
  });

  it("without words counts the capped sample the same way and lists the newest first", async () => {
    const all = readable();
    const exact = await searchText(t.db, VIEWER, {
      filters: {},
      limit: 100,
      caps: { rank: 100, facets: all.length },
    });
    expect(exact.facetsExact).toBe(true);
    expect(exact.hits.map((h) => h.id).sort()).toEqual(all.map((m) => m.id).sort());
    expect(new Map(exact.facets.category.map((c) => [c.value, c.count]))).toEqual(
      countsOf(all.map((m) => m.category)),
    );
    const capped = await searchText(t.db, VIEWER, {
      filters: {},
      limit: 100,
      caps: { rank: 100, facets: all.length - 1 },
    });
    expect(capped.facetsExact).toBe(false);
    expect(capped.facets.mismatch.reduce((s, c) => s + c.count, 0)).toBe(all.length - 1);
    // Listing without words is not capped: every readable entry, still.
    expect(capped.hits).toHaveLength(all.length);
  });

  it("a team filter reaches only the reader's own teams", async () => {
    const mine = await searchText(t.db, VIEWER, { filters: { team: [myTeam] }, limit: 100 });
    expect(mine.hits.map((h) => h.id).sort()).toEqual(
      made
        .filter((m) => m.team === "mine")
        .map((m) => m.id)
        .sort(),
    );
    const theirs = await searchText(t.db, VIEWER, { filters: { team: [theirTeam] }, limit: 100 });
    expect(theirs.hits).toEqual([]);
    const anonymous = await searchText(t.db, null, { filters: { team: [theirTeam] }, limit: 100 });
    expect(anonymous.hits).toEqual([]);
    expect(anonymous.facets.team).toEqual([]);
  });
});
