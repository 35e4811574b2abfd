// Every committed migration applies to an empty database, and the tables and constraints the
// data needs exist afterwards and actually refuse bad rows.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { applyMigrations } from "@teardown/db";
import { createEmptyDatabase } from "../../support/test-database.js";

const EXPECTED_TABLES = [
  "accounts",
  "analyses",
  "api_tokens",
  "audit_log",
  "comments",
  "entries",
  "invites",
  "memberships",
  "photos",
  "revisions",
  "sessions",
  "teams",
  "users",
  "verifications",
  "what_if_results",
];

describe("migrations", () => {
  let target: Awaited<ReturnType<typeof createEmptyDatabase>>;
  let client: pg.Client;
  beforeAll(async () => {
    target = await createEmptyDatabase();
    await applyMigrations(target.url);
    client = new pg.Client({ connectionString: target.url });
    await client.connect();
  });
  afterAll(async () => {
    await client?.end();
    await target?.drop();
  });

  it("apply to an empty database and create every expected table", async () => {
    const r = await client.query<{ table_name: string }>(
      "select table_name from information_schema.tables where table_schema = 'public' order by 1",
    );
    expect(r.rows.map((x) => x.table_name)).toEqual(EXPECTED_TABLES);
  });

  it("are recorded once, so a second run applies nothing new", async () => {
    const before = await client.query(
      "select count(*)::int as n from drizzle.__drizzle_migrations",
    );
    await applyMigrations(target.url);
    const after = await client.query("select count(*)::int as n from drizzle.__drizzle_migrations");
    expect(after.rows[0].n).toBe(before.rows[0].n);
    expect(before.rows[0].n).toBeGreaterThanOrEqual(2);
  });

  it("create the named check, unique and foreign-key constraints", async () => {
    const r = await client.query<{ conname: string }>(
      "select conname from pg_constraint where connamespace = 'public'::regnamespace",
    );
    const names = new Set(r.rows.map((x) => x.conname));
    for (const name of [
      "revisions_entry_number_unique",
      "revisions_hash_format",
      "analyses_revision_engine_unique",
      "analyses_failed_has_error",
      "analyses_done_has_result",
      "photos_content_type",
      "photos_size",
      "entries_title_length",
      "entries_current_revision_fk",
      "teams_slug_format",
      "invites_used_together",
    ])
      expect(names, name).toContain(name);
  });

  it("refuse a revision whose hash is not a sha256 hex string", async () => {
    await client.query("begin");
    try {
      const team = await client.query(
        "insert into teams (name, slug) values ('T', 't-hash') returning id",
      );
      const entry = await client.query(
        "insert into entries (team_id, title) values ($1, 'E') returning id",
        [team.rows[0].id],
      );
      await expect(
        client.query(
          "insert into revisions (entry_id, number, record, record_hash) values ($1, 1, '{}', 'nothex')",
          [entry.rows[0].id],
        ),
      ).rejects.toThrow(/revisions_hash_format/);
    } finally {
      await client.query("rollback");
    }
  });

  it("refuse an entry pointing at a revision that does not exist, at commit time", async () => {
    await client.query("begin");
    const team = await client.query(
      "insert into teams (name, slug) values ('T', 't-fk') returning id",
    );
    await client.query(
      "insert into entries (team_id, title, current_revision) values ($1, 'E', 3)",
      [team.rows[0].id],
    );
    await expect(client.query("commit")).rejects.toThrow(/entries_current_revision_fk/);
  });

  it("refuse a failed analysis without a reason and a duplicate (revision, engine version)", async () => {
    await client.query("begin");
    try {
      const team = await client.query(
        "insert into teams (name, slug) values ('T', 't-an') returning id",
      );
      const entry = await client.query(
        "insert into entries (team_id, title) values ($1, 'E') returning id",
        [team.rows[0].id],
      );
      const rev = await client.query(
        "insert into revisions (entry_id, number, record, record_hash) values ($1, 1, '{}', $2) returning id",
        [entry.rows[0].id, "a".repeat(64)],
      );
      await client.query("savepoint s");
      await expect(
        client.query(
          "insert into analyses (revision_id, engine_version, state) values ($1, '1', 'failed')",
          [rev.rows[0].id],
        ),
      ).rejects.toThrow(/analyses_failed_has_error/);
      await client.query("rollback to savepoint s");
      await client.query("insert into analyses (revision_id, engine_version) values ($1, '1')", [
        rev.rows[0].id,
      ]);
      await expect(
        client.query("insert into analyses (revision_id, engine_version) values ($1, '1')", [
          rev.rows[0].id,
        ]),
      ).rejects.toThrow(/analyses_revision_engine_unique/);
    } finally {
      await client.query("rollback");
    }
  });
});
