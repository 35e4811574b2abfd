// The audit log: every write (who, what, when, which entry or team) is recorded in the write's own
// transaction, and a team's owners can read their team's rows through the API (others cannot).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { count, eq } from "drizzle-orm";
import { schema } from "@teardown/db";
import {
  call,
  signUp,
  openTestWebApp,
  type TestUser,
  type TestWebApp,
} from "../support/api-client.js";
import { nightLightDoc } from "../support/record-docs.js";

let app: TestWebApp;
let owner: TestUser;
let editor: TestUser;
let outsider: TestUser;
let teamId: string;
let entryId: string;

beforeAll(async () => {
  app = await openTestWebApp();
  owner = await signUp("Oda Owner", "oda@lab.test");
  editor = await signUp("Eli Editor", "eli@lab.test");
  outsider = await signUp("Ott Outsider", "ott@lab.test");
  teamId = (await call("POST", "/api/teams", { as: owner.as, json: { name: "Audited lab" } })).body
    .team.id;
  const invite = await call("POST", `/api/teams/${teamId}/invites`, {
    as: owner.as,
    json: { role: "editor" },
  });
  await call("POST", `/api/invites/${invite.body.invite.token}`, { as: editor.as });
  const made = await call("POST", `/api/teams/${teamId}/entries`, {
    as: editor.as,
    json: { record: nightLightDoc(1) },
  });
  entryId = made.body.entryId;
  await call("POST", `/api/entries/${entryId}/revisions`, {
    as: editor.as,
    json: { record: nightLightDoc(2), baseRevision: 1, message: "second" },
  });
  await call("POST", `/api/entries/${entryId}/comments`, {
    as: owner.as,
    json: { body: "checked" },
  });
  await call("PATCH", `/api/entries/${entryId}`, { as: owner.as, json: { visibility: "public" } });
});
afterAll(async () => {
  await app?.close();
});

describe("the team audit log", () => {
  it("lists every write to the team, newest first, with who did it", async () => {
    const res = await call("GET", `/api/teams/${teamId}/audit`, { as: owner.as });
    expect(res.status).toBe(200);
    const events = res.body.events as {
      action: string;
      actorName: string;
      targetId: string;
      at: string;
    }[];
    expect(events.map((e) => [e.action, e.actorName])).toEqual([
      ["entry.update", "Oda Owner"],
      ["comment.add", "Oda Owner"],
      ["entry.revise", "Eli Editor"],
      ["entry.create", "Eli Editor"],
      ["invite.accept", "Eli Editor"],
      ["invite.create", "Oda Owner"],
      ["team.create", "Oda Owner"],
    ]);
    const times = events.map((e) => Date.parse(e.at));
    expect([...times].sort((a, b) => b - a)).toEqual(times);
    expect(
      events.filter((e) => e.action.startsWith("entry.")).every((e) => e.targetId === entryId),
    ).toBe(true);
  });

  it("pages with `before`", async () => {
    const first = await call("GET", `/api/teams/${teamId}/audit?limit=3`, { as: owner.as });
    expect(first.body.events).toHaveLength(3);
    const rest = await call(
      "GET",
      `/api/teams/${teamId}/audit?limit=50&before=${first.body.nextBefore}`,
      {
        as: owner.as,
      },
    );
    expect(rest.body.events).toHaveLength(4);
    expect(rest.body.nextBefore).toBeNull();
  });

  it("is for owners only: 403 to an editor, 404 to an outsider, 401 anonymously", async () => {
    expect((await call("GET", `/api/teams/${teamId}/audit`, { as: editor.as })).status).toBe(403);
    expect((await call("GET", `/api/teams/${teamId}/audit`, { as: outsider.as })).status).toBe(404);
    expect((await call("GET", `/api/teams/${teamId}/audit`)).status).toBe(401);
  });

  it("records nothing for a write that failed (the row shares the write's transaction)", async () => {
    const [before] = await app.db.db
      .select({ n: count() })
      .from(schema.auditLog)
      .where(eq(schema.auditLog.teamId, teamId));
    const stale = await call("POST", `/api/entries/${entryId}/revisions`, {
      as: editor.as,
      json: { record: nightLightDoc(3), baseRevision: 1 },
    });
    expect(stale.status).toBe(409);
    const refused = await call("POST", `/api/teams/${teamId}/invites`, {
      as: editor.as,
      json: { role: "owner" },
    });
    expect(refused.status).toBe(403);
    const [after] = await app.db.db
      .select({ n: count() })
      .from(schema.auditLog)
      .where(eq(schema.auditLog.teamId, teamId));
    expect(after!.n).toBe(before!.n);
  });
});
