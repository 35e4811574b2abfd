// The whole app in a real browser (Debian's Chromium through playwright-core), started the way a
// user starts it: two people sign up, one makes a team and invites the other with a link, the
// invitee joins; then an entry is made from a record file, gets a photo and its analysis, is
// revised in the form editor, and the diff between the two revisions shows the changed value.
import { existsSync, mkdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { projectRoot } from "@teardown/db";
import { startApp, type RunningApp } from "./app-process.js";
import { attributeMatching, textContaining, textMatching, valueIs } from "./page-waits.js";
import { makePng } from "./png-fixture.js";

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
const SHOTS = path.join(ROOT, "tests", "e2e", "screenshots");
const RECORD_FILE = path.join(ROOT, "seed-demo", "records", "glowmoth-night-light.yaml");
/** How long the worker may take to analyse the uploaded record. */
const ANALYSIS_TIMEOUT_MS = 90_000;
/** How long one page step may take (first renders compile nothing, but the machine has 2 cores). */
const STEP_TIMEOUT_MS = 20_000;

// In CI the browser must be there (.ci/run installs it); elsewhere a machine without it skips.
const missing = !existsSync(CHROMIUM) && !process.env.CI;
const title = missing
  ? `browser flow (skipped: ${CHROMIUM} is missing; install Debian's chromium to run it)`
  : "browser flow: sign-up, team, invite, entry, photo, analysis, revision, diff";

const UUID = "[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}";
const PASSWORD = "correct-horse-battery";

describe.skipIf(missing)(title, () => {
  let app: RunningApp;
  let browser: Browser;
  let ownerContext: BrowserContext;
  let inviteeContext: BrowserContext;
  let owner: Page;
  let invitee: Page;
  const stamp = Date.now().toString(36);
  const teamName = `Bench ${stamp}`;
  let teamId = "";
  let inviteUrl = "";
  let shotNumber = 0;

  async function shot(page: Page, name: string): Promise<void> {
    shotNumber += 1;
    await page.screenshot({
      path: path.join(SHOTS, `${String(shotNumber).padStart(2, "0")}-${name}.png`),
      fullPage: true,
    });
  }

  /** Waits until an entry list has loaded (rows, or the words saying there are none). */
  async function listSettled(page: Page): Promise<void> {
    await textMatching(page.locator(".entry-browser"), /No entries match|Updated/);
  }

  async function signUp(page: Page, startPath: string, name: string, email: string): Promise<void> {
    if (startPath) await page.goto(`${app.url}${startPath}`);
    await page.fill('input[name="name"]', name);
    await page.fill('input[name="email"]', email);
    await page.fill('input[name="password"]', PASSWORD);
    await page.getByRole("button", { name: "Create account" }).click();
  }

  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true });
    app = await startApp();
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    ownerContext = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    inviteeContext = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    owner = await ownerContext.newPage();
    invitee = await inviteeContext.newPage();
    owner.setDefaultTimeout(STEP_TIMEOUT_MS);
    invitee.setDefaultTimeout(STEP_TIMEOUT_MS);
  }, 330_000);

  afterAll(async () => {
    await browser?.close().catch(() => {});
    const replaced = app?.buildReplaced() ?? false;
    await app?.stop();
    // A server whose build folder is rebuilt under it serves broken pages; say so plainly.
    if (replaced)
      throw new Error(
        "web/.next was rebuilt by another process while this test ran (a start or `next build` on changed sources); failures above may come from that",
      );
  }, 60_000);

  it("lets one person make a team and another join it through an editor invite link", async () => {
    await owner.goto(app.url);
    await textMatching(owner.getByRole("heading", { level: 1 }), /Traced teardowns/);
    await owner.getByTestId("entry-list").waitFor();
    await shot(owner, "home-signed-out");

    await signUp(owner, "/sign-up", "Ada Owner", `ada-${stamp}@example.test`);
    await owner.waitForURL(`${app.url}/teams`);
    expect(await owner.getByRole("navigation", { name: "Main" }).innerText()).toMatch(
      /Teams[\s\S]*Settings[\s\S]*Sign out/,
    );
    await shot(owner, "teams-empty");

    await owner.fill('input[name="teamName"]', teamName);
    await owner.getByRole("button", { name: "Create team" }).click();
    await owner.waitForURL(new RegExp(`/teams/${UUID}$`));
    teamId = new URL(owner.url()).pathname.split("/")[2]!;
    await textMatching(owner.getByRole("heading", { level: 1 }), new RegExp(`^${teamName}$`));
    expect(await owner.getByRole("link", { name: "New entry" }).getAttribute("href")).toBe(
      `/entries/new?team=${teamId}`,
    );

    await owner.selectOption('select[name="inviteRole"]', "editor");
    await owner.getByRole("button", { name: "Create invite link" }).click();
    inviteUrl = (await owner.getByTestId("invite-link").innerText()).trim();
    expect(inviteUrl).toMatch(new RegExp(`^${app.url}/invite/[A-Za-z0-9_-]{20,}$`));
    await listSettled(owner);
    await shot(owner, "team-workspace-invite");

    // The invitee arrives signed out, signs up from the invite page and comes back to join.
    await invitee.goto(inviteUrl);
    await textMatching(invitee.getByTestId("invite-team"), new RegExp(`^${teamName}$`));
    await textMatching(invitee.getByTestId("invite-role"), /^editor$/);
    await shot(invitee, "invite-signed-out");
    await invitee.getByRole("link", { name: "Create an account to join" }).click();
    await invitee.waitForURL(/\/sign-up\?next=/);
    await signUp(invitee, "", "Bo Invitee", `bo-${stamp}@example.test`);
    await invitee.waitForURL(inviteUrl);
    await invitee.getByRole("button", { name: "Join team" }).click();
    await invitee.waitForURL(`${app.url}/teams/${teamId}`);
    const inviteeMembers = await invitee.getByTestId("member-list").innerText();
    expect(inviteeMembers).toMatch(/Bo Invitee[\s\S]*editor/);
    await listSettled(invitee);
    await shot(invitee, "team-as-invitee");

    // The link works once.
    await invitee.goto(inviteUrl);
    await textMatching(
      invitee.getByTestId("invite-problem"),
      /this invite was used or has expired/i,
    );

    // Signing out and back in returns to where the sign-in page was sent from.
    await invitee.getByRole("button", { name: "Sign out" }).click();
    await invitee.waitForURL(`${app.url}/`);
    await invitee.getByRole("link", { name: "Sign in", exact: true }).first().waitFor();
    await invitee.goto(`${app.url}/sign-in?next=/teams/${teamId}`);
    await invitee.fill('input[name="email"]', `bo-${stamp}@example.test`);
    await invitee.fill('input[name="password"]', "not-the-password");
    await invitee.getByRole("button", { name: "Sign in" }).click();
    await textMatching(invitee.locator("form .error-text"), /invalid|password/i);
    await shot(invitee, "sign-in-refused");
    await invitee.fill('input[name="password"]', PASSWORD);
    await invitee.getByRole("button", { name: "Sign in" }).click();
    await invitee.waitForURL(`${app.url}/teams/${teamId}`);

    await owner.reload();
    const members = owner.getByTestId("member-list");
    await textContaining(members, "Bo Invitee");
    expect(await members.getByRole("combobox", { name: "Role of Bo Invitee" }).inputValue()).toBe(
      "editor",
    );
  }, 120_000);

  it("shows a personal API token once, lists it and revokes it", async () => {
    await owner.goto(`${app.url}/settings`);
    await owner.fill('input[name="tokenName"]', "bench script");
    await owner.getByRole("button", { name: "Create token" }).click();
    const token = (await owner.getByTestId("new-token-value").innerText()).trim();
    expect(token).toMatch(/^tl_[A-Za-z0-9_-]{30,}$/);
    // The token really works as a bearer credential.
    const me = await fetch(`${app.url}/api/me`, { headers: { authorization: `Bearer ${token}` } });
    expect(me.status).toBe(200);
    expect(((await me.json()) as { user: { name: string } }).user.name).toBe("Ada Owner");
    await textContaining(owner.getByTestId("token-list"), "active");
    await shot(owner, "settings-token");
    owner.once("dialog", (d) => void d.accept());
    await owner.getByRole("button", { name: "Revoke" }).click();
    await textContaining(owner.getByTestId("token-list"), "revoked");
    expect(
      (await fetch(`${app.url}/api/me`, { headers: { authorization: `Bearer ${token}` } })).status,
    ).toBe(401);
  }, 60_000);

  it("finds public demo entries from the home page search", async () => {
    await owner.goto(app.url);
    await owner.fill('input[name="q"]', "night light");
    await owner.getByRole("button", { name: "Search" }).click();
    const results = owner.getByTestId("entry-list");
    await attributeMatching(
      results.getByRole("link").first(),
      "href",
      new RegExp(`^/entries/${UUID}$`),
    );
    await shot(owner, "home-search");
  }, 60_000);

  // The entry pages are built alongside this test; until all four exist, this part waits.
  const entryPagesExist = ["new", "[entryId]", "[entryId]/edit", "[entryId]/diff"].every((p) =>
    existsSync(path.join(ROOT, "web", "app", "entries", p, "page.tsx")),
  );
  it.skipIf(!entryPagesExist)(
    "makes an entry from a record file, adds a photo, revises a value and shows the diff",
    async () => {
      await owner.goto(`${app.url}/entries/new?team=${teamId}`);
      const upload = owner.locator("form", { has: owner.locator('input[name="recordFile"]') });
      await upload.locator('input[name="recordFile"]').setInputFiles(RECORD_FILE);
      await upload.locator('input[name="message"]').fill("first trace from the bench");
      await shot(owner, "entry-new");
      await upload.getByRole("button", { name: "Create entry" }).click();
      await owner.waitForURL(new RegExp(`/entries/${UUID}$`));
      const entryPath = new URL(owner.url()).pathname;
      await textMatching(owner.getByTestId("analysis-state"), /queued|running|done/);

      // Photos are one of the entry page's sections, opened by its tab.
      await owner.locator('[data-tab="photos"]').click();
      const photos = owner.locator("form", { has: owner.locator('input[name="photoFile"]') });
      await photos.locator('input[name="photoFile"]').setInputFiles({
        name: "component-side.png",
        mimeType: "image/png",
        buffer: makePng(64, 48),
      });
      await photos.locator('select[name="photoSide"]').selectOption("component");
      await photos.getByRole("button", { name: "Upload photo" }).click();
      await owner.locator(`img[src*="/photos/"]`).first().waitFor({ state: "visible" });

      await textMatching(owner.getByTestId("analysis-state"), /done/, ANALYSIS_TIMEOUT_MS);
      await shot(owner, "entry-analysed");

      await owner.getByRole("link", { name: "Edit", exact: true }).click();
      await owner.waitForURL(`${app.url}${entryPath}/edit`);
      const value = owner.locator('input[name="parts.0.value"]');
      await valueIs(value, "330n");
      await value.fill("470n");
      await owner.locator('input[name="message"]').fill("dropper re-read as 474K");
      await shot(owner, "entry-edit");
      await owner.getByRole("button", { name: "Save revision" }).click();
      await owner.waitForURL(`${app.url}${entryPath}`);

      await owner.goto(`${app.url}${entryPath}/diff?from=1&to=2`);
      const diff = owner.getByTestId("revision-diff");
      await textContaining(diff, "470n");
      await textContaining(diff, "C1");
      await shot(owner, "entry-diff");
    },
    180_000,
  );
});

// Keeps the record file the flow uploads honest: the value it edits must be what the test expects.
describe("the uploaded demo record", () => {
  it("has a first part whose value is 330n", () => {
    expect(readFileSync(RECORD_FILE, "utf8")).toMatch(
      /parts:\n {2}- \{ ref: C1, kind: capacitor, value: 330n,/,
    );
  });
});
