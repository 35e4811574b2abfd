/**
 * Sparse LU factorisation for the MNA matrices. The pattern is fixed for a circuit, so the
 * pivot order and the fill structure are chosen once (Markowitz ordering) and reused for every
 * time step and Newton iteration; the order is chosen again (Markowitz with a threshold on the
 * numeric values) only when a pivot becomes too small.
 */

/** Entries below this fraction of the largest entry in their column are not taken as pivots. */
export const PIVOT_THRESHOLD_RATIO = 0.01;
/** A reused pivot smaller than this fraction of its row's largest entry forces a new order. */
export const PIVOT_REUSE_MIN_RATIO = 1e-11;
/** A reused order whose multipliers grow past this is chosen again (element growth). */
export const MAX_MULTIPLIER = 1e8;
/**
 * A reused pivot is also kept while its size against its row stays above this fraction of what
 * it was when the order was chosen: MNA rows legitimately mix gmin (1e-12 S) with companion
 * conductances of 1e4 S, so a fixed ratio alone would re-pivot at every factorisation.
 */
export const PIVOT_REUSE_DECAY = 1e-3;
/**
 * Singular means no nonzero entry is left to pivot on. MNA matrices are badly scaled on purpose
 * (gmin of 1e-12 S beside companion conductances of 1e4 S), so no relative size test is used.
 */
export const SINGULAR_PIVOT_ABS = 0;

/** Outcome of a numeric factorisation: ok, or the index of an unknown that cannot be determined. */
export type FactorStatus = { ok: true } | { ok: false; singularUnknown: number };

/** Common shape of the sparse and the dense solver, both addressed through pattern slots. */
export interface LinearSolver {
  /** Factorise the matrix whose slot `s` holds `values[s]`. */
  factor(values: Float64Array): FactorStatus;
  /** Solve A x = rhs with the last factorisation. */
  solve(rhs: Float64Array): Float64Array;
  /** Solve A x = rhs into `out` (length n) without allocating. */
  solveInto(rhs: Float64Array, out: Float64Array): void;
}

interface PivotOrder {
  rowOf: Int32Array; // pivot position -> original row
  colOf: Int32Array; // pivot position -> original column
}

/** Markowitz elimination on the pattern (structural, values null) or on numbers (threshold pivoting). */
function markowitzOrder(
  n: number,
  rows: Int32Array,
  cols: Int32Array,
  values: Float64Array | null,
): PivotOrder | { singularUnknown: number } {
  const rowMap: Array<Map<number, number>> = Array.from({ length: n }, () => new Map());
  const colSet: Array<Set<number>> = Array.from({ length: n }, () => new Set());
  for (let s = 0; s < rows.length; s++) {
    const r = rows[s]!;
    const c = cols[s]!;
    const v = values ? values[s]! : 1;
    rowMap[r]!.set(c, (rowMap[r]!.get(c) ?? 0) + v);
    colSet[c]!.add(r);
  }
  const rowOf = new Int32Array(n);
  const colOf = new Int32Array(n);
  const rowDone = new Uint8Array(n);
  const colDone = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    let best = -1;
    let bestCol = -1;
    let bestCost = Infinity;
    let bestMag = 0;
    for (let c = 0; c < n; c++) {
      if (colDone[c]) continue;
      const cs = colSet[c]!;
      let colMax = 0;
      if (values) for (const r of cs) colMax = Math.max(colMax, Math.abs(rowMap[r]!.get(c)!));
      for (const r of cs) {
        const v = rowMap[r]!.get(c)!;
        const mag = Math.abs(v);
        if (values) {
          if (mag <= SINGULAR_PIVOT_ABS || mag < PIVOT_THRESHOLD_RATIO * colMax) continue;
        } else if (v === 0) continue;
        // Cost (r-1)(c-1); ties go to the diagonal, then to the larger magnitude.
        const cost = (rowMap[r]!.size - 1) * (cs.size - 1) + (r === c ? 0 : 0.5);
        if (cost < bestCost || (cost === bestCost && mag > bestMag)) {
          bestCost = cost;
          best = r;
          bestCol = c;
          bestMag = mag;
        }
      }
    }
    if (best < 0) {
      let lowest = -1;
      for (let c = 0; c < n; c++)
        if (!colDone[c]) {
          lowest = c;
          break;
        }
      return { singularUnknown: lowest };
    }
    rowOf[k] = best;
    colOf[k] = bestCol;
    rowDone[best] = 1;
    colDone[bestCol] = 1;
    const prow = rowMap[best]!;
    const pivot = prow.get(bestCol)!;
    // Eliminate: every other active row with an entry in the pivot column gets fill.
    for (const r of colSet[bestCol]!) {
      if (r === best) continue;
      const row = rowMap[r]!;
      const l = values ? row.get(bestCol)! / pivot : 1;
      row.delete(bestCol);
      for (const [c, u] of prow) {
        if (c === bestCol) continue;
        const had = row.get(c);
        if (had === undefined) colSet[c]!.add(r);
        row.set(c, values ? (had ?? 0) - l * u : 1);
      }
    }
    for (const c of prow.keys()) colSet[c]!.delete(best);
    rowMap[best] = new Map();
  }
  return { rowOf, colOf };
}

/** Sparse LU with a kept pivot order and symbolic structure (see the file comment). */
export class SparseLu implements LinearSolver {
  private readonly n: number;
  private readonly rows: Int32Array;
  private readonly cols: Int32Array;
  private rowOf: Int32Array = new Int32Array(0);
  private colOf: Int32Array = new Int32Array(0);
  private ptr = new Int32Array(0); // row i's entries: ptr[i] .. ptr[i+1]
  private idx = new Int32Array(0); // positions, ascending; diag at diagAt[i]
  private diagAt = new Int32Array(0);
  private lu = new Float64Array(0);
  private slotAt = new Int32Array(0);
  private readonly work: Float64Array;
  /** Pivot size against its row when the order was chosen (see PIVOT_REUSE_DECAY). */
  private refRatio = new Float64Array(0);
  /** The values of the last successful factorisation: the same matrix again needs no new one. */
  private readonly lastValues: Float64Array;
  private haveLast = false;
  private numericOrder = false;
  /** How often the pivot order was chosen again because a reused pivot became too small. */
  repivots = 0;
  /** Number of numeric factorisations. */
  factorizations = 0;
  /** Calls of factor() answered by the previous factorisation (the matrix had not changed). */
  reuses = 0;

  /** analyze(pattern): slot s is the entry (rows[s], cols[s]) of an n x n matrix. */
  constructor(n: number, rows: Int32Array, cols: Int32Array) {
    this.n = n;
    this.rows = rows;
    this.cols = cols;
    this.work = new Float64Array(n);
    this.lastValues = new Float64Array(rows.length);
    const order = markowitzOrder(n, rows, cols, null);
    if ("singularUnknown" in order) {
      // Structurally singular: keep an identity order; the numeric pass reports the unknown.
      this.setOrder(this.identityOrder());
    } else this.setOrder(order);
  }

  private identityOrder(): PivotOrder {
    const id = Int32Array.from({ length: this.n }, (_, i) => i);
    return { rowOf: id, colOf: Int32Array.from(id) };
  }

  /** Builds the row-wise symbolic structure for a pivot order (fill closed under elimination). */
  private setOrder(order: PivotOrder): void {
    const n = this.n;
    this.rowOf = order.rowOf;
    this.colOf = order.colOf;
    const posOfRow = new Int32Array(n);
    const posOfCol = new Int32Array(n);
    for (let k = 0; k < n; k++) {
      posOfRow[order.rowOf[k]!] = k;
      posOfCol[order.colOf[k]!] = k;
    }
    const pattern: Array<Set<number>> = Array.from({ length: n }, (_, i) => new Set([i]));
    for (let s = 0; s < this.rows.length; s++)
      pattern[posOfRow[this.rows[s]!]!]!.add(posOfCol[this.cols[s]!]!);
    // Symbolic row elimination: row i takes the U pattern of every row k < i it has an entry in.
    const upper: number[][] = [];
    for (let i = 0; i < n; i++) {
      const set = pattern[i]!;
      // Ascending scan so that fill added by row k (always right of k) is seen in turn.
      for (let k = 0; k < i; k++) {
        if (!set.has(k)) continue;
        for (const j of upper[k]!) set.add(j);
      }
      upper.push([...set].filter((j) => j > i).sort((a, b) => a - b));
    }
    const ptr = new Int32Array(n + 1);
    for (let i = 0; i < n; i++) ptr[i + 1] = ptr[i]! + pattern[i]!.size;
    const idx = new Int32Array(ptr[n]!);
    const diagAt = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const sorted = [...pattern[i]!].sort((a, b) => a - b);
      for (let q = 0; q < sorted.length; q++) {
        idx[ptr[i]! + q] = sorted[q]!;
        if (sorted[q] === i) diagAt[i] = ptr[i]! + q;
      }
    }
    const slotAt = new Int32Array(this.rows.length);
    for (let s = 0; s < this.rows.length; s++) {
      const i = posOfRow[this.rows[s]!]!;
      const j = posOfCol[this.cols[s]!]!;
      let q = ptr[i]!;
      while (idx[q] !== j) q++;
      slotAt[s] = q;
    }
    this.ptr = ptr;
    this.idx = idx;
    this.diagAt = diagAt;
    this.slotAt = slotAt;
    this.lu = new Float64Array(idx.length);
    this.refRatio = new Float64Array(n);
  }

  /**
   * Numeric factorisation in the kept order; re-pivots when a pivot became too small. The first
   * call chooses the order on the numbers (the structural order only sized the work).
   */
  factor(values: Float64Array): FactorStatus {
    if (this.haveLast && sameValues(values, this.lastValues)) {
      this.reuses++;
      return { ok: true };
    }
    this.haveLast = false;
    this.factorizations++;
    if (this.numericOrder && this.factorKept(values, true) < 0) return this.remember(values);
    if (this.numericOrder) this.repivots++;
    this.numericOrder = true;
    const order = markowitzOrder(this.n, this.rows, this.cols, values);
    if ("singularUnknown" in order) return { ok: false, singularUnknown: order.singularUnknown };
    this.setOrder(order);
    // The new order is the best threshold pivoting gives; only an exact zero pivot fails now.
    const bad = this.factorKept(values, false);
    return bad < 0 ? this.remember(values) : { ok: false, singularUnknown: this.colOf[bad]! };
  }

  private remember(values: Float64Array): FactorStatus {
    this.lastValues.set(values);
    this.haveLast = true;
    return { ok: true };
  }

  /**
   * Factorises in the kept order; returns -1, or the first position whose pivot fails the test.
   * Row-by-row (Doolittle, IKJ order) elimination into a dense work row: called at every Newton
   * iteration, so each row is read and written back in one pass (its largest entries taken on
   * the way) and the fields are held in locals (no property loads in the loops).
   */
  private factorKept(values: Float64Array, strict: boolean): number {
    const { n, ptr, idx, diagAt, lu, work: w, slotAt, refRatio } = this;
    lu.fill(0);
    for (let s = 0; s < values.length; s++) lu[slotAt[s]!]! += values[s]!;
    for (let i = 0; i < n; i++) {
      const start = ptr[i]!;
      const end = ptr[i + 1]!;
      const di = diagAt[i]!;
      let rowMax = 0;
      for (let q = start; q < end; q++) {
        const v = lu[q]!;
        w[idx[q]!] = v;
        rowMax = Math.max(rowMax, Math.abs(v));
      }
      for (let q = start; q < di; q++) {
        const k = idx[q]!;
        const l = w[k]! / lu[diagAt[k]!]!;
        if (strict && Math.abs(l) > MAX_MULTIPLIER) return i;
        w[k] = l;
        if (l === 0) continue;
        const kEnd = ptr[k + 1]!;
        for (let r = diagAt[k]! + 1; r < kEnd; r++) w[idx[r]!]! -= l * lu[r]!;
      }
      for (let q = start; q < di; q++) {
        const j = idx[q]!;
        lu[q] = w[j]!;
        w[j] = 0;
      }
      let uMax = 0;
      for (let q = di; q < end; q++) {
        const j = idx[q]!;
        const v = w[j]!;
        uMax = Math.max(uMax, Math.abs(v));
        lu[q] = v;
        w[j] = 0;
      }
      const d = Math.abs(lu[di]!);
      const scale = Math.max(uMax, rowMax);
      const floor = strict
        ? Math.min(PIVOT_REUSE_MIN_RATIO, PIVOT_REUSE_DECAY * refRatio[i]!) * scale
        : SINGULAR_PIVOT_ABS;
      if (!(d > floor) || !Number.isFinite(d)) return i;
      if (!strict) refRatio[i] = scale > 0 ? d / scale : 1;
    }
    return -1;
  }

  /** Solve with the last factorisation. */
  solve(rhs: Float64Array): Float64Array {
    const x = new Float64Array(this.n);
    this.solveInto(rhs, x);
    return x;
  }

  /** Solve with the last factorisation into `x`. */
  solveInto(rhs: Float64Array, x: Float64Array): void {
    const { n, ptr, idx, diagAt, lu, work: y } = this;
    for (let i = 0; i < n; i++) {
      let s = rhs[this.rowOf[i]!]!;
      for (let q = ptr[i]!; q < diagAt[i]!; q++) s -= lu[q]! * y[idx[q]!]!;
      y[i] = s;
    }
    for (let i = n - 1; i >= 0; i--) {
      let s = y[i]!;
      for (let q = diagAt[i]! + 1; q < ptr[i + 1]!; q++) s -= lu[q]! * y[idx[q]!]!;
      y[i] = s / lu[diagAt[i]!]!;
    }
    for (let i = 0; i < n; i++) x[this.colOf[i]!] = y[i]!;
    y.fill(0);
  }

  /** Stored entries of L and U together (fill included). */
  get storedEntries(): number {
    return this.idx.length;
  }
}

function sameValues(a: Float64Array, b: Float64Array): boolean {
  for (let s = 0; s < a.length; s++) if (a[s] !== b[s]) return false;
  return true;
}
