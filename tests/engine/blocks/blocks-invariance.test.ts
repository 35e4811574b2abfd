import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { findBlocks, type Block } from "@teardown/engine";
import { ALL_TEST_CIRCUITS } from "../../support/circuits/all-test-circuits.js";
import { namesOf, renameRecord } from "../../support/circuits/rename-record.js";

/** Blocks as a sorted list of "kind:parts" strings, with parts mapped through `refOf`. */
function normalised(blocks: Block[], refOf: (ref: string) => string = (r) => r): string[] {
  return blocks.map((b) => `${b.kind}:${b.parts.map(refOf).sort().join(",")}`).sort();
}

describe("findBlocks under renaming and reordering", () => {
  it("gives the same blocks when refs and nets are renamed and the parts shuffled", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...ALL_TEST_CIRCUITS),
        fc.integer({ min: 0, max: 2 ** 31 - 1 }),
        (circuit, salt) => {
          const { refs, nets } = namesOf(circuit.record);
          const refMap = new Map(refs.map((r, i) => [r, `P${(i * 7919 + salt) % 100003}_${i}`]));
          const netMap = new Map(nets.map((n, i) => [n, `net${(i * 104729 + salt) % 65521}_${i}`]));
          const order = circuit.record.parts.map((_, i) => i);
          // A deterministic shuffle driven by the salt.
          for (let i = order.length - 1; i > 0; i--) {
            const j = (salt + i * 2654435761) % (i + 1);
            [order[i], order[j]] = [order[j]!, order[i]!];
          }
          const renamed = renameRecord(
            circuit.record,
            (r) => refMap.get(r)!,
            (n) => netMap.get(n)!,
            order,
          );
          expect(normalised(findBlocks(renamed))).toEqual(
            normalised(findBlocks(circuit.record), (r) => refMap.get(r)!),
          );
        },
      ),
      { seed: 20240611, numRuns: 120 },
    );
  });
});
