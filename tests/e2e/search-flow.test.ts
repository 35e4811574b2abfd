// The search page in a real browser (Debian's Chromium through playwright-core) on the demo data,
// started the way a user starts it: a demo member searches by words from the home page, narrows
// by two facets (and Back undoes one), opens an entry, lists its similar circuits, and pastes a
// fragment whose parts are then marked on an entry's schematic; a signed-out visitor's search
// neither shows nor counts the team-only batch. The expectations come from the demo records and
// scenario (which gadgets are night lights, which batch is team-only, which refs the fragment's
// parts are), not from the search code.
import { existsSync, mkdirSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser, type Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";
import { DEMO_TEAM } from "@teardown/seed-demo";
import { startApp, type RunningApp } from "./app-process.js";
import { attributeMatching, textContaining, textMatching } from "./page-waits.js";

const CHROMIUM = "/usr/bin/chromium";
const CHROMIUM_ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--no-first-run",
];
const ROOT = projectRoot();
const SHOTS = path.join(ROOT, "tests", "e2e", "screenshots", "search-flow");
/** The demo owner's sign-in (printed by `npm start`, in the README on purpose). */
const DEMO_EMAIL = "maren@fernhollow.example";
const DEMO_PASSWORD = "fernhollow-demo-lab";
/** The demo night lights: batch 1 is public, batch 2 team-only (seed-demo/records/README.md). */
const BATCH1 = "Glowmoth plug-in night light, amber";
const BATCH2 = "Glowmoth plug-in night light, amber, batch 2";
/** How long the worker may take to analyse the demo entries this test reads, on two busy cores. */
const ANALYSES_TIMEOUT_MS = 600_000;
const STEP_TIMEOUT_MS = 20_000;

/**
 * A dropper capacitor with a resistor across it, then a resistor in series, as a deck. In the
 * batch 1 record C1 and R1 both sit on L–A and R2 on A–B, and no other resistor shares C1's two
 * nets, so the one place it fits there is C1→C1, R1→R1, R2→R2.
 */
const FRAGMENT_DECK = [
  "Dropper, bleeder, series resistor",
  "C1 X Y",
  "R1 X Y",
  "R2 Y Z",
  ".end",
].join("\n");

const missing = !existsSync(CHROMIUM) && !process.env.CI;
const title = missing
  ? `search flow (skipped: ${CHROMIUM} is missing; install Debian's chromium to run it)`
  : "search flow: words, two facets, entry, similar circuits, fragment on the schematic";

interface ListedEntry {
  id: string;
  title: string;
  analysisState: string | null;
  blocks: string[];
}

describe.skipIf(missing)(title, () => {
  let app: RunningApp;
  let browser: Browser;
  let page: Page;
  let batch1Id = "";
  let batch2Id = "";
  let shotNumber = 0;

  async function shot(p: Page, name: string): Promise<void> {
    shotNumber += 1;
    await p.screenshot({
      path: path.join(SHOTS, `${String(shotNumber).padStart(2, "0")}-${name}.png`),
      fullPage: true,
    });
  }

  /** The titles of the listed hits, in order. */
  async function hitTitles(list: string): Promise<string[]> {
    return page.getByTestId(list).locator(":scope > li a[href^='/entries/']").allInnerTexts();
  }

  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true });
    app = await startApp();
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    page = await context.newPage();
    page.setDefaultTimeout(STEP_TIMEOUT_MS);
  }, 330_000);

  afterAll(async () => {
    await browser?.close().catch(() => {});
    const replaced = app?.buildReplaced() ?? false;
    await app?.stop();
    if (replaced)
      throw new Error(
        "web/.next was rebuilt by another process while this test ran; failures above may come from that",
      );
  }, 60_000);

  it(
    "signs in as a demo member once the night lights are analysed and searchable",
    async () => {
      await page.goto(`${app.url}/sign-in?next=/search`);
      await page.fill('input[name="email"]', DEMO_EMAIL);
      await page.fill('input[name="password"]', DEMO_PASSWORD);
      await page.getByRole("button", { name: "Sign in" }).click();
      await page.waitForURL(`${app.url}/search`);
      // The worker analyses the demo after start; search reads what the analyses wrote.
      const deadline = Date.now() + ANALYSES_TIMEOUT_MS;
      for (;;) {
        const res = await page.request.get(`${app.url}/api/entries?limit=100`);
        const entries = ((await res.json()) as { entries: ListedEntry[] }).entries;
        const b1 = entries.find((e) => e.title === BATCH1);
        const b2 = entries.find((e) => e.title === BATCH2);
        if (b1?.analysisState === "done" && b2?.analysisState === "done") {
          // Both night lights hold a capacitive dropper (the engine's blocks for their records).
          const s = await page.request.get(
            `${app.url}/api/search?q=glowmoth&block=capacitive-dropper`,
          );
          const found = s.ok() ? ((await s.json()) as { results: unknown[] }).results.length : 0;
          if (found === 2) {
            batch1Id = b1.id;
            batch2Id = b2.id;
            break;
          }
        }
        if (Date.now() > deadline)
          throw new Error(
            `the night lights were not searchable in time: ${JSON.stringify([b1, b2])}`,
          );
        await new Promise((r) => setTimeout(r, 2000));
      }
    },
    ANALYSES_TIMEOUT_MS + 30_000,
  );

  it("searches by words from the home page and shows ranked hits with marked words", async () => {
    await page.goto(app.url);
    await page.fill('input[name="q"]', "night light");
    await page.getByRole("button", { name: "Search" }).click();
    await page.waitForURL(`${app.url}/search?q=night+light`);
    const results = page.getByTestId("entry-list");
    await textContaining(results, BATCH2);
    const titles = await hitTitles("entry-list");
    expect(titles).toContain(BATCH1);
    expect(titles).toContain(BATCH2);
    // The snippet's matched words are <mark> elements holding one of the words searched for.
    const marks = await results.locator("mark").allInnerTexts();
    expect(marks.length).toBeGreaterThan(0);
    for (const m of marks) expect(m.toLowerCase()).toMatch(/^(night|light)$/);
    expect(await results.locator("script, img").count()).toBe(0);
    await textMatching(results.locator("li").first(), /score \d+\.\d{3}/);
    await shot(page, "words");
  }, 60_000);

  it("narrows by two facets with counts, keeps them in the URL, and Back undoes the last", async () => {
    const category = page.locator('fieldset[data-facet="category"]');
    // Two demo gadgets are night lights, and the owner reads both.
    await textMatching(category, /night light\s*\(2\)/);
    // The team facet names the owner's own team.
    await textContaining(page.locator('fieldset[data-facet="team"]'), DEMO_TEAM.name);
    // A tick changes the URL; the box shows the URL's state, so it turns on once the page moves.
    await category.getByRole("checkbox", { name: /^night light/ }).click();
    await page.waitForURL(/category=night\+light/);
    const flag = page.locator('fieldset[data-facet="flag"]');
    // Both batches are flagged for having no fuse (seed-demo/scenario-expectations.ts).
    await textMatching(flag, /no-fuse\s*\(2\)/);
    await flag.getByRole("checkbox", { name: /^no-fuse/ }).click();
    await page.waitForURL(
      /category=night\+light.*flag=no-fuse|flag=no-fuse.*category=night\+light/,
    );
    await textContaining(page.getByTestId("entry-list"), BATCH1);
    expect((await hitTitles("entry-list")).sort()).toEqual([BATCH1, BATCH2].sort());
    expect(await flag.getByRole("checkbox", { name: /^no-fuse/ }).isChecked()).toBe(true);
    await shot(page, "two-facets");

    // Back undoes the last tick; Forward does it again.
    const twoFacets = page.url();
    await page.goBack();
    await page.waitForURL((u) => u.searchParams.has("category") && !u.searchParams.has("flag"));
    const noFuse = () =>
      page.locator('fieldset[data-facet="flag"]').getByRole("checkbox", { name: /^no-fuse/ });
    await noFuse().waitFor();
    expect(await noFuse().isChecked()).toBe(false);
    await page.goForward();
    await page.waitForURL(twoFacets);
    await textContaining(page.getByTestId("entry-list"), BATCH2);
    expect(await noFuse().isChecked()).toBe(true);

    // The URL alone brings the same search back in a fresh tab.
    const tab = await page.context().newPage();
    try {
      await tab.goto(twoFacets);
      await textContaining(tab.getByTestId("entry-list"), BATCH1);
      expect(
        await tab
          .locator('fieldset[data-facet="flag"]')
          .getByRole("checkbox", { name: /^no-fuse/ })
          .isChecked(),
      ).toBe(true);
    } finally {
      await tab.close();
    }
  }, 60_000);

  it("opens an entry, then its similar circuits with the twin batch first", async () => {
    await page.goto(`${app.url}/search?q=night+light&category=night+light&flag=no-fuse`);
    await page.getByTestId("entry-list").getByRole("link", { name: BATCH1, exact: true }).click();
    await page.waitForURL(`${app.url}/entries/${batch1Id}`);
    await textMatching(page.getByRole("heading", { level: 1 }), new RegExp(`^${BATCH1}`));
    await shot(page, "entry");

    // The entry page's "Similar circuits" link opens this address.
    await page.goto(`${app.url}/search?similar=${batch1Id}`);
    const similar = page.getByTestId("similar-results");
    await similar.waitFor();
    await textContaining(page.locator("#similar-heading"), BATCH1);
    const titles = await hitTitles("similar-results");
    expect(titles[0]).toBe(BATCH2);
    expect(titles).not.toContain(BATCH1);
    const first = similar.locator(":scope > li").first();
    await textMatching(first, /\d+%/);
    // Both batches hold a dropper with its bleeder (the engine's blocks for both records).
    await textMatching(first, /Shared blocks:.*bleeder.*capacitive dropper/);
    await attributeMatching(
      first.getByRole("link", { name: "Compare with the source" }),
      "href",
      new RegExp(`^/compare\\?a=${batch1Id}&b=${batch2Id}$`),
    );
    await shot(page, "similar");
  }, 60_000);

  it("finds a pasted fragment and marks its parts on the entry's schematic", async () => {
    await page.getByRole("link", { name: "Circuit fragment" }).click();
    await page.waitForURL(/view=fragment/);
    await page.getByRole("combobox", { name: "Format" }).selectOption("deck");
    await page.getByRole("textbox", { name: "Fragment" }).fill(FRAGMENT_DECK);
    await page.getByRole("button", { name: "Find fragment" }).click();
    await page.waitForURL(/view=fragment.*fragment=/);
    const results = page.getByTestId("fragment-results");
    await textContaining(results, BATCH1);
    const hit = results.locator(`:scope > li[data-entry-id="${batch1Id}"]`);
    const table = hit.getByTestId("fragment-match").first();
    const rows = (await table.locator("tbody tr").allInnerTexts()).map((r) =>
      r.replace(/\s+/g, " ").trim(),
    );
    expect(rows.sort()).toEqual(["C1 → C1", "R1 → R1", "R2 → R2"]);
    const schematic = hit.getByTestId("fragment-schematic");
    await schematic.locator("svg").waitFor();
    for (const ref of ["C1", "R1", "R2"])
      expect(await schematic.locator(`g[data-ref="${ref}"][data-matched="${ref}"]`).count()).toBe(
        1,
      );
    // Exactly the three fragment parts are marked: one frame and one tag each.
    expect(await schematic.locator("g[data-matched]").count()).toBe(3);
    expect(await schematic.locator("g[data-match-frame]").count()).toBe(3);
    expect(await schematic.getAttribute("aria-label")).toMatch(/C1 as C1.*R1 as R1.*R2 as R2/);
    await hit.scrollIntoViewIfNeeded();
    await shot(page, "fragment");
    await hit.screenshot({
      path: path.join(SHOTS, `${String(++shotNumber).padStart(2, "0")}-fragment-hit.png`),
    });

    // A fragment the reader refuses names its line.
    await page.getByRole("textbox", { name: "Fragment" }).fill("Broken\nC1 X\n.end");
    await page.getByRole("button", { name: "Find fragment" }).click();
    await textMatching(page.getByTestId("upload-problems"), /line 2/);
    await shot(page, "fragment-refused");
  }, 90_000);

  it("never shows or counts the team-only batch to a signed-out visitor", async () => {
    const outsider = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    try {
      await outsider.goto(`${app.url}/search?q=night+light`);
      const results = outsider.getByTestId("entry-list");
      await textContaining(results, BATCH1);
      expect(await results.innerText()).not.toContain(BATCH2);
      await textMatching(
        outsider.locator('fieldset[data-facet="category"]'),
        /night light\s*\(1\)/,
      );
      // Not a member: the team facet names no team, not even the one whose entry was found.
      const team = outsider.locator('fieldset[data-facet="team"]');
      await textContaining(team, "none under this search");
      expect(await team.innerText()).not.toContain(DEMO_TEAM.name);
      await shot(outsider, "signed-out");
    } finally {
      await outsider.close();
    }
  }, 60_000);
});
