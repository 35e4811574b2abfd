/**
 * The sparse LU keeps its order between factorisations, re-pivots only when a pivot becomes
 * too small, agrees with the dense LU and reports the unknown of a singular matrix.
 */
import { describe, expect, it } from "vitest";
import { DenseLu, SparseLu } from "@teardown/engine";

function generator(seed: number) {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

function randomSparse(n: number, seed: number) {
  const r = generator(seed);
  const rows: number[] = [];
  const cols: number[] = [];
  for (let i = 0; i < n; i++) {
    rows.push(i);
    cols.push(i);
    for (let k = 0; k < 3; k++) {
      const j = Math.floor(r() * n);
      if (j !== i && !rows.some((q, s) => q === i && cols[s] === j)) {
        rows.push(i);
        cols.push(j);
      }
    }
  }
  const values = () => Float64Array.from(rows, (row, s) => (row === cols[s] ? 4 + r() : r() - 0.5));
  return { rows: Int32Array.from(rows), cols: Int32Array.from(cols), values, r };
}

function residual(
  rows: Int32Array,
  cols: Int32Array,
  v: Float64Array,
  x: Float64Array,
  b: Float64Array,
): number {
  const ax = new Float64Array(b.length);
  for (let s = 0; s < v.length; s++) ax[rows[s]!]! += v[s]! * x[cols[s]!]!;
  return Math.max(...ax.map((a, i) => Math.abs(a - b[i]!)));
}

describe("sparse LU", () => {
  it("solves random sparse systems like the dense LU and keeps its order across new values", () => {
    for (const seed of [1, 2, 3, 4, 5]) {
      const n = 60;
      const { rows, cols, values, r } = randomSparse(n, seed);
      const lu = new SparseLu(n, rows, cols);
      const dense = new DenseLu(n, rows, cols);
      let repivotsAfterFirst = 0;
      for (let rep = 0; rep < 5; rep++) {
        if (rep === 1) repivotsAfterFirst = lu.repivots;
        const v = values();
        const b = Float64Array.from({ length: n }, () => r() - 0.5);
        expect(lu.factor(v).ok).toBe(true);
        expect(dense.factor(v).ok).toBe(true);
        const xs = lu.solve(b);
        const xd = dense.solve(b);
        // Source: the residual of A x = b (a definition) and the dense LU as the second opinion.
        expect(residual(rows, cols, v, xs, b)).toBeLessThan(1e-12);
        for (let i = 0; i < n; i++) expect(xs[i]!).toBeCloseTo(xd[i]!, 10);
      }
      // The order chosen by the first numeric factorisation is kept for the next four.
      expect(lu.repivots).toBe(repivotsAfterFirst);
      expect(lu.factorizations).toBe(5);
    }
  });

  it("re-pivots when a kept pivot becomes zero and still solves", () => {
    // [[a, 1], [1, 1]]: the structural order pivots on the diagonal a; with a = 0 it must change.
    const rows = Int32Array.from([0, 0, 1, 1]);
    const cols = Int32Array.from([0, 1, 0, 1]);
    const lu = new SparseLu(2, rows, cols);
    expect(lu.factor(Float64Array.from([2, 1, 1, 1])).ok).toBe(true);
    expect(lu.repivots).toBe(0);
    expect(lu.factor(Float64Array.from([0, 1, 1, 1])).ok).toBe(true);
    expect(lu.repivots).toBe(1);
    const x = lu.solve(Float64Array.from([3, 5]));
    // Source: hand computation, x1 = 3 and x0 = 5 − 3 = 2.
    expect(x[0]).toBeCloseTo(2, 12);
    expect(x[1]).toBeCloseTo(3, 12);
  });

  it("reports the unknown that a singular matrix cannot determine", () => {
    // Unknown 2 appears in no equation's nonzero entries: its column is all zero.
    const rows = Int32Array.from([0, 1, 2, 2]);
    const cols = Int32Array.from([0, 1, 0, 2]);
    const lu = new SparseLu(3, rows, cols);
    const status = lu.factor(Float64Array.from([1, 1, 1, 0]));
    expect(status).toEqual({ ok: false, singularUnknown: 2 });
    const dense = new DenseLu(3, rows, cols);
    expect(dense.factor(Float64Array.from([1, 1, 1, 0]))).toEqual({
      ok: false,
      singularUnknown: 2,
    });
  });
});
