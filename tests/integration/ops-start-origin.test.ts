// Finding 14 (sign-up half): the start prints http://localhost:PORT, yet signing up from
// http://127.0.0.1:PORT (the same server) was refused with "Invalid origin". The loopback
// spellings of the app's own address are trusted; a foreign origin still is not.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loopbackAliases } from "@/lib/loopback-origins";
import { call, openTestWebApp, type TestWebApp } from "../support/api-client.js";

let app: TestWebApp;
beforeAll(async () => {
  app = await openTestWebApp();
});
afterAll(async () => {
  await app?.close();
});

function signUpFrom(origin: string, email: string) {
  return call("POST", "/api/auth/sign-up/email", {
    headers: { origin },
    json: { name: "Ilka Varga", email, password: "correct horse battery" },
  });
}

describe("finding 14: sign-up from the loopback addresses the start prints", () => {
  it("accepts http://127.0.0.1:PORT and http://[::1]:PORT when the app runs as localhost", async () => {
    expect((await signUpFrom("http://127.0.0.1:3000", "ilka@fernhollow.test")).status).toBe(200);
    expect((await signUpFrom("http://[::1]:3000", "ilka2@fernhollow.test")).status).toBe(200);
  });

  it("still refuses another port and another host", async () => {
    expect((await signUpFrom("http://127.0.0.1:4000", "no1@fernhollow.test")).status).toBe(403);
    expect((await signUpFrom("http://evil.example", "no2@fernhollow.test")).status).toBe(403);
  });

  it("gives aliases only for loopback hosts, keeping scheme and port", () => {
    expect(loopbackAliases("http://localhost:3000").sort()).toEqual(
      ["http://127.0.0.1:3000", "http://[::1]:3000"].sort(),
    );
    expect(loopbackAliases("https://127.0.0.1")).toEqual(["https://localhost", "https://[::1]"]);
    expect(loopbackAliases("https://ledger.lab.test")).toEqual([]);
  });
});
