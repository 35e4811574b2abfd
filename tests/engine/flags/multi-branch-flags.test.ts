/**
 * Flags that depend on recognising the supply side must still fire on a board with several
 * branches on the same fused line: the dropper there sits behind a surge resistor on one branch
 * of many, not on the first run from the line. The expectations come from the board's drawing
 * (tests/support/circuits/multi-branch-board.ts): C1 is the logic supply's dropper. The igniter
 * branch is taken off (its pulse stage is slow to solve and has no bearing on these flags), which
 * leaves 22 parts on four branches.
 */
import { describe, expect, it } from "vitest";
import type { TeardownRecord } from "@teardown/engine";
import { multiBranchBoard } from "../../support/circuits/multi-branch-board.js";
import { assess } from "./flag-circuits.js";

const IGNITER = new Set(["D6", "R9", "C5", "T1", "Q1", "R10", "R11", "SG1"]);

/** The board without its igniter branch. */
function boardWithoutIgniter(): TeardownRecord {
  const board = multiBranchBoard();
  const { HV: _hv, ...nets } = board.nets;
  return { ...board, nets, parts: board.parts.filter((p) => !IGNITER.has(p.ref)) };
}

/** That board with the dropper's safety class taken off its rating. */
function boardWithUnclassedDropper(): TeardownRecord {
  const board = boardWithoutIgniter();
  return {
    ...board,
    parts: board.parts.map((p) =>
      p.ref === "C1" ? { ...p, rating: { ...p.rating, class: undefined } } : p,
    ),
  };
}

describe("flags on a 30-part board with parallel branches", () => {
  it("asks for a safety class on the dropper capacitor behind the surge resistor", () => {
    const flags = assess(boardWithUnclassedDropper(), 2).flags;
    const cls = flags.filter((f) => f.code === "capacitor-class");
    expect(cls.map((f) => f.parts)).toContainEqual(["C1"]);
    expect(cls.find((f) => f.parts[0] === "C1")!.message).toContain("series");
  }, 120_000);

  it("raises no capacitor-class flag when the dropper is rated X2, and sees the fuse in the supply path", () => {
    const codes = assess(boardWithoutIgniter(), 2).flags.map((f) => f.code);
    expect(codes).not.toContain("no-fuse");
    expect(codes.filter((c) => c === "capacitor-class")).toEqual([]);
  }, 120_000);
});
