// Accounts (better-auth, scrypt), sessions in Postgres, sign-out everywhere, password change,
// and personal API tokens: shown once, stored hashed, refused once revoked.
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { schema } from "@teardown/db";
import { call, signIn, signUp, openTestWebApp, type TestWebApp } from "../../support/api-client.js";

let app: TestWebApp;

beforeAll(async () => {
  app = await openTestWebApp();
});
afterAll(async () => {
  await app?.close();
});

describe("accounts", () => {
  it("signs a user up, keeps the session in Postgres and answers /api/me with it", async () => {
    const ada = await signUp("Ada Example", "ada@lab.test");
    const me = await call("GET", "/api/me", { as: ada.as });
    expect(me.status).toBe(200);
    expect(me.body).toEqual({
      user: { id: ada.id, name: "Ada Example", email: "ada@lab.test" },
      via: "session",
    });
    const sessions = await app.db.db
      .select()
      .from(schema.sessions)
      .where(eq(schema.sessions.userId, ada.id));
    expect(sessions).toHaveLength(1);
  });

  it("stores the password as an scrypt hash (16-byte salt, 64-byte key), never the password", async () => {
    const bo = await signUp("Bo Example", "bo@lab.test", "a long enough secret");
    const [acct] = await app.db.db
      .select()
      .from(schema.accounts)
      .where(eq(schema.accounts.userId, bo.id));
    expect(acct!.providerId).toBe("credential");
    expect(acct!.password).toMatch(/^[0-9a-f]{32}:[0-9a-f]{128}$/);
    expect(acct!.password).not.toContain("a long enough secret");
  });

  it("keeps the generated auth secret under the data dir so a restart keeps sessions", () => {
    const secret = readFileSync(path.join(app.dataDir, "auth-secret"), "utf8").trim();
    expect(secret.length).toBeGreaterThanOrEqual(40);
  });

  it("answers 401 to an anonymous request and to a cookie that is not a session", async () => {
    expect((await call("GET", "/api/me")).status).toBe(401);
    const forged = await call("GET", "/api/me", {
      as: { cookie: "better-auth.session_token=forged.value" },
    });
    expect(forged.status).toBe(401);
    expect(forged.body.error.code).toBe("unauthenticated");
  });

  it("signs out everywhere: every session of the user stops working", async () => {
    const cy = await signUp("Cy Example", "cy@lab.test");
    const second = await signIn("cy@lab.test", cy.password);
    expect(second.status).toBe(200);
    expect((await call("GET", "/api/me", { as: second.as })).status).toBe(200);
    const revoke = await call("POST", "/api/auth/revoke-sessions", { as: cy.as, json: {} });
    expect(revoke.status).toBe(200);
    expect((await call("GET", "/api/me", { as: cy.as })).status).toBe(401);
    expect((await call("GET", "/api/me", { as: second.as })).status).toBe(401);
  });

  it("changes a password: the old one stops working, the new one signs in", async () => {
    const di = await signUp("Di Example", "di@lab.test", "first password!");
    const change = await call("POST", "/api/auth/change-password", {
      as: di.as,
      json: {
        currentPassword: "first password!",
        newPassword: "second password!",
        revokeOtherSessions: true,
      },
    });
    expect(change.status).toBe(200);
    expect((await signIn("di@lab.test", "first password!")).status).toBe(401);
    expect((await signIn("di@lab.test", "second password!")).status).toBe(200);
  });

  it("refuses a cookie-authenticated POST from a foreign origin", async () => {
    const ed = await signUp("Ed Example", "ed@lab.test");
    const res = await call("POST", "/api/auth/revoke-sessions", {
      as: ed.as,
      json: {},
      headers: { origin: "http://evil.example" },
    });
    expect(res.status).toBe(403);
    expect((await call("GET", "/api/me", { as: ed.as })).status).toBe(200);
  });
});

describe("personal API tokens", () => {
  it("shows a token once, stores only its sha256, and lets it act as the user", async () => {
    const fay = await signUp("Fay Example", "fay@lab.test");
    const made = await call("POST", "/api/tokens", { as: fay.as, json: { name: "bench script" } });
    expect(made.status).toBe(201);
    const token: string = made.body.token.token;
    expect(token).toMatch(/^tl_[A-Za-z0-9_-]{43}$/);
    const [row] = await app.db.db
      .select()
      .from(schema.apiTokens)
      .where(eq(schema.apiTokens.id, made.body.token.id));
    expect(row!.tokenHash).toBe(createHash("sha256").update(token).digest("hex"));
    const listed = await call("GET", "/api/tokens", { as: fay.as });
    expect(listed.body.tokens).toHaveLength(1);
    expect(JSON.stringify(listed.body)).not.toContain(token);
    const me = await call("GET", "/api/me", { as: { token } });
    expect(me.body).toMatchObject({ user: { id: fay.id }, via: "token" });
  });

  it("refuses a revoked token with 401, and an unknown or malformed one too", async () => {
    const gil = await signUp("Gil Example", "gil@lab.test");
    const made = await call("POST", "/api/tokens", { as: gil.as, json: { name: "ci" } });
    const token: string = made.body.token.token;
    expect((await call("GET", "/api/teams", { as: { token } })).status).toBe(200);
    const revoked = await call("DELETE", `/api/tokens/${made.body.token.id}`, { as: gil.as });
    expect(revoked.status).toBe(200);
    expect(revoked.body.token.revokedAt).not.toBeNull();
    expect((await call("GET", "/api/teams", { as: { token } })).status).toBe(401);
    expect((await call("GET", "/api/teams", { as: { token: "tl_not-a-real-token" } })).status).toBe(
      401,
    );
    expect(
      (await call("GET", "/api/teams", { headers: { authorization: "Basic abc" } })).status,
    ).toBe(401);
  });

  it("does not let one user revoke another's token (404)", async () => {
    const hal = await signUp("Hal Example", "hal@lab.test");
    const ivy = await signUp("Ivy Example", "ivy@lab.test");
    const made = await call("POST", "/api/tokens", { as: hal.as, json: { name: "mine" } });
    expect((await call("DELETE", `/api/tokens/${made.body.token.id}`, { as: ivy.as })).status).toBe(
      404,
    );
    expect((await call("DELETE", "/api/tokens/not-a-uuid", { as: ivy.as })).status).toBe(404);
    expect((await call("GET", "/api/me", { as: { token: made.body.token.token } })).status).toBe(
      200,
    );
  });

  it("writes an audit row for each token made and revoked", async () => {
    const rows = await app.db.db
      .select()
      .from(schema.auditLog)
      .where(eq(schema.auditLog.action, "token.revoke"));
    expect(rows.length).toBeGreaterThanOrEqual(1);
  });
});
