// Finding 10: no security headers at all. Now every answer carries nosniff, a referrer policy and
// frame denial; pages get a content security policy with a fresh nonce per request (scripts only
// from our origin or with the nonce), and API answers a policy that allows nothing. The browser
// check that the app's own pages pass the policy is tests/e2e/security-csp-browser.test.ts.
import { describe, expect, it } from "vitest";
import path from "node:path";
import { NextRequest } from "next/server";
import { projectRoot } from "@teardown/db";
import { config as proxyConfig, proxy } from "@/proxy";

interface HeaderRule {
  source: string;
  headers: { key: string; value: string }[];
}

// Loaded by path, so the type checker does not pull Next's global types (its NODE_ENV) into the
// whole test program through next.config.ts.
const CONFIG_PATH = path.join(projectRoot(), "web", "next.config.ts");
async function headerRules(): Promise<HeaderRule[]> {
  const mod = (await import(/* @vite-ignore */ CONFIG_PATH)) as {
    default: { headers(): Promise<HeaderRule[]> };
  };
  return mod.default.headers();
}

/** A CSP header as a map of directive name to its sources. */
function directives(policy: string): Map<string, string[]> {
  return new Map(
    policy
      .split(";")
      .map((d) => d.trim().split(/\s+/))
      .filter((d) => d[0])
      .map(([name, ...sources]) => [name!, sources]),
  );
}

async function fixedHeaders(path: string): Promise<Map<string, string>> {
  const rules = await headerRules();
  const out = new Map<string, string>();
  for (const rule of rules) {
    // The two sources used are "/:path*" and "/api/:path*"; match them as Next would.
    const prefix = rule.source.replace("/:path*", "");
    if (path === prefix || path.startsWith(`${prefix}/`) || prefix === "")
      for (const h of rule.headers) out.set(h.key.toLowerCase(), h.value);
  }
  return out;
}

describe("headers on every answer", () => {
  it("pages, API answers and exports say nosniff, deny framing and limit the referrer", async () => {
    for (const path of [
      "/",
      "/entries/x",
      "/api/entries",
      "/api/entries/x/export/record.json",
      "/_next/static/a.js",
    ]) {
      const h = await fixedHeaders(path);
      expect(h.get("x-content-type-options"), path).toBe("nosniff");
      expect(h.get("x-frame-options"), path).toBe("DENY");
      expect(h.get("referrer-policy"), path).toBe("strict-origin-when-cross-origin");
    }
  });

  it("API answers carry a policy that allows nothing (they are data, never documents)", async () => {
    const csp = directives(
      (await fixedHeaders("/api/entries/x/export/record.json")).get("content-security-policy")!,
    );
    expect(csp.get("default-src")).toEqual(["'none'"]);
    expect(csp.get("frame-ancestors")).toEqual(["'none'"]);
    expect((await fixedHeaders("/entries/x")).has("content-security-policy")).toBe(false);
  });
});

describe("the pages' content security policy", () => {
  it("gives each page request a fresh nonce, on the request (for Next) and on the answer", async () => {
    const a = await proxy(new NextRequest("http://localhost:3000/teams"));
    const b = await proxy(new NextRequest("http://localhost:3000/teams"));
    const pa = directives(a.headers.get("content-security-policy")!);
    const pb = directives(b.headers.get("content-security-policy")!);
    const nonceA = pa.get("script-src")!.find((s) => s.startsWith("'nonce-"))!;
    const nonceB = pb.get("script-src")!.find((s) => s.startsWith("'nonce-"))!;
    expect(nonceA).toMatch(/^'nonce-[A-Za-z0-9+/]{22}==?'$/);
    expect(nonceA).not.toBe(nonceB);
    // Next reads the policy from the request it renders; the override header carries it there.
    expect(a.headers.get("x-middleware-override-headers")).toContain("content-security-policy");
    expect(a.headers.get("x-middleware-request-content-security-policy")).toBe(
      a.headers.get("content-security-policy"),
    );
  });

  it("allows no inline or foreign script, no plugins, no framing and no foreign form targets", async () => {
    const csp = directives(
      (await proxy(new NextRequest("http://localhost:3000/"))).headers.get(
        "content-security-policy",
      )!,
    );
    const script = csp.get("script-src")!;
    expect(script).not.toContain("'unsafe-inline'");
    expect(script).not.toContain("'unsafe-eval'");
    expect(script.filter((s) => /^https?:|^\*$/.test(s))).toEqual([]);
    expect(csp.get("object-src")).toEqual(["'none'"]);
    expect(csp.get("frame-ancestors")).toEqual(["'none'"]);
    expect(csp.get("form-action")).toEqual(["'self'"]);
    expect(csp.get("base-uri")).toEqual(["'self'"]);
  });

  it("runs for pages only, not for the API (whose bodies must not pass through it) or build files", () => {
    const source = proxyConfig.matcher[0]!.source;
    const re = new RegExp(`^${source}$`);
    expect(re.test("/teams/abc")).toBe(true);
    expect(re.test("/")).toBe(true);
    expect(re.test("/api/auth/sign-in/email")).toBe(false);
    expect(re.test("/_next/static/chunks/main.js")).toBe(false);
  });
});
