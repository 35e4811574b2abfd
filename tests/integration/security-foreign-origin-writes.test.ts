// Finding 3: cookie-authenticated writes on the app's own routes checked no Origin, so a page on
// another origin (or curl with a borrowed cookie) could create entries, tokens, comments and
// invites as the victim. Now every cookie-authenticated write must carry one of the app's origins.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { count, eq } from "drizzle-orm";
import { schema } from "@teardown/db";
import {
  call,
  signUp,
  openTestWebApp,
  TEST_ORIGIN,
  type TestWebApp,
  type TestUser,
} from "../support/api-client.js";
import { nightLightDoc } from "../support/record-docs.js";

let app: TestWebApp;
let victim: TestUser;
let teamId: string;
let entryId: string;

beforeAll(async () => {
  app = await openTestWebApp();
  victim = await signUp("Val Example", "val@lab.test");
  teamId = (await call("POST", "/api/teams", { as: victim.as, json: { name: "Val's lab" } })).body
    .team.id;
  const made = await call("POST", `/api/teams/${teamId}/entries`, {
    as: victim.as,
    json: { record: nightLightDoc(1) },
  });
  entryId = made.body.entryId ?? made.body.entry?.id;
});
afterAll(async () => {
  await app?.close();
});

async function rows(
  table:
    | typeof schema.entries
    | typeof schema.apiTokens
    | typeof schema.comments
    | typeof schema.invites,
) {
  const [r] = await app.db.db.select({ n: count() }).from(table);
  return r!.n;
}

/** The writes the attack made, each as the victim's browser would send it from elsewhere. */
function attacks(): [string, string, { json?: unknown; form?: FormData }][] {
  const form = new FormData();
  form.set("file", new File([JSON.stringify(nightLightDoc(2))], "planted.json"));
  form.set("visibility", "public");
  return [
    ["POST", `/api/teams/${teamId}/entries`, { form }],
    ["POST", "/api/tokens", { json: { name: "planted" } }],
    ["POST", `/api/entries/${entryId}/comments`, { json: { body: "planted" } }],
    ["POST", `/api/teams/${teamId}/invites`, { json: { role: "owner" } }],
    ["PATCH", `/api/entries/${entryId}`, { json: { visibility: "public" } }],
  ];
}

describe("cookie-authenticated writes", () => {
  it("are refused with 403 from a foreign origin, a same-site sibling port or an opaque origin, and write nothing", async () => {
    expect(entryId).toMatch(/^[0-9a-f-]{36}$/);
    const before = await Promise.all([
      rows(schema.entries),
      rows(schema.apiTokens),
      rows(schema.comments),
      rows(schema.invites),
    ]);
    for (const origin of ["http://evil.example", "http://localhost:3001", "null"]) {
      for (const [method, path, opts] of attacks()) {
        const res = await call(method, path, { as: victim.as, ...opts, headers: { origin } });
        expect(res.status, `${method} ${path} from ${origin}`).toBe(403);
        expect(res.body.error.code).toBe("foreign-origin");
      }
    }
    const after = await Promise.all([
      rows(schema.entries),
      rows(schema.apiTokens),
      rows(schema.comments),
      rows(schema.invites),
    ]);
    expect(after).toEqual(before);
    const [entry] = await app.db.db
      .select()
      .from(schema.entries)
      .where(eq(schema.entries.id, entryId));
    expect(entry!.visibility).toBe("team");
  });

  it("are refused without any Origin header (a borrowed cookie outside a browser)", async () => {
    const { checkWriteOrigin } = await import("@/lib/request-guard");
    const req = new Request(`${TEST_ORIGIN}/api/tokens`, { method: "POST" });
    expect(() => checkWriteOrigin(req)).toThrow(/no Origin header/);
    const get = new Request(`${TEST_ORIGIN}/api/tokens`, { method: "GET" });
    expect(() => checkWriteOrigin(get)).not.toThrow();
  });

  it("still work from the app's own origin", async () => {
    const res = await call("POST", `/api/entries/${entryId}/comments`, {
      as: victim.as,
      json: { body: "from our own page" },
    });
    expect(res.status).toBe(201);
  });

  it("with a bearer token need no Origin (browsers never attach tokens by themselves)", async () => {
    const token = (await call("POST", "/api/tokens", { as: victim.as, json: { name: "ci" } })).body
      .token.token;
    const res = await call("POST", `/api/entries/${entryId}/comments`, {
      as: { token },
      json: { body: "from a script" },
      headers: { origin: "http://evil.example" },
    });
    expect(res.status).toBe(201);
  });
});
