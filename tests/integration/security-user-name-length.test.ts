// Finding 7: a user name had no length limit (a 20 MB name made a teammate's comment list 63 MB).
// Now names are checked at the auth gate: at most 100 characters, at sign-up and when changed.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { count } from "drizzle-orm";
import { schema } from "@teardown/db";
import { MAX_USER_NAME_CHARS } from "@/lib/auth";
import { call, signUp, openTestWebApp, type TestWebApp } from "../support/api-client.js";

let app: TestWebApp;
beforeAll(async () => {
  app = await openTestWebApp();
});
afterAll(async () => {
  await app?.close();
});

async function users(): Promise<number> {
  const [r] = await app.db.db.select({ n: count() }).from(schema.users);
  return r!.n;
}

describe("user names", () => {
  it("refuses a name one character over the limit at sign-up with 422 naming `name`", async () => {
    const before = await users();
    const res = await call("POST", "/api/auth/sign-up/email", {
      json: { name: "n".repeat(101), email: "long@lab.test", password: "a long enough secret" },
    });
    expect(MAX_USER_NAME_CHARS).toBe(100);
    expect(res.status).toBe(422);
    expect(res.body.error.errors[0].path).toBe("name");
    expect(await users()).toBe(before);
  });

  it("refuses a 20 MB name with 413 before reading it all", async () => {
    const res = await call("POST", "/api/auth/sign-up/email", {
      json: {
        name: "n".repeat(20 * 1024 * 1024),
        email: "huge@lab.test",
        password: "a long enough secret",
      },
    });
    expect(res.status).toBe(413);
  });

  it("accepts exactly 100 characters", async () => {
    const res = await call("POST", "/api/auth/sign-up/email", {
      json: { name: "m".repeat(100), email: "edge@lab.test", password: "a long enough secret" },
    });
    expect(res.status).toBe(200);
  });

  it("refuses a long name when a user renames themself, and keeps the old name", async () => {
    const al = await signUp("Al Example", "al@lab.test");
    const res = await call("POST", "/api/auth/update-user", {
      as: al.as,
      json: { name: "x".repeat(5000) },
    });
    expect(res.status).toBe(422);
    expect(res.body.error.errors[0].path).toBe("name");
    const me = await call("GET", "/api/me", { as: al.as });
    expect(me.body.user.name).toBe("Al Example");
  });
});
