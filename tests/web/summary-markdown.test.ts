/**
 * The summary's Markdown reader keeps HTML as text and links only http(s) addresses: the
 * expectations are written out by hand from the Markdown rules it follows (CommonMark's
 * emphasis, code spans, lists and links, reduced to what a summary needs).
 */
import { describe, expect, it } from "vitest";
import {
  inlineTokens,
  markdownBlocks,
  safeHref,
} from "@/app/components/entry/view/markdown-blocks";

describe("summary Markdown", () => {
  it("keeps raw HTML as plain text", () => {
    expect(inlineTokens('<script>alert(1)</script> <img src=x onerror="y">')).toEqual([
      { kind: "text", text: '<script>alert(1)</script> <img src=x onerror="y">' },
    ]);
  });

  it("links http(s) addresses only; a javascript: link stays text", () => {
    expect(safeHref("https://example.test/a")).toBe(true);
    expect(safeHref("javascript:alert(1)")).toBe(false);
    expect(inlineTokens("[x](javascript:alert(1))")[0]).toEqual({
      kind: "text",
      text: "[x](javascript:alert(1)",
    });
    expect(inlineTokens("see [notes](https://example.test/n)")).toEqual([
      { kind: "text", text: "see " },
      { kind: "link", href: "https://example.test/n", children: [{ kind: "text", text: "notes" }] },
    ]);
  });

  it("reads emphasis, code, lists and paragraphs", () => {
    expect(inlineTokens("a **b** *c* `d`")).toEqual([
      { kind: "text", text: "a " },
      { kind: "strong", children: [{ kind: "text", text: "b" }] },
      { kind: "text", text: " " },
      { kind: "em", children: [{ kind: "text", text: "c" }] },
      { kind: "text", text: " " },
      { kind: "code", text: "d" },
    ]);
    expect(markdownBlocks("one\ntwo\n\n- x\n- y\n\n1. z")).toEqual([
      { kind: "p", lines: ["one", "two"] },
      { kind: "ul", items: ["x", "y"] },
      { kind: "ol", items: ["z"] },
    ]);
  });
});
