// Finding 10, in the browser: the app's own pages pass their content security policy. Chromium
// visits the main pages (home, sign-up, teams, a team, its audit log, new entry, settings, a public
// entry with its schematic) and reports every CSP violation, from the page's event and the console.
// Set TL_E2E_URL to check an app that is already running instead of starting one.
import { existsSync, mkdirSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser, type Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";
import { startApp, type RunningApp } from "./app-process.js";
import { textContaining } from "./page-waits.js";

const CHROMIUM = "/usr/bin/chromium";
const CHROMIUM_ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run"];
const SHOTS = path.join(projectRoot(), "tests", "e2e", "screenshots");
const missing = !existsSync(CHROMIUM) && !process.env.CI;

describe.skipIf(missing)("the pages pass their content security policy in Chromium", () => {
  let app: RunningApp | null = null;
  let url = process.env.TL_E2E_URL ?? "";
  let browser: Browser;
  let page: Page;
  const violations: string[] = [];

  beforeAll(async () => {
    if (!url) {
      app = await startApp();
      url = app.url;
    }
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    page = await (await browser.newContext({ baseURL: url })).newPage();
    // Record violations as the page reports them, before any of its own scripts run.
    await page.addInitScript(() => {
      document.addEventListener("securitypolicyviolation", (e) => {
        console.error(`CSP violation: ${e.violatedDirective} blocked ${e.blockedURI || "inline"}`);
      });
    });
    page.on("console", (m) => {
      if (/Content Security Policy|CSP violation/i.test(m.text()))
        violations.push(`${new URL(page.url()).pathname}: ${m.text()}`);
    });
    mkdirSync(SHOTS, { recursive: true });
  }, 400_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });

  async function visit(p: string, mustShow: string): Promise<void> {
    const res = await page.goto(p);
    expect(res?.status(), p).toBe(200);
    expect(res?.headers()["content-security-policy"], p).toMatch(/script-src 'self' 'nonce-/);
    await textContaining(page.locator("main"), mustShow);
  }

  it("shows home, sign-up, teams, a team, its audit log, new entry, settings and an entry with no violation", async () => {
    await visit("/", "Traced teardowns");
    await visit("/sign-up", "");
    // Signing up runs the page's own script (a hydrated React form and two fetches).
    const email = `csp-${Date.now().toString(36)}@example.test`;
    await page.fill('input[name="name"]', "Cas Checker");
    await page.fill('input[name="email"]', email);
    await page.fill('input[name="password"]', "correct-horse-battery");
    await page.click('button[type="submit"]');
    await page.waitForURL(/\/teams$/);
    const made = await page.request.post("/api/teams", {
      data: { name: `CSP check ${Date.now().toString(36)}` },
      headers: { origin: new URL(url).origin },
    });
    expect(made.status()).toBe(201);
    const teamId = (await made.json()).team.id as string;
    await visit(`/teams/${teamId}`, "CSP check");
    await visit(`/teams/${teamId}/audit`, "team.create");
    await page.screenshot({ path: path.join(SHOTS, "security-audit-log.png"), fullPage: true });
    await visit(`/entries/new?team=${teamId}`, "");
    await visit("/settings", "");
    const list = await (await page.request.get("/api/entries?limit=1")).json();
    const entryId = list.entries[0]?.id as string | undefined;
    if (entryId) {
      await visit(`/entries/${entryId}`, "");
      await page.waitForTimeout(3000); // the schematic and plots draw after load
      await page.screenshot({
        path: path.join(SHOTS, "security-entry-under-csp.png"),
        fullPage: true,
      });
    }
    expect(violations).toEqual([]);
  }, 180_000);
});
