// A newcomer's way into the demo, through the app's own route handlers: the printed member
// signs in with the printed password and sees every demo entry, team-only ones included; an
// anonymous visitor sees only the public ones; each entry serves its drawn board sketch.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import path from "node:path";
import type { PgBoss } from "pg-boss";
import { createQueue, startQueue } from "@teardown/db";
import { DEMO_ENTRIES, DEMO_MEMBERS, loadDemoData, type SeedOutcome } from "@teardown/seed-demo";
import { call, openTestWebApp, signIn, type TestWebApp } from "../../support/api-client.js";

let app: TestWebApp;
let boss: PgBoss;
let seeded: SeedOutcome;

beforeAll(async () => {
  app = await openTestWebApp();
  boss = createQueue(app.db.url, { supervise: false });
  await startQueue(boss);
  // The web app serves uploads from `<data dir>/uploads`; the seed writes its sketches there.
  seeded = await loadDemoData(app.db.db, boss, { uploadsDir: path.join(app.dataDir, "uploads") });
});
afterAll(async () => {
  await boss?.stop({ close: true });
  await app?.close();
});

type Listed = { entries: Array<{ id: string; title: string; visibility: string }> };

describe("signing in to the demo", () => {
  it("lets the printed member in and shows every demo entry", async () => {
    expect(seeded.signIn.email).toBe(DEMO_MEMBERS[0]!.email);
    const session = await signIn(seeded.signIn.email, seeded.signIn.password);
    expect(session.status).toBe(200);
    const listed = await call("GET", "/api/entries?limit=100", { as: session.as });
    expect(listed.status).toBe(200);
    const entries = (listed.body as Listed).entries;
    expect(entries).toHaveLength(DEMO_ENTRIES.length);
    expect(entries.filter((e) => e.visibility === "team").length).toBeGreaterThan(
      entries.length / 2,
    );
  });

  it("refuses a wrong password for the same member", async () => {
    const session = await signIn(seeded.signIn.email, "not the demo password");
    expect(session.status).toBe(401);
  });

  it("shows an anonymous visitor only the public demo entries", async () => {
    const listed = await call("GET", "/api/entries?limit=100");
    expect(listed.status).toBe(200);
    const entries = (listed.body as Listed).entries;
    expect(entries.length).toBe(DEMO_ENTRIES.filter((e) => e.visibility === "public").length);
    expect(entries.every((e) => e.visibility === "public")).toBe(true);
  });

  it("serves each entry's sketch as a PNG, with comments by several members", async () => {
    const session = await signIn(seeded.signIn.email, seeded.signIn.password);
    const entries = (
      (await call("GET", "/api/entries?limit=100", { as: session.as })).body as Listed
    ).entries;
    const authors = new Set<string>();
    for (const e of entries) {
      const photos = await call("GET", `/api/entries/${e.id}/photos`, { as: session.as });
      expect(photos.status).toBe(200);
      const list = (photos.body as { photos: Array<{ url: string; width: number }> }).photos;
      expect(list).toHaveLength(1);
      expect(list[0]!.width).toBe(640);
      const img = await call("GET", list[0]!.url, { as: session.as });
      expect(img.status).toBe(200);
      expect(img.headers.get("content-type")).toBe("image/png");
      const comments = await call("GET", `/api/entries/${e.id}/comments`, { as: session.as });
      expect(comments.status).toBe(200);
      const body = comments.body as {
        comments: Array<{ authorId?: string; author?: { id: string } }>;
      };
      expect(body.comments.length).toBeGreaterThanOrEqual(2);
      for (const c of body.comments) authors.add(c.authorId ?? c.author?.id ?? "");
    }
    expect(authors.size).toBeGreaterThanOrEqual(3);
  });
});
