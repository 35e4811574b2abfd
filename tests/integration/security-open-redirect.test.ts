// Finding 4: after sign-in, `next=%2F%09%2F127.0.0.2%3A9%2Fowned` left the site, because the
// browser drops the tab and reads `//127.0.0.2:9/owned` as another host. Now `next` is kept only
// when a browser would resolve it to this same origin.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { safeNext } from "@/app/client/safe-next";

const ORIGIN = "http://app.test";

/** Where a browser goes for `next` (WHATWG URL parsing, which strips tabs and newlines). */
function landsOn(next: string): string {
  return new URL(next, ORIGIN).origin;
}

describe("the page after sign-in", () => {
  it("refuses the reported payload and its relatives", () => {
    const payloads = [
      decodeURIComponent("%2F%09%2F127.0.0.2%3A9%2Fowned"),
      "/\n/evil.example",
      "/\r/evil.example",
      "/\\evil.example",
      "\\/evil.example",
      "//evil.example",
      "/%09/evil.example/".replace("%09", "\t"),
      "https://evil.example",
      " /teams",
      "javascript:alert(1)",
    ];
    for (const p of payloads) {
      expect(safeNext(p), JSON.stringify(p)).toBe("/teams");
      expect(landsOn(safeNext(p))).toBe(ORIGIN);
    }
  });

  it("keeps ordinary paths on this site as they are", () => {
    expect(safeNext("/entries/5b0e7c52-8a3a-4d4e-9a57-0d5c1b0c3e11?tab=flags#f2")).toBe(
      "/entries/5b0e7c52-8a3a-4d4e-9a57-0d5c1b0c3e11?tab=flags#f2",
    );
    expect(safeNext("/invite/abc")).toBe("/invite/abc");
    expect(safeNext(null)).toBe("/teams");
  });

  it("never leads off the origin, for any string (checked by the URL parser itself)", () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc.string(),
          fc.stringMatching(/^[/\\\t\n\r .:@a-z0-9%]{0,16}$/),
          fc.constantFrom("/", "//", "/\t/", "/\\", "\t//"),
        ),
        (s) => landsOn(safeNext(s)) === ORIGIN,
      ),
      { numRuns: 5000 },
    );
  });
});
