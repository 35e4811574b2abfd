// The entry page a practitioner works from, in Chromium (playwright-core), as the demo member
// sees it: every demo entry opens with its summary, schematic and sections and no content
// security policy violation (its charts included); the fan speed control's what-if at
// 120 V / 60 Hz says the triac stops firing, names the gate-feed change and, when that change is
// tried, fires again; a danger finding's link selects its part, which is marked on the drawing.
// Screenshots go to tests/e2e/screenshots/entry-page/; the page heights are printed.
// Set TL_E2E_URL to test an app already running with the demo loaded instead of starting one.
import { existsSync, mkdirSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser, type Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";
import { startApp, type RunningApp } from "./app-process.js";
import { textMatching } from "./page-waits.js";

const CHROMIUM = "/usr/bin/chromium";
const CHROMIUM_ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run"];
const SHOTS = path.join(projectRoot(), "tests", "e2e", "screenshots", "entry-page");
const ANALYSIS_TIMEOUT_MS = 240_000;
const WHAT_IF_TIMEOUT_MS = 120_000;
const STEP_TIMEOUT_MS = 20_000;
const VIEWPORT = { width: 1280, height: 900 };
/** The tallest an entry page may be at 1280 px wide with one section open (summary, schematic, tabs). */
const MAX_PAGE_HEIGHT_PX = 3200;
const DEMO_EMAIL = "maren@fernhollow.example";
const DEMO_PASSWORD = "fernhollow-demo-lab";

const missing = !existsSync(CHROMIUM) && !process.env.CI;

interface Listed {
  id: string;
  title: string;
}

describe.skipIf(missing)("browser: the entry page", () => {
  let app: RunningApp | null = null;
  let url = process.env.TL_E2E_URL ?? "";
  let browser: Browser;
  let page: Page;
  const violations: string[] = [];
  const entries: Listed[] = [];
  const heights: Record<string, number> = {};

  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true });
    if (!url) {
      app = await startApp();
      url = app.url;
    }
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    page = await (await browser.newContext({ viewport: VIEWPORT })).newPage();
    page.setDefaultTimeout(STEP_TIMEOUT_MS);
    await page.addInitScript(() => {
      document.addEventListener("securitypolicyviolation", (e) => {
        console.error(`CSP violation: ${e.violatedDirective} blocked ${e.blockedURI || "inline"}`);
      });
    });
    page.on("console", (m) => {
      if (/Content Security Policy|CSP violation/i.test(m.text()))
        violations.push(`${new URL(page.url()).pathname}: ${m.text()}`);
    });
    await page.goto(`${url}/sign-in`);
    await page.fill('input[name="email"]', DEMO_EMAIL);
    await page.fill('input[name="password"]', DEMO_PASSWORD);
    await page.locator('button[type="submit"]').click();
    await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
    const teams = (await (await page.request.get(`${url}/api/teams`)).json()) as {
      teams: { id: string }[];
    };
    for (const t of teams.teams) {
      let cursor: string | null = null;
      do {
        const q: string = cursor ? `?cursor=${encodeURIComponent(cursor)}` : "";
        const listed = (await (
          await page.request.get(`${url}/api/teams/${t.id}/entries${q}`)
        ).json()) as { entries: Listed[]; nextCursor: string | null };
        entries.push(...listed.entries);
        cursor = listed.nextCursor;
      } while (cursor);
    }
  }, 400_000);

  afterAll(async () => {
    console.log(`entry page heights at ${VIEWPORT.width} px (px): ${JSON.stringify(heights)}`);
    await browser?.close().catch(() => {});
    await app?.stop();
  }, 60_000);

  async function openEntry(id: string): Promise<void> {
    await page.goto(`${url}/entries/${id}`);
    await textMatching(page.getByTestId("analysis-state"), /done|failed/, ANALYSIS_TIMEOUT_MS);
  }

  const slug = (title: string) =>
    title
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .slice(0, 48);

  it("opens every demo entry with its summary, schematic and sections, within its height", async () => {
    expect(entries.length).toBeGreaterThanOrEqual(17);
    for (const e of entries) {
      await openEntry(e.id);
      expect(await page.getByTestId("analysis-state").innerText(), e.title).toBe("done");
      await page.getByTestId("entry-summary").waitFor();
      await page.getByTestId("schematic").waitFor();
      // The caution stands once on the page, beside the summary's figures.
      expect(await page.getByRole("note", { name: "Safety caution" }).count(), e.title).toBe(1);
      // The waveform chart draws with its plain trace names and its window in mains cycles.
      await page.locator('[data-tab="nets"]').click();
      await page.getByTestId("waveform-chart").locator("canvas").waitFor();
      expect(await page.getByTestId("waveform-window").innerText()).toMatch(
        /\d+(\.\d)? mains cycles? at (50|60) Hz/,
      );
      expect(await page.getByTestId("waveforms").innerText()).toContain("line current");
      await page.getByTestId("harmonics-chart").locator("canvas").waitFor();
      await page.locator('[data-tab="findings"]').click();
      heights[slug(e.title)] = await page.evaluate(() => document.documentElement.scrollHeight);
      await page.screenshot({ path: path.join(SHOTS, `${slug(e.title)}.png`), fullPage: true });
      expect(heights[slug(e.title)], e.title).toBeLessThan(MAX_PAGE_HEIGHT_PX);
    }
    expect(violations).toEqual([]);
  }, 900_000);

  it("runs a what-if at 120 V / 60 Hz: the fan control's triac stops firing, and the suggested gate resistor makes it fire", async () => {
    const fan = entries.find((e) => /fan speed/i.test(e.title));
    expect(fan).toBeDefined();
    await openEntry(fan!.id);
    await page.locator('[data-tab="what-if"]').click();
    await page.getByLabel("120 V / 60 Hz").check();
    await page.getByTestId("run-what-if").click();
    await page.getByTestId("what-if-result").waitFor({ timeout: WHAT_IF_TIMEOUT_MS });
    const stops = page.getByTestId("what-if-stops-firing");
    expect(await stops.innerText()).toMatch(/does not fire at 120 V \/ 60 Hz/);
    const suggestion = await page.getByTestId("what-if-suggestion").innerText();
    expect(suggestion).toMatch(/^[A-Z]+\d+ to [\d.]+ [kM]?Ω$/);
    await page.screenshot({ path: path.join(SHOTS, "what-if-120-60.png"), fullPage: true });
    await page.getByTestId("try-suggestion").click();
    // The answer with the change applied: no trigger stops firing, and the table says it fires.
    await page.waitForFunction(
      () =>
        document.querySelector('[data-testid="what-if-result"]') !== null &&
        document.querySelector('[data-testid="what-if-stops-firing"]') === null,
      undefined,
      { timeout: WHAT_IF_TIMEOUT_MS },
    );
    const table = await page.getByTestId("what-if-compare").innerText();
    expect(table).toMatch(/fires\s+fires/);
    expect(await page.locator("[data-testid=what-if-result]").innerText()).toContain(
      suggestion.split(" to ")[0]!,
    );
    await page.screenshot({
      path: path.join(SHOTS, "what-if-suggestion-applied.png"),
      fullPage: true,
    });
  }, 300_000);

  it("selects a flagged part from a finding and marks it on the schematic", async () => {
    const warmer = entries.find((e) => /hand warmer/i.test(e.title));
    expect(warmer).toBeDefined();
    await openEntry(warmer!.id);
    const finding = page
      .locator('[data-testid="findings"] article[data-severity="danger"]')
      .filter({ has: page.getByTestId("show-on-schematic") })
      .first();
    const concerns = await finding.innerText();
    await finding.getByTestId("show-on-schematic").click();
    const selected = page.locator("[data-selected-ref]").first();
    await selected.waitFor();
    const ref = (await selected.getAttribute("data-selected-ref"))!;
    expect(concerns).toContain(ref);
    // Marked on the drawing as a danger part (a double frame and "!!", not colour alone).
    const mark = page.locator(`[data-mark-ref="${ref}"]`);
    expect(await mark.getAttribute("data-mark")).toBe("danger");
    expect(await mark.locator("text").innerHTML()).toBe("!!");
    // The part's panel shows its figures.
    const panel = page.getByTestId("part-panel");
    expect(await panel.getAttribute("data-part")).toBe(ref);
    expect(await panel.innerText()).toMatch(/Peak voltage[\s\S]*RMS current[\s\S]*Dissipation/);
    await page
      .getByTestId("schematic")
      .screenshot({ path: path.join(SHOTS, "finding-selects-part.png") });
    await page.screenshot({ path: path.join(SHOTS, "finding-selects-part-page.png") });
  }, 300_000);
});
