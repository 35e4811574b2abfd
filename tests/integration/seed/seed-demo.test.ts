// The demo seed loads the whole invented scenario once (a second load adds nothing): members who
// sign in with the printed password, the team, every revision with its queued analysis, the
// comments and a drawn board sketch per entry. Deterministic in its records: two databases get
// identical records, hash for hash.
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { inflateSync } from "node:zlib";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import type { PgBoss } from "pg-boss";
import { verifyPassword } from "better-auth/crypto";
import { createQueue, startQueue } from "@teardown/db";
import {
  DEMO_ENTRIES,
  DEMO_MEMBERS,
  DEMO_PASSWORD,
  demoRecordDocs,
  loadDemoData,
} from "@teardown/seed-demo";
import { createTestDatabase, type TestDatabase } from "../../support/test-database.js";

let a: TestDatabase;
let b: TestDatabase;
let uploads: string;
const bosses: PgBoss[] = [];

async function bossFor(url: string): Promise<PgBoss> {
  const boss = createQueue(url, { supervise: false });
  await startQueue(boss);
  bosses.push(boss);
  return boss;
}

async function counts(t: TestDatabase): Promise<Record<string, number>> {
  const rows = await t.db.execute<Record<string, number>>(sql`
    select (select count(*)::int from teams) as teams,
           (select count(*)::int from users) as users,
           (select count(*)::int from accounts where provider_id = 'credential') as credentials,
           (select count(*)::int from memberships) as members,
           (select count(*)::int from entries) as entries,
           (select count(*)::int from entries where visibility = 'public') as public,
           (select count(distinct category)::int from entries) as categories,
           (select count(*)::int from revisions) as revisions,
           (select count(*)::int from entries where current_revision > 1) as revised,
           (select count(*)::int from comments) as comments,
           (select count(distinct author_id)::int from comments) as commenters,
           (select count(*)::int from photos) as photos,
           (select count(*)::int from analyses where state = 'queued') as queued,
           (select count(*)::int from pgboss.job where name = 'analyze-revision') as jobs`);
  return rows.rows[0]!;
}

beforeAll(async () => {
  [a, b] = await Promise.all([createTestDatabase(), createTestDatabase()]);
  uploads = mkdtempSync(path.join(tmpdir(), "tl-seed-uploads-"));
});
afterAll(async () => {
  for (const boss of bosses) await boss.stop({ close: true });
  await Promise.all([a?.drop(), b?.drop()]);
  if (uploads) rmSync(uploads, { recursive: true, force: true });
});

describe("the demo seed", () => {
  it("loads a lab's year: 16+ entries in 8+ categories, revisions, comments, one sketch each", async () => {
    const boss = await bossFor(a.url);
    const first = await loadDemoData(a.db, boss, { uploadsDir: uploads });
    const revisions = DEMO_ENTRIES.reduce((n, e) => n + e.revisions.length, 0);
    const comments = DEMO_ENTRIES.reduce((n, e) => n + e.comments.length, 0);
    expect(first).toMatchObject({ loaded: true, entries: DEMO_ENTRIES.length, revisions });
    const c = await counts(a);
    expect(c).toMatchObject({
      teams: 1,
      users: DEMO_MEMBERS.length,
      credentials: DEMO_MEMBERS.length,
      members: DEMO_MEMBERS.length,
      entries: DEMO_ENTRIES.length,
      revisions,
      comments,
      photos: DEMO_ENTRIES.length,
      queued: revisions,
      jobs: revisions,
    });
    // The floor for a collection that looks like a lab's work.
    expect(c.entries).toBeGreaterThanOrEqual(16);
    expect(c.categories).toBeGreaterThanOrEqual(8);
    expect(c.revised).toBeGreaterThanOrEqual(2);
    expect(c.commenters).toBeGreaterThanOrEqual(3);
    // Some entries public, most team-only.
    expect(c.public).toBeGreaterThan(0);
    expect(c.public).toBeLessThan(c.entries! / 2);
  });

  it("adds nothing on a second load and still names the sign-in", async () => {
    const before = await counts(a);
    const second = await loadDemoData(a.db, bosses[0]!, { uploadsDir: uploads });
    expect(second).toMatchObject({ loaded: false, entries: 0, revisions: 0 });
    expect(second.signIn.password).toBe(DEMO_PASSWORD);
    expect(await counts(a)).toEqual(before);
  });

  it("gives the printed member a password that verifies and a seat on the demo team", async () => {
    const { signIn } = await loadDemoData(a.db, bosses[0]!, { uploadsDir: uploads });
    const rows = await a.db.execute<{ password: string; role: string; team_entries: number }>(sql`
      select acc.password, m.role,
             (select count(*)::int from entries e where e.team_id = m.team_id) as team_entries
        from users u join accounts acc on acc.user_id = u.id and acc.provider_id = 'credential'
        join memberships m on m.user_id = u.id
       where u.email = ${signIn.email}`);
    expect(rows.rows).toHaveLength(1);
    const row = rows.rows[0]!;
    // The sign-in library's own verifier accepts the printed password and refuses another.
    expect(await verifyPassword({ hash: row.password, password: signIn.password })).toBe(true);
    expect(await verifyPassword({ hash: row.password, password: "not-the-demo-pw" })).toBe(false);
    expect(signIn.password.length).toBeGreaterThanOrEqual(10);
    // A member of the team sees every demo entry, team-only ones included.
    expect(row.team_entries).toBe(DEMO_ENTRIES.length);
    expect(["owner", "editor"]).toContain(row.role);
  });

  it("stores each sketch as a real PNG whose pixels match its recorded size", async () => {
    const rows = await a.db.execute<{ storage_key: string; size_bytes: number; sha256: string }>(
      sql`select storage_key, size_bytes, sha256 from photos`,
    );
    for (const r of rows.rows) {
      const bytes = readFileSync(path.join(uploads, ...r.storage_key.split("/")));
      expect(bytes.length).toBe(r.size_bytes);
      expect([...bytes.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
      const [, w, h] = /\.(\d+)x(\d+)\.png$/.exec(r.storage_key)!.map(Number);
      expect(bytes.readUInt32BE(16)).toBe(w);
      expect(bytes.readUInt32BE(20)).toBe(h);
      // The image data inflates to one filter byte plus three bytes per pixel on every row.
      const idatLen = bytes.readUInt32BE(33);
      expect(bytes.toString("ascii", 37, 41)).toBe("IDAT");
      expect(inflateSync(bytes.subarray(41, 41 + idatLen)).length).toBe((w! * 3 + 1) * h!);
    }
    expect(rows.rows.length).toBe(DEMO_ENTRIES.length);
  });

  it("gives two databases the same records, hash for hash", async () => {
    await loadDemoData(b.db, await bossFor(b.url), { uploadsDir: uploads });
    const hashes = async (t: TestDatabase) =>
      (
        await t.db.execute<{ record_hash: string }>(
          sql`select record_hash from revisions order by record_hash`,
        )
      ).rows.map((r) => r.record_hash);
    expect(await hashes(b)).toEqual(await hashes(a));
    expect(new Set(await hashes(a)).size).toBe(
      demoRecordDocs().reduce((n, e) => n + e.revisions.length, 0),
    );
  });
});
