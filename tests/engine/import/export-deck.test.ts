import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { stringify } from "yaml";
import { exportDeck, parseRecord, readDeck, type TeardownRecord } from "@teardown/engine";
import { validRawRecord } from "../record/record-arbitraries.js";

const example = readFileSync(
  new URL("../record/fixtures/fragrance-warmer.yaml", import.meta.url),
  "utf8",
);

/** The circuit part of a record: what a deck carries. */
function circuit(r: TeardownRecord): unknown {
  return {
    parts: r.parts.map((p) => ({
      ref: p.ref,
      kind: p.kind,
      value: p.value,
      pins: p.pins,
      tolerance: p.tolerance,
      rating: p.rating,
      model: p.model,
      polarised: p.polarised,
      closed: p.closed,
      marking: p.marking,
    })),
    roles: Object.fromEntries(Object.entries(r.nets).map(([n, i]) => [n, [i.role, i.accessible]])),
    supply: r.device.rated_supply,
  };
}

describe("exportDeck", () => {
  const r = (() => {
    const result = parseRecord(example);
    if (!result.ok) throw new Error("example must parse");
    return result.record;
  })();

  it("writes element lines in the deck syntax", () => {
    const deck = exportDeck(r);
    expect(deck.split("\n").slice(0, 6)).toEqual([
      "Plug-in fragrance warmer, batch 2",
      ".supply 230 50",
      ".line L",
      ".neutral N",
      ".accessible CASE",
      'C1 L A 330n tol=0.1 volts=310 class=X2 marking="334K 310V~"',
    ]);
    expect(deck).toContain("R1 L A 1meg watts=250m");
    expect(deck).toContain("XQ1 P G M thyristor");
    expect(deck.trimEnd().endsWith(".end")).toBe(true);
  });

  it("reads back to the same circuit: parts, kinds, values, pins", () => {
    const back = readDeck(exportDeck(r));
    expect(back.ok).toBe(true);
    if (back.ok) {
      const nets = Object.fromEntries(
        Object.entries(r.nets).filter(
          ([n]) =>
            Object.values(r.parts).some((p) => Object.values(p.pins).includes(n)) ||
            r.nets[n]!.role !== null ||
            r.nets[n]!.accessible,
        ),
      );
      expect(circuit(back.record)).toEqual(circuit({ ...r, nets }));
    }
  });

  it("round-trips generated circuits", () => {
    fc.assert(
      fc.property(validRawRecord, (raw) => {
        const first = parseRecord(stringify(raw));
        if (!first.ok) throw new Error("generator made an invalid record");
        // a deck has no place for net notes or nets that no pin or role names
        const kept = Object.fromEntries(
          Object.entries(first.record.nets).filter(
            ([n, i]) =>
              i.role !== null ||
              i.accessible ||
              first.record.parts.some((p) => Object.values(p.pins).includes(n)),
          ),
        );
        const back = readDeck(exportDeck(first.record));
        if (!back.ok) throw new Error(JSON.stringify(back.errors));
        expect(circuit(back.record)).toEqual(circuit({ ...first.record, nets: kept }));
      }),
      { numRuns: 300 },
    );
  });
});
