/**
 * Waiting assertions for playwright-core pages (the core package has no `expect` matchers):
 * each polls until the page shows what is wanted, or fails with what it showed instead.
 */
import type { Locator } from "playwright-core";

/** How often a wait looks again. */
const POLL_MS = 200;
/** How long a wait lasts unless told. */
const DEFAULT_WAIT_MS = 20_000;

async function pollUntil<T>(
  read: () => Promise<T>,
  ok: (v: T) => boolean,
  ms: number,
  what: string,
): Promise<T> {
  const deadline = Date.now() + ms;
  let last: T | string = "(nothing yet)";
  for (;;) {
    try {
      const v = await read();
      last = v;
      if (ok(v)) return v;
    } catch (err) {
      last = `(${err instanceof Error ? err.message.split("\n")[0] : String(err)})`;
    }
    if (Date.now() > deadline)
      throw new Error(
        `timed out after ${ms} ms waiting for ${what}; last seen: ${JSON.stringify(last)}`,
      );
    await new Promise((r) => setTimeout(r, POLL_MS));
  }
}

/** Waits until the element's visible text matches; returns the text. */
export function textMatching(
  locator: Locator,
  pattern: RegExp,
  ms = DEFAULT_WAIT_MS,
): Promise<string> {
  return pollUntil(
    () => locator.innerText({ timeout: POLL_MS * 5 }),
    (t) => pattern.test(t),
    ms,
    `text ${pattern}`,
  );
}

/** Waits until the element's visible text contains `part`; returns the text. */
export function textContaining(
  locator: Locator,
  part: string,
  ms = DEFAULT_WAIT_MS,
): Promise<string> {
  return pollUntil(
    () => locator.innerText({ timeout: POLL_MS * 5 }),
    (t) => t.includes(part),
    ms,
    `text containing "${part}"`,
  );
}

/** Waits until the input's value equals `wanted`. */
export async function valueIs(
  locator: Locator,
  wanted: string,
  ms = DEFAULT_WAIT_MS,
): Promise<void> {
  await pollUntil(
    () => locator.inputValue({ timeout: POLL_MS * 5 }),
    (v) => v === wanted,
    ms,
    `value "${wanted}"`,
  );
}

/** Waits until the attribute matches; returns its value. */
export function attributeMatching(
  locator: Locator,
  name: string,
  pattern: RegExp,
  ms = DEFAULT_WAIT_MS,
): Promise<string | null> {
  return pollUntil(
    () => locator.getAttribute(name, { timeout: POLL_MS * 5 }),
    (v) => v !== null && pattern.test(v),
    ms,
    `${name} ${pattern}`,
  );
}
