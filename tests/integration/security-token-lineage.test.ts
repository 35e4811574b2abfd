// Finding 8: a token could mint tokens that outlived its revoked parent, and tokens survived
// "sign out everywhere". Now a child never expires after its parent, revoking a parent revokes
// its whole subtree, and signing out everywhere (or changing the password with sign-out of the
// other sessions) revokes every token of the user.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { schema } from "@teardown/db";
import { call, signIn, signUp, openTestWebApp, type TestWebApp } from "../support/api-client.js";

let app: TestWebApp;
beforeAll(async () => {
  app = await openTestWebApp();
});
afterAll(async () => {
  await app?.close();
});

const DAY_MS = 86_400_000;

async function works(token: string): Promise<boolean> {
  const res = await call("GET", "/api/me", { as: { token } });
  expect([200, 401]).toContain(res.status);
  return res.status === 200;
}

describe("token lineage", () => {
  it("gives a token minted by a 30-day token no more than its parent's 30 days, however long it asks", async () => {
    const ana = await signUp("Ana Example", "ana@lab.test");
    const parent = (
      await call("POST", "/api/tokens", { as: ana.as, json: { name: "parent", expiresInDays: 30 } })
    ).body.token;
    const child = await call("POST", "/api/tokens", {
      as: { token: parent.token },
      json: { name: "child", expiresInDays: 365 },
    });
    expect(child.status).toBe(201);
    expect(child.body.token.parentId).toBe(parent.id);
    expect(Date.parse(child.body.token.expiresAt)).toBe(Date.parse(parent.expiresAt));
    const ageDays = (Date.parse(parent.expiresAt) - Date.now()) / DAY_MS;
    expect(ageDays).toBeGreaterThan(29.9);
    expect(ageDays).toBeLessThanOrEqual(30);
    // Without a lifetime of its own it still ends with its parent.
    const open = await call("POST", "/api/tokens", {
      as: { token: parent.token },
      json: { name: "open" },
    });
    expect(Date.parse(open.body.token.expiresAt)).toBe(Date.parse(parent.expiresAt));
  });

  it("revokes children and grandchildren with their parent", async () => {
    const bea = await signUp("Bea Example", "bea@lab.test");
    const root = (await call("POST", "/api/tokens", { as: bea.as, json: { name: "root" } })).body
      .token;
    const child = (
      await call("POST", "/api/tokens", { as: { token: root.token }, json: { name: "c" } })
    ).body.token;
    const grandchild = (
      await call("POST", "/api/tokens", { as: { token: child.token }, json: { name: "g" } })
    ).body.token;
    const sibling = (await call("POST", "/api/tokens", { as: bea.as, json: { name: "other" } }))
      .body.token;
    expect(await works(grandchild.token)).toBe(true);
    expect((await call("DELETE", `/api/tokens/${root.id}`, { as: bea.as })).status).toBe(200);
    expect([
      await works(root.token),
      await works(child.token),
      await works(grandchild.token),
    ]).toEqual([false, false, false]);
    expect(await works(sibling.token)).toBe(true);
    // A revoked parent cannot mint either.
    const late = await call("POST", "/api/tokens", {
      as: { token: root.token },
      json: { name: "late" },
    });
    expect(late.status).toBe(401);
  });

  it("refuses a token past its end", async () => {
    const cal = await signUp("Cal Example", "cal@lab.test");
    const t = (
      await call("POST", "/api/tokens", { as: cal.as, json: { name: "short", expiresInDays: 1 } })
    ).body.token;
    expect(await works(t.token)).toBe(true);
    await app.db.db
      .update(schema.apiTokens)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(schema.apiTokens.id, t.id));
    expect(await works(t.token)).toBe(false);
  });

  it("revokes every token when the user signs out everywhere", async () => {
    const dan = await signUp("Dan Example", "dan@lab.test");
    const a = (await call("POST", "/api/tokens", { as: dan.as, json: { name: "a" } })).body.token;
    const b = (await call("POST", "/api/tokens", { as: { token: a.token }, json: { name: "b" } }))
      .body.token;
    expect((await call("POST", "/api/auth/revoke-sessions", { as: dan.as, json: {} })).status).toBe(
      200,
    );
    expect([await works(a.token), await works(b.token)]).toEqual([false, false]);
    const [audit] = await app.db.db
      .select()
      .from(schema.auditLog)
      .where(eq(schema.auditLog.action, "token.revoke-all"));
    expect(audit).toMatchObject({ actorId: dan.id, detail: { revoked: 2 } });
  });

  it("revokes every token when the password changes with the other sessions signed out", async () => {
    const eve = await signUp("Eve Example", "eve@lab.test", "first password!");
    const t = (await call("POST", "/api/tokens", { as: eve.as, json: { name: "t" } })).body.token;
    const change = await call("POST", "/api/auth/change-password", {
      as: eve.as,
      json: {
        currentPassword: "first password!",
        newPassword: "second password!",
        revokeOtherSessions: true,
      },
    });
    expect(change.status).toBe(200);
    expect(await works(t.token)).toBe(false);
    expect((await signIn("eve@lab.test", "second password!")).status).toBe(200);
  });
});
