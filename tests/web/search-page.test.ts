/**
 * The search page's pure helpers: its state survives the trip through the URL, the server's
 * snippet becomes text pieces and never markup, and a fragment's parts are marked on a demo
 * schematic exactly where the layout put them.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { layoutSchematic, readCircuitFile } from "@teardown/engine";
import { projectRoot } from "@teardown/db";
import { snippetPieces } from "@/app/components/search/snippet-parts";
import { markedSchematicSvg } from "@/app/components/search/schematic-marks";
import {
  emptyTextSearch,
  readSearchState,
  searchApiUrl,
  searchHref,
  toggleFacetValue,
  type SearchState,
} from "@/app/components/search/search-url";

function roundTrip(s: SearchState): SearchState {
  const href = searchHref(s);
  return readSearchState(new URLSearchParams(href.split("?")[1] ?? ""));
}

describe("the search state in the URL", () => {
  it("keeps words, several values of one facet, other facets and the cursor", () => {
    let s = { ...emptyTextSearch(), q: 'dropper "night light"' };
    s = toggleFacetValue(s, "category", "night light");
    s = toggleFacetValue(s, "category", "LED lamp");
    s = toggleFacetValue(s, "flag", "no-fuse");
    s = { ...s, cursor: "abc.def" };
    const back = roundTrip(s);
    expect(back).toEqual(s);
    expect(searchHref(s)).toBe(
      "/search?q=dropper+%22night+light%22&category=LED+lamp&category=night+light&flag=no-fuse&cursor=abc.def",
    );
  });

  it("unpicks a picked value and goes back to the first page", () => {
    const picked = { ...toggleFacetValue(emptyTextSearch(), "block", "bleeder"), cursor: "x" };
    const unpicked = toggleFacetValue(picked, "block", "bleeder");
    expect(unpicked.filters.block).toEqual([]);
    expect(unpicked.cursor).toBeNull();
    expect(searchHref(unpicked)).toBe("/search");
  });

  it("asks the API for one page with every picked value as its own parameter", () => {
    const s = toggleFacetValue(toggleFacetValue(emptyTextSearch(), "team", "t1"), "team", "t2");
    const url = new URL(searchApiUrl(s), "http://x");
    expect(url.pathname).toBe("/api/search");
    expect(url.searchParams.getAll("team")).toEqual(["t1", "t2"]);
    expect(url.searchParams.get("limit")).toBe("20");
  });

  it("reads the similar and fragment views, and falls back to a deck for an unknown format", () => {
    expect(roundTrip({ view: "similar", entryId: "e-1" })).toEqual({
      view: "similar",
      entryId: "e-1",
    });
    const frag = { view: "fragment", text: "C1 X Y\nR1 X Y", format: "csv" } as const;
    expect(roundTrip(frag)).toEqual(frag);
    expect(readSearchState(new URLSearchParams("view=fragment&format=pdf"))).toEqual({
      view: "fragment",
      text: "",
      format: "deck",
    });
  });
});

describe("the snippet", () => {
  it("splits marked words from plain text and undoes the five escapes", () => {
    expect(
      snippetPieces("Dropper &quot;334K&quot; <mark>night</mark> &amp; <mark>light</mark>"),
    ).toEqual([
      { text: 'Dropper "334K" ', marked: false },
      { text: "night", marked: true },
      { text: " & ", marked: false },
      { text: "light", marked: true },
    ]);
  });

  it("keeps escaped markup and unexpected tags as text pieces, so React shows them as text", () => {
    const pieces = snippetPieces(
      '&lt;script&gt;x()&lt;/script&gt; <mark>lamp</mark> <img src=x onerror="y()">',
    );
    expect(pieces).toEqual([
      { text: "<script>x()</script> ", marked: false },
      { text: "lamp", marked: true },
      { text: ' <img src=x onerror="y()">', marked: false },
    ]);
  });

  it("leaves an unknown escape as it is and marks nothing after a stray closing marker", () => {
    expect(snippetPieces("a &nbsp; </mark>b")).toEqual([
      { text: "a &nbsp; ", marked: false },
      { text: "b", marked: false },
    ]);
  });
});

describe("the fragment's marks on a schematic", () => {
  it("frames each matched part at its laid-out box and tags it with the fragment's ref", async () => {
    const file = path.join(projectRoot(), "seed-demo", "records", "glowmoth-night-light.yaml");
    const parsed = readCircuitFile(readFileSync(file, "utf8"), { filename: "g.yaml" });
    if (!parsed.ok) throw new Error("demo record does not parse");
    const laid = await layoutSchematic(parsed.record);
    if (!laid.ok) throw new Error(laid.message);
    const svg = markedSchematicSvg(laid.layout, { C1: "CX", R1: "RB" });
    expect(svg.match(/data-matched="/g)).toHaveLength(2);
    expect(svg).toMatch(/<g data-ref="C1" data-matched="CX" /);
    expect(svg).toMatch(/<g data-ref="R1" data-matched="RB" /);
    expect(svg).not.toMatch(/data-ref="R2" data-matched/);
    const c1 = laid.layout.parts.find((p) => p.ref === "C1")!;
    const frame =
      /<g data-match-frame="C1"><rect x="([\d.-]+)" y="([\d.-]+)" width="([\d.]+)"/.exec(svg);
    expect(frame).not.toBeNull();
    // 5 units of gap on each side of the part's box.
    expect(Number(frame![1])).toBeCloseTo(c1.x - 5, 1);
    expect(Number(frame![2])).toBeCloseTo(c1.y - 5, 1);
    expect(Number(frame![3])).toBeCloseTo(c1.width + 10, 1);
    expect(svg).toContain(">= CX</text>");
    expect(svg.trimEnd().endsWith("</svg>")).toBe(true);
    expect(svg.match(/<svg/g)).toHaveLength(1);
  });
});
