// Every demo record's schematic in a real browser (Debian's Chromium through playwright-core):
// the record is laid out and drawn by the engine exactly as the entry page draws it (the same
// `renderSchematicSvg`), shown in a page, and screenshotted to tests/e2e/screenshots/schematics/.
// The same record laid out by the frozen layout from before the rework
// (tests/bench/legacy-layout) is drawn too, and a side-by-side picture (before left, now right)
// goes to schematics-compare/; the test prints both folders.
import { existsSync, mkdirSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  layoutSchematic,
  readCircuitFile,
  renderSchematicSvg,
  type SchematicLayout,
} from "@teardown/engine";
import { projectRoot } from "@teardown/db";
import { layoutSchematic as legacyLayout } from "../bench/legacy-layout/layout-schematic.js";

const CHROMIUM = "/usr/bin/chromium";
const CHROMIUM_ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run"];
const ROOT = projectRoot();
const RECORDS = path.join(ROOT, "seed-demo", "records");
const SHOTS = path.join(ROOT, "tests", "e2e", "screenshots");
const NOW_DIR = path.join(SHOTS, "schematics");
const BEFORE_DIR = path.join(SHOTS, "schematics-before");
const COMPARE_DIR = path.join(SHOTS, "schematics-compare");

const missing = !existsSync(CHROMIUM) && !process.env.CI;
const files = readdirSync(RECORDS)
  .filter((f) => f.endsWith(".yaml"))
  .sort();

describe.skipIf(missing)("demo schematics in the browser", () => {
  let browser: Browser;
  beforeAll(async () => {
    mkdirSync(NOW_DIR, { recursive: true });
    mkdirSync(COMPARE_DIR, { recursive: true });
    console.log(`schematic screenshots: ${NOW_DIR}; before and now side by side: ${COMPARE_DIR}`);
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
  });
  afterAll(async () => {
    await browser?.close();
  });

  it.each(files)("draws %s", async (file) => {
    const name = file.replace(/\.yaml$/, "");
    const parsed = readCircuitFile(readFileSync(path.join(RECORDS, file), "utf8"), {
      filename: file,
    });
    if (!parsed.ok) throw new Error(`${file} does not parse: ${parsed.errors[0]?.message}`);
    const laid = await layoutSchematic(parsed.record);
    if (!laid.ok) throw new Error(`${file}: ${laid.message}`);
    const page = await browser.newPage({ deviceScaleFactor: 1.5 });
    try {
      await page.setContent(
        `<!doctype html><body style="margin:0;background:#fff">${renderSchematicSvg(laid.layout)}</body>`,
      );
      const box = await page.locator("svg").boundingBox();
      // The drawing is as large as the layout says, so nothing is clipped or scaled.
      expect(box?.width).toBeCloseTo(laid.layout.width, 0);
      expect(box?.height).toBeCloseTo(laid.layout.height, 0);
      const shot = path.join(NOW_DIR, `${name}.png`);
      await page.locator("svg").screenshot({ path: shot });
      // The layout before the rework, drawn by today's renderer from its own geometry.
      const old = await legacyLayout(parsed.record);
      if (!old.ok) throw new Error(`${file} (layout before the rework): ${old.message}`);
      await page.setContent(
        `<!doctype html><body style="margin:0;background:#fff">${renderSchematicSvg(old.layout as unknown as SchematicLayout)}</body>`,
      );
      const before = path.join(BEFORE_DIR, `${name}.png`);
      mkdirSync(BEFORE_DIR, { recursive: true });
      await page.locator("svg").screenshot({ path: before });
      const img = (p: string): string =>
        `data:image/png;base64,${readFileSync(p).toString("base64")}`;
      await page.setContent(
        `<!doctype html><body style="margin:0;font:14px sans-serif;background:#ddd">` +
          `<table cellspacing="8"><tr><th>before</th><th>now</th></tr><tr>` +
          `<td valign="top"><img src="${img(before)}" style="zoom:0.6667"></td>` +
          `<td valign="top"><img src="${img(shot)}" style="zoom:0.6667"></td></tr></table></body>`,
      );
      await page.screenshot({ path: path.join(COMPARE_DIR, `${name}.png`), fullPage: true });
    } finally {
      await page.close();
    }
  });
});
