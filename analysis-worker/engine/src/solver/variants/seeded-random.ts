/**
 * A small seeded pseudo-random generator (mulberry32, a 32-bit mixing generator), so that
 * tolerance bands are repeatable: the same record and seed give the same samples.
 */

/** A generator of uniform numbers in [0, 1). */
export type RandomSource = () => number;

/** mulberry32: 32-bit state, period 2^32; ample for a few thousand tolerance draws. */
export function mulberry32(seed: number): RandomSource {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A uniform draw in [lo, hi). */
export function uniformBetween(random: RandomSource, lo: number, hi: number): number {
  return lo + (hi - lo) * random();
}
