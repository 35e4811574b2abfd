// Teams: the creator is owner; one-time invite links that expire (410 when used or expired);
// owner-only role changes and removals; leaving; never a team without an owner.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import { schema } from "@teardown/db";
import {
  call,
  signUp,
  openTestWebApp,
  type TestUser,
  type TestWebApp,
} from "../../support/api-client.js";

let app: TestWebApp;
let owner: TestUser;
let joiner: TestUser;
let outsider: TestUser;
let teamId: string;

beforeAll(async () => {
  app = await openTestWebApp();
  owner = await signUp("Olga Owner", "olga@lab.test");
  joiner = await signUp("Jon Joiner", "jon@lab.test");
  outsider = await signUp("Otto Outsider", "otto@elsewhere.test");
  const made = await call("POST", "/api/teams", { as: owner.as, json: { name: "Mains Lab" } });
  teamId = made.body.team.id;
});
afterAll(async () => {
  await app?.close();
});

async function invite(role: string, as = owner.as) {
  return call("POST", `/api/teams/${teamId}/invites`, { as, json: { role } });
}

describe("teams", () => {
  it("makes the creator the owner and lists the team for them only", async () => {
    const mine = await call("GET", "/api/teams", { as: owner.as });
    expect(mine.body.teams).toEqual([
      expect.objectContaining({ id: teamId, name: "Mains Lab", slug: "mains-lab", role: "owner" }),
    ]);
    expect((await call("GET", "/api/teams", { as: outsider.as })).body.teams).toEqual([]);
  });

  it("answers 409 when the slug is taken and 422 when the name is empty", async () => {
    const again = await call("POST", "/api/teams", {
      as: outsider.as,
      json: { name: "Mains lab" },
    });
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ code: "slug-taken", path: "slug" });
    const empty = await call("POST", "/api/teams", { as: outsider.as, json: { name: "" } });
    expect(empty.status).toBe(422);
    expect(empty.body.error.errors[0].path).toBe("name");
  });

  it("hides a team from non-members with 404, and malformed ids are 404 too", async () => {
    expect((await call("GET", `/api/teams/${teamId}`, { as: outsider.as })).status).toBe(404);
    expect((await call("GET", "/api/teams/123", { as: owner.as })).status).toBe(404);
    expect((await invite("viewer", outsider.as)).status).toBe(404);
  });
});

describe("invitations", () => {
  it("joins with the link's role, and the same link a second time is 410", async () => {
    const made = await invite("editor");
    expect(made.status).toBe(201);
    const token: string = made.body.invite.token;
    expect(made.body.invite.url).toBe(`http://localhost:3000/invite/${token}`);
    const info = await call("GET", `/api/invites/${token}`);
    expect(info.body.invite).toMatchObject({ teamName: "Mains Lab", role: "editor" });
    const accepted = await call("POST", `/api/invites/${token}`, { as: joiner.as });
    expect(accepted.status).toBe(200);
    expect(accepted.body.membership).toEqual({ teamId, role: "editor" });
    const twice = await call("POST", `/api/invites/${token}`, { as: outsider.as });
    expect(twice.status).toBe(410);
    expect(twice.body.error.code).toBe("invite-used");
    expect((await call("GET", `/api/teams/${teamId}`, { as: outsider.as })).status).toBe(404);
  });

  it("refuses an expired link with 410 and does not add the member", async () => {
    const made = await invite("viewer");
    await app.db.db
      .update(schema.invites)
      .set({ expiresAt: sql`now() - interval '1 minute'` })
      .where(eq(schema.invites.id, made.body.invite.id));
    const late = await call("POST", `/api/invites/${made.body.invite.token}`, { as: outsider.as });
    expect(late.status).toBe(410);
    expect(late.body.error.code).toBe("invite-expired");
    expect((await call("GET", `/api/invites/${made.body.invite.token}`)).status).toBe(410);
    const members = await app.db.db
      .select()
      .from(schema.memberships)
      .where(eq(schema.memberships.userId, outsider.id));
    expect(members).toEqual([]);
  });

  it("stores only the token's hash, answers 404 for an unknown link and 401 when not signed in", async () => {
    const made = await invite("viewer");
    const [row] = await app.db.db
      .select()
      .from(schema.invites)
      .where(eq(schema.invites.id, made.body.invite.id));
    expect(row!.tokenHash).not.toBe(made.body.invite.token);
    expect((await call("POST", "/api/invites/no-such-token", { as: outsider.as })).status).toBe(
      404,
    );
    expect((await call("POST", `/api/invites/${made.body.invite.token}`)).status).toBe(401);
  });

  it("lets only the owner invite (an editor gets 403)", async () => {
    const res = await invite("viewer", joiner.as);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("forbidden");
  });
});

describe("members and roles", () => {
  it("lets the owner change a role, and refuses an editor with 403", async () => {
    const byEditor = await call("PATCH", `/api/teams/${teamId}/members/${owner.id}`, {
      as: joiner.as,
      json: { role: "viewer" },
    });
    expect(byEditor.status).toBe(403);
    const byOwner = await call("PATCH", `/api/teams/${teamId}/members/${joiner.id}`, {
      as: owner.as,
      json: { role: "viewer" },
    });
    expect(byOwner.status).toBe(200);
    expect(byOwner.body.member).toMatchObject({ userId: joiner.id, role: "viewer" });
    const team = await call("GET", `/api/teams/${teamId}`, { as: joiner.as });
    expect(team.body.team.role).toBe("viewer");
    expect(team.body.team.members.map((m: { email: string }) => m.email).sort()).toEqual([
      "jon@lab.test",
      "olga@lab.test",
    ]);
  });

  it("never leaves a team without an owner (409), and writes nothing when refusing", async () => {
    const before = await app.db.db.select().from(schema.auditLog);
    const demote = await call("PATCH", `/api/teams/${teamId}/members/${owner.id}`, {
      as: owner.as,
      json: { role: "editor" },
    });
    expect(demote.status).toBe(409);
    const leave = await call("DELETE", `/api/teams/${teamId}/members/me`, { as: owner.as });
    expect(leave.status).toBe(409);
    expect(leave.body.error.code).toBe("last-owner");
    expect(await app.db.db.select().from(schema.auditLog)).toHaveLength(before.length);
  });

  it("lets a member leave, and the owner remove a member", async () => {
    const made = await invite("viewer");
    await call("POST", `/api/invites/${made.body.invite.token}`, { as: outsider.as });
    expect(
      (await call("DELETE", `/api/teams/${teamId}/members/${owner.id}`, { as: outsider.as }))
        .status,
    ).toBe(403);
    expect(
      (await call("DELETE", `/api/teams/${teamId}/members/me`, { as: outsider.as })).status,
    ).toBe(200);
    expect((await call("GET", `/api/teams/${teamId}`, { as: outsider.as })).status).toBe(404);
    expect(
      (await call("DELETE", `/api/teams/${teamId}/members/${joiner.id}`, { as: owner.as })).status,
    ).toBe(200);
    const actions = await app.db.db
      .select({ action: schema.auditLog.action })
      .from(schema.auditLog)
      .where(eq(schema.auditLog.teamId, teamId));
    expect(actions.map((a) => a.action)).toEqual(
      expect.arrayContaining([
        "team.create",
        "invite.create",
        "invite.accept",
        "member.role",
        "member.leave",
        "member.remove",
      ]),
    );
  });
});
