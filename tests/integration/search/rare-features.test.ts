// The similar-search candidate rule, checked against a brute-force reading of its contract: the
// chosen features are the rarest ones, their estimated reach fits the budget (unless one feature
// alone exceeds it, then exactly that one), and no further feature would have fitted in order.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  CANDIDATE_BUDGET_SHARE,
  MIN_CANDIDATE_BUDGET_ROWS,
  rareFeatures,
  type FeatureStats,
} from "@teardown/db";

describe("rare features", () => {
  it("takes every feature without statistics or when the table fits the budget", () => {
    expect(rareFeatures([3, 1, 2], null)).toEqual([3, 1, 2]);
    const small: FeatureStats = {
      rows: MIN_CANDIDATE_BUDGET_ROWS,
      common: new Map([[1, 0.9]]),
      floor: 0.01,
    };
    expect(rareFeatures([1, 2, 3], small)).toEqual([1, 2, 3]);
  });

  it("keeps the rarest prefix whose estimated reach fits the budget (property)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 10_000, max: 1_000_000 }),
        fc.uniqueArray(fc.integer({ min: -1000, max: 1000 }), { minLength: 1, maxLength: 60 }),
        fc.array(fc.double({ min: 0.0001, max: 0.9, noNaN: true }), {
          minLength: 60,
          maxLength: 60,
        }),
        fc.double({ min: 0.00001, max: 0.001, noNaN: true }),
        (rows, features, shares, floor) => {
          const common = new Map<number, number>();
          features.forEach((f, i) => i % 2 === 0 && common.set(f, shares[i]!));
          const stats: FeatureStats = { rows, common, floor };
          const chosen = rareFeatures(features, stats);
          const budget = Math.max(MIN_CANDIDATE_BUDGET_ROWS, CANDIDATE_BUDGET_SHARE * rows);
          const share = (f: number) => common.get(f) ?? floor;
          const byRarity = [...features].sort((a, b) => share(a) - share(b) || a - b);
          // Brute force: the longest prefix of the rarity order whose reach fits, at least one.
          let k = 0;
          let reach = 0;
          while (k < byRarity.length && (k === 0 || reach + share(byRarity[k]!) * rows <= budget)) {
            reach += share(byRarity[k]!) * rows;
            k++;
          }
          expect(chosen).toEqual(byRarity.slice(0, k).sort((a, b) => a - b));
        },
      ),
      { seed: 31, numRuns: 300 },
    );
  });
});
