/**
 * Block recognition inside larger boards: the 30-part multi-branch board (expected blocks worked
 * out by hand from its netlist, see its file comment), and every hand-made circuit hung in
 * parallel with the board and with each other, where the expectation is what each circuit gives
 * alone (an independent run of the finder on the separate circuits).
 */
import { describe, expect, it } from "vitest";
import { BLOCK_KINDS, findBlocks, type Block } from "@teardown/engine";
import { ALL_TEST_CIRCUITS } from "../../support/circuits/all-test-circuits.js";
import { multiBranchBoard } from "../../support/circuits/multi-branch-board.js";
import { mergeRecords, mergedNames } from "../../support/circuits/merge-records.js";
import { part, record } from "../../support/record-factory.js";
import { namesOf, renameRecord } from "../../support/circuits/rename-record.js";

const key = (b: Block): string => `${b.kind}:${[...b.parts].sort().join(",")}`;
const keys = (blocks: Block[]): string[] => blocks.map(key).sort();

describe("the 30-part multi-branch board", () => {
  const board = multiBranchBoard();

  it("has 30 parts", () => expect(board.parts).toHaveLength(30));

  it("gives exactly the blocks worked out by hand", () => {
    expect(findBlocks(board)).toEqual([
      { kind: "fuse", parts: ["F1"] },
      { kind: "surge-limiter", parts: ["R1"] },
      { kind: "surge-limiter", parts: ["RV1"] },
      { kind: "capacitive-dropper", parts: ["C1", "R1", "R2"] },
      { kind: "bleeder", parts: ["C1", "R2"] },
      { kind: "bridge-rectifier", parts: ["D1", "D2", "D3", "D4"] },
      { kind: "half-wave-rectifier", parts: ["D6"] },
      { kind: "reverse-protection", parts: ["D5", "LED1"] },
      { kind: "smoothing-capacitor", parts: ["C2"] },
      { kind: "zener-shunt-regulator", parts: ["Z1"] },
      { kind: "voltage-divider", parts: ["R10", "R11"] },
      { kind: "thyristor-trigger", parts: ["Q1", "R10", "R11"] },
      { kind: "triac-trigger", parts: ["C3", "R5", "R6", "TR1"] },
      { kind: "pulse-transformer", parts: ["C5", "Q1", "T1"] },
    ]);
  });

  it("gives the same blocks with every ref and net renamed and the parts in reverse or rotated order", () => {
    const { refs, nets } = namesOf(board);
    const refOf = (r: string): string => `Z${refs.indexOf(r) * 37}`;
    const netOf = (n: string): string =>
      board.nets[n]!.role === null ? `w${nets.indexOf(n) * 11}` : `${n}_mains`;
    const n = board.parts.length;
    const orders = [board.parts.map((_, i) => n - 1 - i), board.parts.map((_, i) => (i + 13) % n)];
    for (const order of orders) {
      const renamed = renameRecord(board, refOf, netOf, order);
      expect(keys(findBlocks(renamed))).toEqual(
        keys(findBlocks(board).map((b) => ({ ...b, parts: b.parts.map(refOf) }))),
      );
    }
  });

  it("holds every block kind", () => {
    expect([...new Set(findBlocks(board).map((b) => b.kind))].sort()).toEqual(
      [...BLOCK_KINDS].sort(),
    );
  });

  it("calls neither the snubber nor the gate capacitor a dropper, nor the LED's reverse diode a rectifier", () => {
    const blocks = findBlocks(board);
    const droppers = blocks.filter((b) => b.kind === "capacitive-dropper").flatMap((b) => b.parts);
    expect(droppers).not.toContain("C3");
    expect(droppers).not.toContain("C4");
    const halfWave = blocks.filter((b) => b.kind === "half-wave-rectifier").flatMap((b) => b.parts);
    expect(halfWave).not.toContain("D5");
  });
});

describe("every circuit in parallel with other branches", () => {
  const working = ALL_TEST_CIRCUITS.filter((c) => !c.nearMiss);

  /** The blocks the merged board must show: each circuit's own blocks, renamed. */
  function expectedUnion(
    a: ReturnType<typeof multiBranchBoard>,
    b: ReturnType<typeof multiBranchBoard>,
    tag: string,
  ): string[] {
    const { refOf } = mergedNames(a, b, tag);
    const moved = findBlocks(b).map((blk) => ({ ...blk, parts: blk.parts.map(refOf) }));
    return keys([...findBlocks(a), ...moved]);
  }

  for (const c of ALL_TEST_CIRCUITS) {
    it(`finds in ${c.name} hung beside the 30-part board what each shows alone`, () => {
      const board = multiBranchBoard();
      const merged = mergeRecords(board, c.record, "x");
      expect(keys(findBlocks(merged))).toEqual(expectedUnion(board, c.record, "x"));
    });
  }

  it("finds in every pair of working circuits on one mains what each shows alone", () => {
    for (const a of working)
      for (const b of working) {
        if (a === b) continue;
        const merged = mergeRecords(a.record, b.record, "y");
        expect(keys(findBlocks(merged)), `${a.name} + ${b.name}`).toEqual(
          expectedUnion(a.record, b.record, "y"),
        );
      }
  });

  it("finds every block kind in the hand-made circuits each hung beside another", () => {
    const kinds = new Set<string>();
    for (let i = 0; i < working.length; i++) {
      const a = working[i]!;
      const b = working[(i + 1) % working.length]!;
      for (const blk of findBlocks(mergeRecords(a.record, b.record, "z"))) kinds.add(blk.kind);
    }
    expect([...kinds].sort()).toEqual([...BLOCK_KINDS].sort());
  });
});

describe("capacitive droppers whatever they feed", () => {
  const MAINS = { L: { role: "line" as const }, N: { role: "neutral" as const } };

  it("sees a dropper with its bleeder feeding a plain resistor, with no rectifier", () => {
    const rec = record(
      [
        part("C1", "capacitor", ["L", "A"], 470e-9),
        part("R1", "resistor", ["L", "A"], 1e6),
        part("R2", "resistor", ["A", "N"], 470),
      ],
      MAINS,
    );
    expect(findBlocks(rec)).toEqual([
      { kind: "capacitive-dropper", parts: ["C1", "R1"] },
      { kind: "bleeder", parts: ["C1", "R1"] },
    ]);
  });

  it("sees a dropper feeding a heater load, and the same dropper with a lamp and an indicator beside it", () => {
    const alone = record(
      [
        part("C1", "capacitor", ["L", "A"], 1e-6),
        part("R1", "resistor", ["L", "A"], 1e6),
        part("HT1", "load", ["A", "N"], null, { model: { r: 100 } }),
      ],
      MAINS,
    );
    const crowded = record(
      [
        ...alone.parts,
        part("LAMP1", "load", ["L", "N"], null, { model: { r: 529 } }),
        part("R9", "resistor", ["L", "K"], 100e3),
        part("LED9", "led", { anode: "K", cathode: "N" }),
      ],
      MAINS,
    );
    const dropper = { kind: "capacitive-dropper", parts: ["C1", "R1"] };
    expect(findBlocks(alone)).toContainEqual(dropper);
    expect(findBlocks(crowded)).toContainEqual(dropper);
  });

  it("does not take an electrolytic capacitor to neutral for a dropper (it cannot pass AC in series)", () => {
    const rec = record(
      [
        part("D1", "diode", { anode: "L", cathode: "P" }),
        part("C1", "capacitor", { plus: "P", minus: "N" }, 47e-6, { polarised: true }),
        part("LOAD1", "load", ["P", "N"], null, { model: { r: 1e3 } }),
      ],
      MAINS,
    );
    expect(findBlocks(rec).map((b) => b.kind)).toEqual([
      "half-wave-rectifier",
      "smoothing-capacitor",
    ]);
  });
});
