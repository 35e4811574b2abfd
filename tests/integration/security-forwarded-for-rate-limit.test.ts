// Finding 1: the sign-in limit keyed on the first X-Forwarded-For value, which the client sets,
// so rotating that header gave unlimited guesses. Now the address is the TCP peer (stamped by the
// server hook) unless TRUSTED_PROXY_HOPS says how many proxies to believe, and each account has
// its own limit too.
import http from "node:http";
import type { AddressInfo } from "node:net";
import { readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";
import { installPeerAddressHook, PEER_ADDRESS_HEADER } from "@/lib/peer-address-hook";
import { clientAddress, RateLimiter, resetRateLimits } from "@/lib/request-guard";
import { call, signUp, openTestWebApp, type TestWebApp } from "../support/api-client.js";

let app: TestWebApp;
beforeAll(async () => {
  app = await openTestWebApp();
});
afterAll(async () => {
  await app?.close();
});
afterEach(() => {
  delete process.env.TRUSTED_PROXY_HOPS;
  resetRateLimits();
});

function requestWith(headers: Record<string, string>): Request {
  return new Request("http://localhost:3000/api/auth/sign-in/email", { method: "POST", headers });
}

describe("which address a request comes from", () => {
  it("ignores X-Forwarded-For entirely with the default of 0 trusted hops", () => {
    const req = requestWith({ [PEER_ADDRESS_HEADER]: "203.0.113.7", "x-forwarded-for": "1.1.1.1" });
    expect(clientAddress(req)).toBe("203.0.113.7");
  });

  it("with 1 hop takes the address the proxy appended, not what the client wrote before it", () => {
    process.env.TRUSTED_PROXY_HOPS = "1";
    // Client forged "9.9.9.9"; the proxy (peer 10.0.0.2) appended the real client 198.51.100.4.
    const req = requestWith({
      [PEER_ADDRESS_HEADER]: "10.0.0.2",
      "x-forwarded-for": "9.9.9.9, 198.51.100.4",
    });
    expect(clientAddress(req)).toBe("198.51.100.4");
    process.env.TRUSTED_PROXY_HOPS = "2";
    expect(clientAddress(req)).toBe("9.9.9.9");
  });

  it("refuses a TRUSTED_PROXY_HOPS that is not a small whole number", () => {
    process.env.TRUSTED_PROXY_HOPS = "yes";
    expect(() => clientAddress(requestWith({}))).toThrow(/TRUSTED_PROXY_HOPS/);
  });

  it("stamps the real socket address over a peer header the client forged", async () => {
    installPeerAddressHook();
    const seen: (string | undefined)[] = [];
    const server = http.createServer((req, res) => {
      seen.push(req.headers[PEER_ADDRESS_HEADER] as string | undefined);
      res.end("ok");
    });
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
    const port = (server.address() as AddressInfo).port;
    await fetch(`http://127.0.0.1:${port}/`, {
      headers: { [PEER_ADDRESS_HEADER]: "6.6.6.6", "x-forwarded-for": "6.6.6.6" },
    }).then((r) => r.text());
    await new Promise<void>((r) => server.close(() => r()));
    expect(seen).toEqual(["127.0.0.1"]);
  });

  it("ships a proxy config that replaces the client's X-Forwarded-For, and compose trusts one hop", () => {
    const nginx = readFileSync(path.join(projectRoot(), "deploy", "nginx.conf"), "utf8");
    expect(nginx).toMatch(/proxy_set_header X-Forwarded-For \$remote_addr;/);
    expect(nginx).not.toContain("$proxy_add_x_forwarded_for");
    const compose = readFileSync(path.join(projectRoot(), "docker-compose.yml"), "utf8");
    expect(compose).toMatch(/TRUSTED_PROXY_HOPS: "?1"?/);
  });
});

describe("sign-in attempts", () => {
  it("stops 30 wrong passwords with a rotating X-Forwarded-For before the right one gets in", async () => {
    const victim = await signUp("Vic Example", "vic@lab.test", "the right password");
    resetRateLimits();
    const statuses: number[] = [];
    for (let i = 0; i < 30; i++) {
      const res = await call("POST", "/api/auth/sign-in/email", {
        json: { email: victim.email, password: `guess number ${i}` },
        headers: { [PEER_ADDRESS_HEADER]: "192.0.2.50", "x-forwarded-for": `10.9.${i}.1` },
      });
      statuses.push(res.status);
    }
    const right = await call("POST", "/api/auth/sign-in/email", {
      json: { email: victim.email, password: "the right password" },
      headers: { [PEER_ADDRESS_HEADER]: "192.0.2.50", "x-forwarded-for": "10.9.99.1" },
    });
    // The account allows 10 attempts per 15 minutes: ten wrong answers (401), then 429 onwards.
    expect(statuses.slice(0, 10)).toEqual(Array(10).fill(401));
    expect(statuses.slice(10)).toEqual(Array(20).fill(429));
    expect(right.status).toBe(429);
    expect(right.body.error.message).toMatch(/try again in \d+ s/);
  }, 240_000); // 30 scrypt checks on 2 shared cores

  it("limits an account even when every attempt comes from a different address", async () => {
    const limiter = new RateLimiter(10, 15 * 60_000, () => 0);
    const outcomes = Array.from({ length: 12 }, () => limiter.hit("one@lab.test"));
    expect(outcomes.slice(0, 10)).toEqual(Array(10).fill(null));
    expect(outcomes[10]).toBe(900);
  });

  it("opens the window again once it has passed", () => {
    let t = 0;
    const limiter = new RateLimiter(2, 60_000, () => t);
    expect([limiter.hit("k"), limiter.hit("k"), limiter.hit("k")]).toEqual([null, null, 60]);
    t = 60_000;
    expect(limiter.hit("k")).toBeNull();
  });
});
