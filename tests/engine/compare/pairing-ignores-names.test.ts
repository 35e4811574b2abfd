// Renaming every ref (and every net) of one board and shuffling its part list changes nothing in
// the pairing but the names: the same parts pair, with the same confidence and the same verdict
// on their values. A fuse inserted in the line lead does not disturb the rest either.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compareBoards, type TeardownRecord } from "@teardown/engine";
import { VARIANT_PAIRS } from "@teardown/seed-demo/scenario-expectations";
import { part } from "../../support/record-factory.js";
import { renameRecord } from "../../support/circuits/rename-record.js";
import { demoRecord } from "./demo-record.js";

/** A renaming and a new order for a board: distinct new refs and nets, a permutation. */
function scramble(rec: TeardownRecord) {
  const n = rec.parts.length;
  const nets = Object.keys(rec.nets).length + rec.parts.length * 4;
  const name = fc.stringMatching(/^[A-Z][A-Za-z0-9_]{0,7}$/);
  return fc.record({
    refs: fc.uniqueArray(name, { minLength: n, maxLength: n }),
    nets: fc.uniqueArray(name, { minLength: nets, maxLength: nets }),
    keys: fc.array(fc.double({ noNaN: true }), { minLength: n, maxLength: n }),
  });
}

function applyScramble(
  rec: TeardownRecord,
  s: { refs: string[]; nets: string[]; keys: number[] },
): { renamed: TeardownRecord; refOf: (r: string) => string } {
  const refIndex = new Map(rec.parts.map((p, i) => [p.ref, i]));
  const netNames = [
    ...new Set([...Object.keys(rec.nets), ...rec.parts.flatMap((p) => Object.values(p.pins))]),
  ];
  const refOf = (r: string): string => s.refs[refIndex.get(r)!]!;
  const netOf = (n: string): string => s.nets[netNames.indexOf(n)]!;
  const order = rec.parts.map((_, i) => i).sort((i, j) => s.keys[i]! - s.keys[j]! || i - j);
  return { renamed: renameRecord(rec, refOf, netOf, order), refOf };
}

const boards = (x: TeardownRecord, y: TeardownRecord) =>
  compareBoards({ record: x, result: null }, { record: y, result: null }).parts;

describe.each(VARIANT_PAIRS)("pairing $a with $b", (pair) => {
  const a = demoRecord(pair.a);
  const b = demoRecord(pair.b);
  const plain = boards(a, b);

  it("does not change when every ref of the second board is renamed and its parts shuffled", () => {
    fc.assert(
      fc.property(scramble(b), (s) => {
        const { renamed, refOf } = applyScramble(b, s);
        const moved = boards(a, renamed);
        expect(moved.pairs.map((p) => [p.a, p.b, p.differs, p.confidence])).toEqual(
          plain.pairs.map((p) => [p.a, refOf(p.b), p.differs, p.confidence]),
        );
        expect(moved.onlyA).toEqual(plain.onlyA);
        expect([...moved.onlyB].sort()).toEqual(plain.onlyB.map(refOf).sort());
      }),
      { numRuns: 40, seed: 1312 },
    );
  });

  it("does not change when the first board is the one renamed and shuffled", () => {
    fc.assert(
      fc.property(scramble(a), (s) => {
        const { renamed, refOf } = applyScramble(a, s);
        const moved = boards(renamed, b);
        const key = (p: { a: string; b: string; differs: boolean; confidence: number }) => [
          p.b,
          p.a,
          p.differs,
          p.confidence,
        ];
        const byB = (x: unknown[], y: unknown[]) => (String(x[0]) < String(y[0]) ? -1 : 1);
        expect(moved.pairs.map(key).sort(byB)).toEqual(
          plain.pairs.map((p) => key({ ...p, a: refOf(p.a) })).sort(byB),
        );
        expect([...moved.onlyA].sort()).toEqual(plain.onlyA.map(refOf).sort());
        expect(moved.onlyB).toEqual(plain.onlyB);
      }),
      { numRuns: 40, seed: 2613 },
    );
  });
});

describe("a fuse inserted in the line lead", () => {
  it("leaves every other part paired with itself, fully confident, and the fuse alone", () => {
    const a = demoRecord("glowmoth-night-light");
    // The second board: the same circuit with a fuse between the line terminal and a new net.
    const b: TeardownRecord = {
      ...a,
      parts: [
        part("F9", "fuse", ["L", "LF"], 0.5),
        ...a.parts.map((p) => ({
          ...p,
          pins: Object.fromEntries(
            Object.entries(p.pins).map(([r, n]) => [r, n === "L" ? "LF" : n]),
          ),
        })),
      ],
    };
    const result = boards(a, b);
    expect(result.pairs.map((p) => [p.a, p.b])).toEqual(a.parts.map((p) => [p.ref, p.ref]).sort());
    expect(result.pairs.every((p) => p.confidence === 1 && !p.differs)).toBe(true);
    expect(result.onlyA).toEqual([]);
    expect(result.onlyB).toEqual(["F9"]);
  });
});
