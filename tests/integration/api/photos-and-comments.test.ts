// Photos judged by their bytes (not name or declared type), size-limited, stored with their
// sha256 under the data dir and served with the entry's visibility rules; comments with
// @mentions resolved to team members.
import { createHash } from "node:crypto";
import { existsSync } from "node:fs";
import path from "node:path";
import { deflateSync } from "node:zlib";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { schema } from "@teardown/db";
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
let viewer: TestUser;
let outsider: TestUser;
let teamId: string;
let entryId: string;

function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  return Buffer.concat([len, Buffer.from(type, "ascii"), data, Buffer.alloc(4)]);
}

/** A real (tiny) PNG: `width` x `height` RGB pixels. */
function png(width: number, height: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr.set([8, 2, 0, 0, 0], 8);
  const rows = Buffer.alloc((width * 3 + 1) * height);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", ihdr),
    chunk("IDAT", deflateSync(rows)),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

/** A JPEG header: SOI, a JFIF APP0 segment, then a baseline frame header of the given size. */
function jpeg(width: number, height: number): Buffer {
  const app0 = Buffer.from([
    0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01,
    0x00, 0x00,
  ]);
  const sof = Buffer.from([
    0xff,
    0xc0,
    0x00,
    0x11,
    0x08,
    height >> 8,
    height & 0xff,
    width >> 8,
    width & 0xff,
    0x03,
    1,
    0x22,
    0,
    2,
    0x11,
    1,
    3,
    0x11,
    1,
  ]);
  return Buffer.concat([Buffer.from([0xff, 0xd8]), app0, sof, Buffer.from([0xff, 0xd9])]);
}

function photoForm(
  bytes: Buffer,
  filename: string,
  side = "component",
  declared = "image/jpeg",
): FormData {
  const form = new FormData();
  form.set("file", new File([new Uint8Array(bytes)], filename, { type: declared }));
  form.set("side", side);
  return form;
}

beforeAll(async () => {
  app = await openTestWebApp();
  owner = await signUp("Olga Owner", "olga@lab.test");
  viewer = await signUp("Vic Viewer", "vic@lab.test");
  outsider = await signUp("Otto Outsider", "otto@other.test");
  teamId = (await call("POST", "/api/teams", { as: owner.as, json: { name: "Photo team" } })).body
    .team.id;
  const inv = await call("POST", `/api/teams/${teamId}/invites`, {
    as: owner.as,
    json: { role: "viewer" },
  });
  await call("POST", `/api/invites/${inv.body.invite.token}`, { as: viewer.as });
  entryId = (
    await call("POST", `/api/teams/${teamId}/entries`, {
      as: owner.as,
      json: { record: nightLightDoc(1) },
    })
  ).body.entryId;
});
afterAll(async () => {
  await app?.close();
});

describe("photos", () => {
  it("stores a PNG named .jpg as image/png, with its pixel size and sha256, under the data dir", async () => {
    const bytes = png(3, 2);
    const res = await call("POST", `/api/entries/${entryId}/photos`, {
      as: owner.as,
      form: photoForm(bytes, "board.jpg", "track"),
    });
    expect(res.status, res.text).toBe(201);
    expect(res.body.photo).toMatchObject({
      side: "track",
      contentType: "image/png",
      width: 3,
      height: 2,
      sizeBytes: bytes.length,
      sha256: createHash("sha256").update(bytes).digest("hex"),
    });
    const [row] = await app.db.db
      .select()
      .from(schema.photos)
      .where(eq(schema.photos.id, res.body.photo.id));
    expect(existsSync(path.join(app.dataDir, "uploads", ...row!.storageKey.split("/")))).toBe(true);
    const served = await call("GET", res.body.photo.url, { as: viewer.as });
    expect(served.status).toBe(200);
    expect(served.headers.get("content-type")).toBe("image/png");
    expect(Buffer.from(served.bytes).equals(bytes)).toBe(true);
  });

  it("reads a JPEG's size from its frame header", async () => {
    const res = await call("POST", `/api/entries/${entryId}/photos`, {
      as: owner.as,
      form: photoForm(jpeg(4032, 3024), "IMG_1.png", "component", "image/png"),
    });
    expect(res.body.photo).toMatchObject({ contentType: "image/jpeg", width: 4032, height: 3024 });
    const list = await call("GET", `/api/entries/${entryId}/photos`, { as: viewer.as });
    expect(list.body.photos.map((p: { contentType: string }) => p.contentType)).toEqual([
      "image/png",
      "image/jpeg",
    ]);
  });

  it("refuses a text file named .png with 415 and a 16 MB photo with 413, storing nothing", async () => {
    const before = (await app.db.db.select().from(schema.photos)).length;
    const text = await call("POST", `/api/entries/${entryId}/photos`, {
      as: owner.as,
      form: photoForm(Buffer.from("not an image at all"), "board.png", "component", "image/png"),
    });
    expect(text.status).toBe(415);
    const big = Buffer.concat([png(1, 1), Buffer.alloc(16 * 1024 * 1024)]);
    const huge = await call("POST", `/api/entries/${entryId}/photos`, {
      as: owner.as,
      form: photoForm(big, "big.png"),
    });
    expect(huge.status).toBe(413);
    expect(huge.body.error.message).toContain("15 MB");
    const noSide = await call("POST", `/api/entries/${entryId}/photos`, {
      as: owner.as,
      form: photoForm(png(1, 1), "a.png", "underside"),
    });
    expect(noSide.status).toBe(422);
    expect((await app.db.db.select().from(schema.photos)).length).toBe(before);
  });

  it("lets a viewer see but not upload or delete, and hides photos from other teams and anonymous readers", async () => {
    expect(
      (
        await call("POST", `/api/entries/${entryId}/photos`, {
          as: viewer.as,
          form: photoForm(png(1, 1), "a.png"),
        })
      ).status,
    ).toBe(403);
    const list = await call("GET", `/api/entries/${entryId}/photos`, { as: viewer.as });
    const url: string = list.body.photos[0].url;
    expect((await call("DELETE", url, { as: viewer.as })).status).toBe(403);
    expect((await call("GET", url, { as: outsider.as })).status).toBe(404);
    expect((await call("GET", url)).status).toBe(404);
    await call("PATCH", `/api/entries/${entryId}`, {
      as: owner.as,
      json: { visibility: "public" },
    });
    expect((await call("GET", url)).status).toBe(200);
    await call("PATCH", `/api/entries/${entryId}`, { as: owner.as, json: { visibility: "team" } });
  });

  it("deletes a photo and its file", async () => {
    const made = await call("POST", `/api/entries/${entryId}/photos`, {
      as: owner.as,
      form: photoForm(png(2, 2), "gone.png"),
    });
    const [row] = await app.db.db
      .select()
      .from(schema.photos)
      .where(eq(schema.photos.id, made.body.photo.id));
    expect((await call("DELETE", made.body.photo.url, { as: owner.as })).status).toBe(200);
    expect(existsSync(path.join(app.dataDir, "uploads", ...row!.storageKey.split("/")))).toBe(
      false,
    );
    expect((await call("GET", made.body.photo.url, { as: owner.as })).status).toBe(404);
  });
});

describe("comments", () => {
  it("resolves @mentions of team members to user ids and leaves unknown ones as text", async () => {
    const res = await call("POST", `/api/entries/${entryId}/comments`, {
      as: owner.as,
      json: {
        body: "@vic please re-measure; @OlgaOwner noted; @otto is not on the team; @nobody either",
      },
    });
    expect(res.status).toBe(201);
    expect(res.body.comment.mentions).toEqual([viewer.id, owner.id]);
    expect(res.body.comment.body).toContain("@nobody");
  });

  it("comments on one part, and refuses a ref the current revision lacks (422)", async () => {
    const onPart = await call("POST", `/api/entries/${entryId}/comments`, {
      as: viewer.as,
      json: { body: "C1 looks swollen", partRef: "C1" },
    });
    expect(onPart.status).toBe(201);
    const missing = await call("POST", `/api/entries/${entryId}/comments`, {
      as: viewer.as,
      json: { body: "where is it?", partRef: "Q9" },
    });
    expect(missing.status).toBe(422);
    const part = await call("GET", `/api/entries/${entryId}/comments?part=C1`, { as: owner.as });
    expect(
      part.body.comments.map((c: { body: string; authorName: string }) => [c.body, c.authorName]),
    ).toEqual([["C1 looks swollen", "Vic Viewer"]]);
    const all = await call("GET", `/api/entries/${entryId}/comments`, { as: owner.as });
    expect(all.body.comments).toHaveLength(2);
  });

  it("keeps comments from outsiders (404) and anonymous callers (401)", async () => {
    expect(
      (await call("GET", `/api/entries/${entryId}/comments`, { as: outsider.as })).status,
    ).toBe(404);
    expect(
      (
        await call("POST", `/api/entries/${entryId}/comments`, {
          as: outsider.as,
          json: { body: "hi" },
        })
      ).status,
    ).toBe(404);
    expect(
      (await call("POST", `/api/entries/${entryId}/comments`, { json: { body: "hi" } })).status,
    ).toBe(401);
  });
});
