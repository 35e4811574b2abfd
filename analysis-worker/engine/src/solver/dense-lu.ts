/**
 * Dense LU with partial pivoting, addressed through the same pattern slots as the sparse LU:
 * the fallback for tiny systems and the baseline of the solver benchmark.
 */
import type { FactorStatus, LinearSolver } from "./sparse-lu.js";
import { SINGULAR_PIVOT_ABS } from "./sparse-lu.js";

/** Dense LU (row pivoting) over an n x n matrix given by pattern slots. */
export class DenseLu implements LinearSolver {
  private readonly n: number;
  private readonly rows: Int32Array;
  private readonly cols: Int32Array;
  private readonly a: Float64Array;
  private readonly perm: Int32Array;
  private readonly lastValues: Float64Array;
  private haveLast = false;

  /** Slot s is the entry (rows[s], cols[s]). */
  constructor(n: number, rows: Int32Array, cols: Int32Array) {
    this.n = n;
    this.rows = rows;
    this.cols = cols;
    this.a = new Float64Array(n * n);
    this.perm = new Int32Array(n);
    this.lastValues = new Float64Array(rows.length);
  }

  /** Factorise in place; a column with no usable pivot names the unknown. */
  factor(values: Float64Array): FactorStatus {
    const { n, a, perm } = this;
    // The same matrix as last time (a linear circuit at a fixed step): keep the factors.
    if (this.haveLast) {
      let same = true;
      for (let s = 0; s < values.length && same; s++) same = values[s] === this.lastValues[s];
      if (same) return { ok: true };
    }
    this.haveLast = false;
    a.fill(0);
    for (let s = 0; s < values.length; s++) {
      a[this.rows[s]! * n + this.cols[s]!]! += values[s]!;
    }
    for (let i = 0; i < n; i++) perm[i] = i;
    for (let k = 0; k < n; k++) {
      let p = k;
      let best = Math.abs(a[k * n + k]!);
      for (let r = k + 1; r < n; r++) {
        const m = Math.abs(a[r * n + k]!);
        if (m > best) {
          best = m;
          p = r;
        }
      }
      if (!(best > SINGULAR_PIVOT_ABS)) return { ok: false, singularUnknown: k };
      if (p !== k) {
        for (let c = 0; c < n; c++) {
          const t = a[k * n + c]!;
          a[k * n + c] = a[p * n + c]!;
          a[p * n + c] = t;
        }
        const t = perm[k]!;
        perm[k] = perm[p]!;
        perm[p] = t;
      }
      const pivot = a[k * n + k]!;
      for (let r = k + 1; r < n; r++) {
        const l = a[r * n + k]! / pivot;
        if (l === 0) continue;
        a[r * n + k] = l;
        for (let c = k + 1; c < n; c++) a[r * n + c]! -= l * a[k * n + c]!;
      }
    }
    this.lastValues.set(values);
    this.haveLast = true;
    return { ok: true };
  }

  /** Forward and back substitution. */
  solve(rhs: Float64Array): Float64Array {
    const x = new Float64Array(this.n);
    this.solveInto(rhs, x);
    return x;
  }

  /** Forward and back substitution into `x`. */
  solveInto(rhs: Float64Array, x: Float64Array): void {
    const { n, a, perm } = this;
    for (let i = 0; i < n; i++) {
      let s = rhs[perm[i]!]!;
      for (let k = 0; k < i; k++) s -= a[i * n + k]! * x[k]!;
      x[i] = s;
    }
    for (let i = n - 1; i >= 0; i--) {
      let s = x[i]!;
      for (let c = i + 1; c < n; c++) s -= a[i * n + c]! * x[c]!;
      x[i] = s / a[i * n + i]!;
    }
  }
}
