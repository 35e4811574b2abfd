// Moving a team: export a whole team from one instance as one archive, import it into another
// instance's empty team, and compare every row and every photo file on both sides. Hostile or
// damaged archives (path traversal names, oversized lines, wrong hashes) are refused with the
// line named, and nothing at all is written.
import { createHash } from "node:crypto";
import { readFile, readdir } from "node:fs/promises";
import path from "node:path";
import { deflateSync } from "node:zlib";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import { schema } from "@teardown/db";
import { ENGINE_VERSION, analyzeStoredRecord } from "@teardown/engine";
import { loadRevision, storeDone } from "../../analysis-worker/src/analysis-store.js";
import {
  call,
  closeWebApp,
  openTestWebApp,
  signUp,
  type TestUser,
  type TestWebApp,
} from "../support/api-client.js";
import { ladderDoc, nightLightDoc } from "../support/record-docs.js";
import { resetAuth } from "@/lib/auth";

function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  return Buffer.concat([len, Buffer.from(type, "ascii"), data, Buffer.alloc(4)]);
}
/** A real (tiny) PNG of `width` x `height` grey pixels. */
function png(width: number, height: number, grey: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr.set([8, 2, 0, 0, 0], 8);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", ihdr),
    chunk("IDAT", deflateSync(Buffer.alloc((width * 3 + 1) * height, grey))),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

let source: TestWebApp;
let target: TestWebApp;
let archive: string;
let owner: TestUser;
let sourceTeam: string;

/** Every row of a team, ids kept, people by email, so two instances can be compared. */
async function teamRows(app: TestWebApp, teamId: string) {
  const q = async (text: string) => (await app.db.pool.query(text, [teamId])).rows;
  const entryIds = `select id from entries where team_id = $1`;
  return {
    members: await q(
      `select u.email, u.name, m.role, m.created_at from memberships m join users u on u.id = m.user_id
        where m.team_id = $1 and u.email <> 'importer@second.test' order by u.email`,
    ),
    entries: await q(
      `select e.id, e.title, e.category, e.visibility, e.current_revision, u.email as author, e.created_at,
              e.updated_at, e.archived_at, e.search_text, e.search_blocks, e.search_flags, e.fingerprint, e.facets
         from entries e left join users u on u.id = e.created_by where e.team_id = $1 order by e.id`,
    ),
    revisions: await q(
      `select r.id, r.entry_id, r.number, r.record, r.record_hash, u.email as author, r.message, r.created_at
         from revisions r left join users u on u.id = r.author_id where r.entry_id in (${entryIds}) order by r.id`,
    ),
    analyses: await q(
      `select a.* from analyses a join revisions r on r.id = a.revision_id
        where r.entry_id in (${entryIds}) order by a.id`,
    ),
    comments: await q(
      `select c.id, c.entry_id, c.part_ref, u.email as author, c.body, c.mentions, c.created_at
         from comments c left join users u on u.id = c.author_id where c.entry_id in (${entryIds}) order by c.id`,
    ),
    photos: await q(
      `select p.id, p.entry_id, p.side, p.storage_key, p.content_type, p.size_bytes, p.sha256, p.caption,
              u.email as uploader, p.created_at
         from photos p left join users u on u.id = p.uploaded_by where p.entry_id in (${entryIds}) order by p.id`,
    ),
  };
}

/** Every file under a data dir's uploads, by relative name, with its SHA-256. */
async function uploadedFiles(dataDir: string): Promise<Record<string, string>> {
  const root = path.join(dataDir, "uploads");
  const out: Record<string, string> = {};
  const walk = async (dir: string): Promise<void> => {
    for (const d of await readdir(dir, { withFileTypes: true }).catch(() => [])) {
      const p = path.join(dir, d.name);
      if (d.isDirectory()) await walk(p);
      else
        out[path.relative(root, p)] = createHash("sha256")
          .update(await readFile(p))
          .digest("hex");
    }
  };
  await walk(root);
  return out;
}

/** Lines of an archive with the closing line recomputed, as a careful forger would. */
function reseal(lines: string[]): string {
  const body = lines.map((l) => `${l}\n`).join("");
  const sha256 = createHash("sha256").update(body).digest("hex");
  return `${body}${JSON.stringify({ kind: "end", lines: lines.length, sha256 })}\n`;
}
const rowsOf = (text: string) => text.trimEnd().split("\n").slice(0, -1);

beforeAll(async () => {
  source = await openTestWebApp();
  owner = await signUp("Maren Holt", "maren@fernhollow.test");
  const editor = await signUp("Tobin Reyes", "tobin@fernhollow.test");
  sourceTeam = (
    await call("POST", "/api/teams", { as: owner.as, json: { name: "Fernhollow bench" } })
  ).body.team.id;
  const invite = await call("POST", `/api/teams/${sourceTeam}/invites`, {
    as: owner.as,
    json: { role: "editor" },
  });
  await call("POST", `/api/invites/${invite.body.invite.token}`, { as: editor.as });
  for (const [i, doc] of [nightLightDoc(1), ladderDoc(4)].entries()) {
    const made = await call("POST", `/api/teams/${sourceTeam}/entries`, {
      as: owner.as,
      json: { record: doc, message: `first trace ${i}` },
    });
    expect(made.status).toBe(201);
    const entryId = made.body.entryId as string;
    const second = await call("POST", `/api/entries/${entryId}/revisions`, {
      as: editor.as,
      json: {
        record: { ...doc, title: `${String(doc.title)} (retraced)` },
        message: "retraced",
        baseRevision: 1,
      },
    });
    expect(second.status).toBe(201);
    // Analyse every revision, as the worker would.
    const revs = await source.db.db
      .select()
      .from(schema.revisions)
      .where(eq(schema.revisions.entryId, entryId));
    for (const r of revs) {
      const loaded = await loadRevision(source.db.db, r.id);
      const outcome = await analyzeStoredRecord(loaded!.record);
      if (outcome.ok) await storeDone(source.db.db, loaded!, ENGINE_VERSION, outcome.output);
    }
    const form = new FormData();
    form.set(
      "file",
      new File([new Uint8Array(png(3 + i, 2, 40 * i))], "board.png", { type: "image/png" }),
    );
    form.set("side", "component");
    form.set("caption", `board ${i}`);
    expect(
      (await call("POST", `/api/entries/${entryId}/photos`, { as: owner.as, form })).status,
    ).toBe(201);
    expect(
      (
        await call("POST", `/api/entries/${entryId}/comments`, {
          as: editor.as,
          json: { body: `checked ${i}` },
        })
      ).status,
    ).toBe(201);
  }
  const exported = await call("GET", `/api/teams/${sourceTeam}/export`, { as: owner.as });
  expect(exported.status).toBe(200);
  archive = exported.text;
  // Leave the first instance's database in place for the comparison; point the web code elsewhere.
  await closeWebApp();
  resetAuth(); // better-auth holds the first instance's database handle
  (globalThis as { teardownUploads?: unknown }).teardownUploads = undefined; // and the upload store its folder
  target = await openTestWebApp();
}, 180_000);

afterAll(async () => {
  await target?.close();
  await source?.db.drop();
});

async function emptyTeam(name: string): Promise<{ importer: TestUser; teamId: string }> {
  const email = name === "Moved" ? "importer@second.test" : `${name.toLowerCase()}@second.test`;
  const importer = await signUp(`Importer ${name}`, email);
  const teamId = (await call("POST", "/api/teams", { as: importer.as, json: { name } })).body.team
    .id;
  return { importer, teamId };
}

async function importInto(teamId: string, as: TestUser, text: string) {
  return call("POST", `/api/teams/${teamId}/import`, {
    as: as.as,
    body: text,
    headers: { "content-type": "application/x-teardown-team-archive" },
  });
}

describe("refusing a hostile or damaged archive", () => {
  async function refusedWithNothingWritten(text: string, status: number, message: RegExp) {
    const { importer, teamId } = await emptyTeam(
      `Hostile${Math.random().toString(36).slice(2, 8)}`,
    );
    const usersBefore = (await target.db.pool.query("select count(*)::int as n from users")).rows[0]
      .n;
    const res = await importInto(teamId, importer, text);
    expect(res.status).toBe(status);
    expect(res.body.error.message).toMatch(message);
    for (const table of ["entries", "revisions", "analyses", "comments", "photos"])
      expect(
        (await target.db.pool.query(`select count(*)::int as n from ${table}`)).rows[0].n,
      ).toBe(0);
    expect((await target.db.pool.query("select count(*)::int as n from users")).rows[0].n).toBe(
      usersBefore,
    );
    expect(await uploadedFiles(target.dataDir)).toEqual({});
  }

  it("refuses a photo name that climbs out of its folder", async () => {
    const lines = rowsOf(archive).map((l) =>
      l.startsWith('{"kind":"photo"')
        ? l.replace(/"storageKey":"photos\//, '"storageKey":"photos/../../../')
        : l,
    );
    await refusedWithNothingWritten(reseal(lines), 422, /storage name outside its entry's folder/);
  });

  it("refuses a photo whose bytes do not match their hash", async () => {
    const lines = rowsOf(archive).map((l) =>
      l.startsWith('{"kind":"file"')
        ? l.replace(/"base64":"(.)/, (_m, c) => `"base64":"${c === "A" ? "B" : "A"}`)
        : l,
    );
    await refusedWithNothingWritten(reseal(lines), 422, /do not match their SHA-256/);
  });

  it("refuses an archive edited after export (closing hash)", async () => {
    const edited = archive.replace("first trace 0", "first trace X");
    await refusedWithNothingWritten(edited, 422, /hash does not match/);
  });

  it("refuses an oversized line and an oversized archive", async () => {
    const lines = rowsOf(archive);
    lines.splice(
      1,
      0,
      JSON.stringify({
        kind: "person",
        id: "x",
        name: "n".repeat(40 * 1024 * 1024),
        email: "a@b.test",
      }),
    );
    await refusedWithNothingWritten(reseal(lines), 422, /longer than/);
    process.env.TEAM_ARCHIVE_MAX_BYTES = String(archive.length - 1);
    try {
      await refusedWithNothingWritten(archive, 413, /team archive/);
    } finally {
      delete process.env.TEAM_ARCHIVE_MAX_BYTES;
    }
  });

  it("refuses a photo row claiming more than the photo limit", async () => {
    const lines = rowsOf(archive).map((l) =>
      l.startsWith('{"kind":"photo"') ? l.replace(/"sizeBytes":\d+/, '"sizeBytes":999999999') : l,
    );
    await refusedWithNothingWritten(reseal(lines), 422, /sizeBytes/);
  });
});

describe("moving a team to another instance", () => {
  it("imports into an empty team, and every row and file is the same as at the source", async () => {
    const { importer, teamId } = await emptyTeam("Moved");
    const res = await importInto(teamId, importer, archive);
    expect(res.status).toBe(201);
    expect(res.body.imported).toMatchObject({
      entries: 2,
      revisions: 4,
      comments: 2,
      photos: 2,
      members: 2,
    });

    const before = await teamRows(source, sourceTeam);
    const after = await teamRows(target, teamId);
    expect(before.entries).toHaveLength(2);
    expect(before.analyses.length).toBeGreaterThanOrEqual(4);
    expect(after).toEqual(before);
    expect(await uploadedFiles(target.dataDir)).toEqual(await uploadedFiles(source.dataDir));

    // Exported again from here, the rows read the same (header and people aside).
    const again = await call("GET", `/api/teams/${teamId}/export`, { as: importer.as });
    const rowLines = (t: string) =>
      t
        .split("\n")
        .filter((l) => /^\{"kind":"(entry|revision|analysis|comment|photo|file)"/.test(l));
    expect(rowLines(again.text)).toEqual(rowLines(archive));
  });

  it("refuses a second import into a team that now has entries, writing nothing", async () => {
    const [moved] = (await target.db.pool.query(`select t.id from teams t where t.name = 'Moved'`))
      .rows as { id: string }[];
    const importer = await call("POST", "/api/auth/sign-in/email", {
      json: { email: "importer@second.test", password: "correct horse battery" },
    });
    const cookie = importer.headers
      .getSetCookie()
      .map((c) => c.split(";")[0]!)
      .join("; ");
    const res = await call("POST", `/api/teams/${moved!.id}/import`, {
      as: { cookie },
      body: archive,
      headers: { "content-type": "application/x-teardown-team-archive" },
    });
    expect(res.status).toBe(409);
    const n = (await target.db.pool.query("select count(*)::int as n from entries")).rows[0].n;
    expect(n).toBe(2);
    void sql;
  });
});
