// Finding 11: sign-up told whether an email was registered ("already exists"). Now a taken email
// gets the same status and the same shape of answer as a new one, neither signs anyone in, and
// the existing account is untouched; only signing in (with its generic message) decides.
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

/** The answer's shape: its keys, recursively, with the type of each leaf. */
function shape(v: unknown): unknown {
  if (v === null || typeof v !== "object") return v === null ? "null" : typeof v;
  return Object.fromEntries(
    Object.entries(v as object)
      .sort(([a], [b]) => a.localeCompare(b))
      .map(([k, x]) => [k, shape(x)]),
  );
}

describe("sign-up", () => {
  it("answers a taken email exactly as a new one, and signs nobody in", async () => {
    const owner = await signUp("Jo Example", "jo@lab.test", "jo's own password");
    const taken = await call("POST", "/api/auth/sign-up/email", {
      json: { name: "Mallory", email: "jo@lab.test", password: "attacker password" },
    });
    const fresh = await call("POST", "/api/auth/sign-up/email", {
      json: { name: "Kim Example", email: "kim@lab.test", password: "kim's own password" },
    });
    expect(taken.status).toBe(200);
    expect(fresh.status).toBe(200);
    expect(shape(taken.body)).toEqual(shape(fresh.body));
    expect(taken.body.token).toBeNull();
    expect(fresh.body.token).toBeNull();
    expect(taken.headers.getSetCookie().filter((c) => c.includes("session_token="))).toEqual([]);
    expect(fresh.headers.getSetCookie().filter((c) => c.includes("session_token="))).toEqual([]);
    // Same email casing rules, same text: nothing in the body says "exists".
    expect(taken.text).not.toMatch(/exist|already|taken|registered/i);
    // The real account keeps its name and password; the attacker's password does not sign in.
    const [jo] = await app.db.db
      .select()
      .from(schema.users)
      .where(eq(schema.users.email, "jo@lab.test"));
    expect(jo!.name).toBe("Jo Example");
    expect((await signIn("jo@lab.test", "attacker password")).status).toBe(401);
    expect((await signIn("jo@lab.test", owner.password)).status).toBe(200);
    expect((await signIn("kim@lab.test", "kim's own password")).status).toBe(200);
  });

  it("gives a wrong password and an unknown email the same sign-in answer", async () => {
    await signUp("Lu Example", "lu@lab.test");
    const wrong = await call("POST", "/api/auth/sign-in/email", {
      json: { email: "lu@lab.test", password: "not the password" },
    });
    const unknown = await call("POST", "/api/auth/sign-in/email", {
      json: { email: "nobody@lab.test", password: "not the password" },
    });
    expect([wrong.status, unknown.status]).toEqual([401, 401]);
    expect(wrong.body).toEqual(unknown.body);
  });
});
