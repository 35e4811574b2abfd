// What an analysis says about itself, in a real browser: a record with a load without a
// resistance and a part of an unknown kind is uploaded; the upload page shows every warning the
// reader returned with its line; the entry page then says "partial: … left out (…)" at the top,
// next to the figures (in the first screenful), and the left-out parts read "left out" in the
// parts table. Saving that record again from the form editor first asks for what the solver
// needs and names what will be left out; only a second, explicit click saves it.
import { existsSync, mkdirSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser, type Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";
import { startApp, type RunningApp } from "./app-process.js";
import { attributeMatching, textContaining, textMatching } from "./page-waits.js";

const CHROMIUM = "/usr/bin/chromium";
const CHROMIUM_ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run"];
const SHOTS = path.join(projectRoot(), "tests", "e2e", "screenshots");
const ANALYSIS_TIMEOUT_MS = 90_000;
const STEP_TIMEOUT_MS = 20_000;
const UUID = "[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}";

// Line 11 holds a field the reader ignores (a warning with its line); HT1 has no model.r and U1
// a kind the engine does not know (a warning at line 16, and two gaps in the analysis).
const PARTIAL_RECORD = [
  "record: 1",
  "title: Fernhollow bench heater, partly traced",
  "device:",
  "  category: heater",
  "  rated_supply: { vrms: 230, hz: 50 }",
  "parts:",
  "  - ref: R1",
  "    kind: resistor",
  "    value: 23k",
  "    pins: [L, N]",
  "    colour: brown",
  "  - ref: HT1",
  "    kind: load",
  "    pins: [L, A]",
  "  - ref: U1",
  "    kind: widget",
  "    pins: { a: A, b: N }",
  "nets:",
  "  L: { role: line }",
  "  N: { role: neutral }",
  "",
].join("\n");

const missing = !existsSync(CHROMIUM) && !process.env.CI;

describe.skipIf(missing)("browser: the analysis states what it left out", () => {
  let app: RunningApp;
  let browser: Browser;
  let page: Page;
  const stamp = Date.now().toString(36);

  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true });
    app = await startApp();
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    page = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
    page.setDefaultTimeout(STEP_TIMEOUT_MS);
  }, 330_000);

  afterAll(async () => {
    await browser?.close().catch(() => {});
    await app?.stop();
  }, 60_000);

  it("shows the reader's warnings by line, then a partial analysis's state at the top", async () => {
    await page.goto(`${app.url}/sign-up`);
    await page.fill('input[name="name"]', "Ines Tracer");
    await page.fill('input[name="email"]', `ines-${stamp}@example.test`);
    await page.fill('input[name="password"]', "correct-horse-battery");
    await page.getByRole("button", { name: "Create account" }).click();
    await page.waitForURL(`${app.url}/teams`);
    await page.fill('input[name="teamName"]', `Trust ${stamp}`);
    await page.getByRole("button", { name: "Create team" }).click();
    await page.waitForURL(new RegExp(`/teams/${UUID}$`));
    const teamId = new URL(page.url()).pathname.split("/")[2]!;

    await page.goto(`${app.url}/entries/new?team=${teamId}`);
    await attributeMatching(
      page.getByTestId("record-schema-link"),
      "href",
      /^\/api\/schema\/record-v1\.schema\.json$/,
    );
    const upload = page.locator("form", { has: page.locator('input[name="recordFile"]') });
    await upload.locator('input[name="recordFile"]').setInputFiles({
      name: "bench-heater.yaml",
      mimeType: "application/yaml",
      buffer: Buffer.from(PARTIAL_RECORD),
    });
    await upload.getByRole("button", { name: "Create entry" }).click();
    const warnings = page.getByTestId("upload-warnings");
    await textContaining(warnings, "line 11");
    const text = await warnings.innerText();
    expect(text).toMatch(/line 11[\s\S]*parts\[0\]\.colour[\s\S]*ignored/);
    expect(text).toMatch(/line 16[\s\S]*parts\[2\]\.kind[\s\S]*widget/);
    await page.screenshot({ path: path.join(SHOTS, "trust-upload-warnings.png"), fullPage: true });

    await page.getByTestId("open-created-entry").click();
    await page.waitForURL(new RegExp(`/entries/${UUID}$`));
    await textMatching(page.getByTestId("analysis-state"), /done/, ANALYSIS_TIMEOUT_MS);
    // The badge is not a clean "done": it says partial beside it.
    await textMatching(page.getByTestId("analysis-outcome"), /partial/);
    const status = page.getByTestId("analysis-status");
    expect(await status.getAttribute("data-status")).toBe("partial");
    expect(await page.getByTestId("analysis-status-line").innerText()).toMatch(
      /^partial: 2 parts and 1 net left out \(HT1: load without a resistance or capacitance \(model\.r or model\.c\); U1: unknown kind "widget"; net A: /,
    );
    // The state comes before the figures: it is the first thing of the results on the page.
    await page.evaluate(() => window.scrollTo(0, 0));
    const statusTop = (await status.boundingBox())!.y;
    const figuresTop = (await page.getByTestId("input-figures").boundingBox())!.y;
    expect(statusTop).toBeLessThan(figuresTop);
    // At the top: a reader sees it without scrolling (viewport 900 px high).
    expect(statusTop).toBeLessThan(900);
    await page.screenshot({ path: path.join(SHOTS, "trust-entry-partial.png"), fullPage: false });
    // The parts table is one of the entry page's sections, opened by its tab.
    await page.locator('[data-tab="parts"]').click();
    const ht1 = page.locator('[data-testid="part-figures"] tr[data-part="HT1"]');
    await textContaining(ht1, "left out: load without a resistance");
    await page.screenshot({ path: path.join(SHOTS, "trust-entry-parts.png"), fullPage: false });

    // The form editor, on the same record: the first save asks, the second saves anyway.
    // The open tab lives in the address's #fragment; the entry's own address is without it.
    const entryUrl = page.url().split("#")[0]!;
    await page.goto(`${entryUrl}/edit`);
    const needs = page.getByTestId("solver-needs");
    await textMatching(
      needs,
      /Left out of the analysis: HT1: load without a resistance[\s\S]*U1: unknown kind "widget"/,
    );
    await page.locator('input[name="message"]').fill("saved with the heater unmeasured");
    await page.getByRole("button", { name: "Save revision", exact: true }).click();
    const anyway = page.getByRole("button", { name: "Save revision anyway" });
    await anyway.waitFor({ state: "visible" });
    await textContaining(needs, "Saving now stores the entry with these left out");
    expect(page.url()).toBe(`${entryUrl}/edit`);
    await page.screenshot({ path: path.join(SHOTS, "trust-form-asks.png"), fullPage: false });
    await anyway.click();
    await page.waitForURL(entryUrl);
  }, 240_000);
});
