// Finding 9: a NUL character in any text or query, a crafted list cursor, or 100k-deep JSON gave a
// 500. Each is now a 4xx naming the field, and nothing is written.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { count } from "drizzle-orm";
import { schema } from "@teardown/db";
import { depthExceededAt, MAX_JSON_DEPTH } from "@/lib/request-body";
import {
  call,
  signUp,
  openTestWebApp,
  type TestUser,
  type TestWebApp,
} from "../support/api-client.js";
import { nightLightDoc } from "../support/record-docs.js";

let app: TestWebApp;
let ida: TestUser;
let teamId: string;
beforeAll(async () => {
  app = await openTestWebApp();
  ida = await signUp("Ida Example", "ida@lab.test");
  teamId = (await call("POST", "/api/teams", { as: ida.as, json: { name: "Ida's lab" } })).body.team
    .id;
});
afterAll(async () => {
  await app?.close();
});

async function teams(): Promise<number> {
  const [r] = await app.db.db.select({ n: count() }).from(schema.teams);
  return r!.n;
}

const cursor = (v: unknown) => Buffer.from(JSON.stringify(v)).toString("base64url");
const ID = "5b0e7c52-8a3a-4d4e-9a57-0d5c1b0c3e11";

describe("NUL characters", () => {
  it("in a JSON field: 400 naming the field, nothing written", async () => {
    const before = await teams();
    const res = await call("POST", "/api/teams", { as: ida.as, json: { name: "Lab\u0000one" } });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: "nul-character", path: "name" });
    expect(await teams()).toBe(before);
  });

  it("deep inside a record: 400 naming its path", async () => {
    const doc = nightLightDoc(3);
    (doc.parts as Record<string, unknown>[])[0]!.note = "x\u0000y";
    const res = await call("POST", `/api/teams/${teamId}/entries`, {
      as: ida.as,
      json: { record: doc },
    });
    expect(res.status).toBe(400);
    expect(res.body.error.path).toBe("record.parts.0.note");
  });

  it("in an uploaded file: 400 naming the line", async () => {
    const form = new FormData();
    form.set("file", new File(["record: 1\ntitle: a\u0000b\nparts: []\n"], "nul.yaml"));
    const res = await call("POST", `/api/teams/${teamId}/entries`, { as: ida.as, form });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ path: "file", code: "nul-character" });
    expect(res.body.error.message).toContain("line 2");
  });

  it("in a form field or a query parameter: 400 naming it", async () => {
    const form = new FormData();
    form.set("file", new File([JSON.stringify(nightLightDoc(4))], "ok.json"));
    form.set("title", "bad\u0000title");
    const up = await call("POST", `/api/teams/${teamId}/entries`, { as: ida.as, form });
    expect(up.status).toBe(400);
    expect(up.body.error.path).toBe("title");
    const q = await call("GET", `/api/entries?q=${encodeURIComponent("lamp\u0000")}`, {
      as: ida.as,
    });
    expect(q.status).toBe(400);
    expect(q.body.error.path).toBe("q");
  });

  it("at the auth endpoints: 400 naming the field", async () => {
    const res = await call("POST", "/api/auth/sign-in/email", {
      json: { email: "ida@lab.test\u0000", password: "whatever it is" },
    });
    expect(res.status).toBe(400);
    expect(res.body.error.path).toBe("email");
  });
});

describe("crafted cursors", () => {
  it("answer 422 naming `cursor` for every malformed part", async () => {
    const crafted = [
      cursor({ v: "2026-02-31 10:00:00+00", id: ID }), // no such day
      cursor({ v: "not a time", id: ID }),
      cursor({ v: "2026-01-01 10:00:00+00", id: "------------------------------------" }),
      cursor({ v: "2026-01-01 10:00:00\u0000+00", id: ID }),
      cursor({ v: 5, id: ID }),
      cursor(null),
      "!!!not-base64!!!",
    ];
    for (const c of crafted) {
      const res = await call("GET", `/api/entries?cursor=${encodeURIComponent(c)}`, { as: ida.as });
      expect(res.status, c).toBe(422);
      expect(res.body.error.path).toBe("cursor");
    }
    const title = await call(
      "GET",
      `/api/entries?sort=title&cursor=${cursor({ v: "a\u0000b", id: ID })}`,
      { as: ida.as },
    );
    expect(title.status).toBe(422);
  });

  it("still accepts the cursors the API gives out", async () => {
    for (let i = 0; i < 3; i++)
      await call("POST", `/api/teams/${teamId}/entries`, {
        as: ida.as,
        json: { record: nightLightDoc(10 + i) },
      });
    const first = await call("GET", `/api/teams/${teamId}/entries?limit=1`, { as: ida.as });
    expect(first.body.nextCursor).toEqual(expect.any(String));
    const second = await call(
      "GET",
      `/api/teams/${teamId}/entries?limit=1&cursor=${first.body.nextCursor}`,
      { as: ida.as },
    );
    expect(second.status).toBe(200);
    expect(second.body.entries[0].id).not.toBe(first.body.entries[0].id);
  });
});

describe("deeply nested JSON", () => {
  it("100k levels: 400 `too-deep`, to the API and to the auth endpoints", async () => {
    const deep = "[".repeat(100_000) + "]".repeat(100_000);
    const api = await call("POST", "/api/teams", {
      as: ida.as,
      body: `{"name": ${deep}}`,
      headers: { "content-type": "application/json" },
    });
    expect(api.status).toBe(400);
    expect(api.body.error.code).toBe("too-deep");
    const auth = await call("POST", "/api/auth/sign-in/email", {
      body: `{"email": ${"[".repeat(5000)}}`,
      headers: { "content-type": "application/json" },
    });
    expect(auth.status).toBe(400);
  });

  it("100k levels in an uploaded JSON file: 400 naming the file, and the process survives", async () => {
    const form = new FormData();
    form.set("file", new File(["[".repeat(100_000) + "]".repeat(100_000)], "deep.json"));
    const res = await call("POST", `/api/teams/${teamId}/entries`, { as: ida.as, form });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: "too-deep", path: "file" });
  });

  it("counts depth outside strings only, and allows exactly the limit", () => {
    const at = (n: number) => "[".repeat(n) + "]".repeat(n);
    expect(depthExceededAt(at(MAX_JSON_DEPTH))).toBe(-1);
    expect(depthExceededAt(at(MAX_JSON_DEPTH + 1))).toBe(MAX_JSON_DEPTH);
    expect(depthExceededAt(JSON.stringify({ s: "[".repeat(1000) + '\\"[' }))).toBe(-1);
    // The same verdict as walking the parsed value (an independent count).
    const depthOf = (v: unknown): number =>
      v !== null && typeof v === "object"
        ? 1 + Math.max(0, ...Object.values(v as object).map(depthOf))
        : 0;
    for (const text of ['{"a":[1,{"b":[[]]}]}', "[[[]],[[[[]]]]]", '{"x":"]]]]"}'])
      expect(depthExceededAt(text, depthOf(JSON.parse(text)) - 1)).toBeGreaterThanOrEqual(0);
  });
});
