// Comparing in a real browser (Debian's Chromium through playwright-core), on the app started the
// way a user starts it with its demo: a lab member opens the compare page with one entry, picks
// the second from the list, and sees the two bulb batches side by side, matched as the scenario
// states (scenario-expectations.ts); then two revisions of one entry, and the revision diff's
// "what the change did to the analysis". Screenshots go to tests/e2e/screenshots/compare/.
import { existsSync, mkdirSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser, type Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";
import { VARIANT_PAIRS } from "@teardown/seed-demo/scenario-expectations";
import { startApp, type RunningApp } from "./app-process.js";
import { textContaining, textMatching } from "./page-waits.js";

const CHROMIUM = "/usr/bin/chromium";
const CHROMIUM_ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run"];
const SHOTS = path.join(projectRoot(), "tests", "e2e", "screenshots", "compare");
/** The one worker analyses every demo revision in turn; the bulbs come after a slow ionizer. */
const ANALYSES_TIMEOUT_MS = 900_000;
const STEP_TIMEOUT_MS = 30_000;
const DEMO_EMAIL = "maren@fernhollow.example";
const DEMO_PASSWORD = "fernhollow-demo-lab";

const missing = !existsSync(CHROMIUM) && !process.env.CI;
const bulbs = VARIANT_PAIRS.find((p) => p.a === "lumora-led-bulb-l24a")!;

describe.skipIf(missing)("comparing two teardowns in the browser", () => {
  let app: RunningApp;
  let browser: Browser;
  let page: Page;
  const ids = new Map<string, string>();

  async function shot(name: string): Promise<void> {
    await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true });
  }

  /** Polls the compare API until both sides have a finished analysis (so both draw a schematic). */
  async function analysed(query: string): Promise<void> {
    const deadline = Date.now() + ANALYSES_TIMEOUT_MS;
    for (;;) {
      const res = await page.request.get(`${app.url}/api/compare?${query}`);
      const body = (await res.json()) as { a?: { analysis: unknown }; b?: { analysis: unknown } };
      if (res.status() === 200 && body.a?.analysis && body.b?.analysis) return;
      if (Date.now() > deadline) throw new Error(`analyses not done for ${query}`);
      await new Promise((r) => setTimeout(r, 3000));
    }
  }

  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true });
    app = await startApp();
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    page = await context.newPage();
    page.setDefaultTimeout(STEP_TIMEOUT_MS);
    await page.goto(`${app.url}/sign-in`);
    await page.fill('input[name="email"]', DEMO_EMAIL);
    await page.fill('input[name="password"]', DEMO_PASSWORD);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
    const listed = (await (await page.request.get(`${app.url}/api/entries?limit=100`)).json()) as {
      entries: { id: string; title: string }[];
    };
    for (const e of listed.entries) {
      if (/L24A/.test(e.title)) ids.set("lumora-led-bulb-l24a", e.id);
      if (/L24C/.test(e.title)) ids.set("lumora-led-bulb-l24c", e.id);
    }
  }, 360_000);

  afterAll(async () => {
    await browser?.close().catch(() => {});
    await app?.stop();
  }, 60_000);

  it(
    "picks the second bulb batch from the list and shows both boards matched part for part",
    async () => {
      const a = ids.get(bulbs.a)!;
      const b = ids.get(bulbs.b)!;
      await analysed(`a=${a}&b=${b}`);
      await page.goto(`${app.url}/compare?a=${a}`);
      const picker = page.getByTestId("compare-picker");
      await textContaining(picker, "L24C");
      await shot("01-pick-the-second-board");
      await picker.getByRole("link", { name: /L24C/ }).click();
      await page.waitForURL((u) => u.searchParams.get("b") === b);
      const parts = page.getByTestId("compare-parts");
      await textContaining(parts, "only on B");
      // Every renamed part pairs with its new name; exactly the fuse and the dropper differ.
      for (const [from, to] of Object.entries(bulbs.renamed)) {
        const row = parts.locator(`tr[data-pair="${from}:${to}"]`);
        expect(await row.count(), `${from} ↔ ${to}`).toBe(1);
        const differs = from === "RF1" || from === "CX1";
        expect(await row.getAttribute("data-differs")).toBe(differs ? "yes" : "no");
      }
      expect(await parts.locator('tr[data-differs="yes"]').count()).toBe(2);
      expect(await parts.locator('tr[data-only="B"]').innerText()).toContain("R3");
      // The same pair number sits on the dropper on both schematics; the bleeder is hatched on B.
      const tagA = page.getByTestId("compare-board-A").locator('g[data-compare-ref="CX1"]');
      const tagB = page.getByTestId("compare-board-B").locator('g[data-compare-ref="C1"]');
      const tag = await tagA.getAttribute("data-compare-tag");
      expect(tag).toMatch(/^#\d+ ≠$/);
      expect(await tagB.getAttribute("data-compare-tag")).toBe(tag);
      expect(
        await page
          .getByTestId("compare-board-B")
          .locator('rect[data-compare="only"][data-compare-ref="R3"]')
          .count(),
      ).toBe(1);
      const figures = page.getByTestId("compare-figures");
      await textContaining(figures, "input current (RMS)");
      await textMatching(figures.locator(".caution"), /can kill/);
      await shot("02-bulb-batches-side-by-side");
      await page.getByTestId("compare-schematics").screenshot({
        path: path.join(SHOTS, "03-bulb-schematics.png"),
      });
    },
    ANALYSES_TIMEOUT_MS + 120_000,
  );

  it(
    "compares two revisions of one entry and shows what the change did to the analysis",
    async () => {
      const c = ids.get("lumora-led-bulb-l24c")!;
      await analysed(`a=${c}&b=${c}&aRevision=1&bRevision=2`);
      await page.goto(`${app.url}/compare?a=${c}&b=${c}&aRevision=1&bRevision=2`);
      const parts = page.getByTestId("compare-parts");
      await textContaining(parts, "only on B");
      expect(await parts.locator('tr[data-differs="yes"]').count()).toBe(0);
      expect(await parts.locator('tr[data-only="B"]').innerText()).toContain("R3");
      await textContaining(page.getByTestId("compare-flags"), "Only on A");
      await shot("04-revisions-side-by-side");

      await page.goto(`${app.url}/entries/${c}/diff?from=1&to=2`);
      const change = page.getByTestId("analysis-change");
      await textContaining(change, "input power");
      await textMatching(change.locator(".caution"), /can kill/);
      await shot("05-revision-diff-analysis-change");
    },
    ANALYSES_TIMEOUT_MS + 120_000,
  );
});
