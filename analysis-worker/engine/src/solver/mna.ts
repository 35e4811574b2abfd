/**
 * Modified nodal analysis (Ho, Ruehli and Brennan, 1975): node voltages against the reference
 * plus one branch-current unknown per voltage source, ideal link, inductor and transformer
 * winding. This file owns the matrix pattern (fixed per circuit) and the stamping helpers; the
 * device equations live in the transient and AC files.
 */
import type { Circuit, CircuitDevice } from "./circuit-model.js";
import { GROUND } from "./circuit-model.js";
import type { LinearSolver } from "./sparse-lu.js";
import { SparseLu } from "./sparse-lu.js";
import { DenseLu } from "./dense-lu.js";

/** Conductance from every node to the reference, so that nets held only by off junctions or capacitors stay defined. */
export const GMIN_SIEMENS = 1e-12;

/** Which LU the solver uses: sparse (default) or dense (benchmark baseline and fallback). */
export type LuChoice = "sparse" | "dense";

/** A fixed matrix pattern with O(1) slot lookup. */
export class MnaPattern {
  readonly size: number;
  private readonly table: Int32Array;
  private readonly r: number[] = [];
  private readonly c: number[] = [];
  private res = new Float64Array(0);
  private mag = new Float64Array(0);

  /** An empty pattern for a size x size matrix. */
  constructor(size: number) {
    this.size = size;
    this.table = new Int32Array(size * size).fill(-1);
  }

  /** Reserves entry (row, col); ground rows and columns are dropped. */
  reserve(row: number, col: number): void {
    if (row < 0 || col < 0) return;
    const key = row * this.size + col;
    if (this.table[key]! >= 0) return;
    this.table[key] = this.r.length;
    this.r.push(row);
    this.c.push(col);
  }

  /** The 2x2 block of a two-terminal element between nodes a and b. */
  reserveBranch(a: number, b: number): void {
    this.reserve(a, a);
    this.reserve(a, b);
    this.reserve(b, a);
    this.reserve(b, b);
  }

  /** Slot of (row, col), or -1 for a ground row/column. */
  slot(row: number, col: number): number {
    if (row < 0 || col < 0) return -1;
    const s = this.table[row * this.size + col]!;
    if (s < 0) throw new Error(`matrix entry (${row}, ${col}) was not reserved`);
    return s;
  }

  /**
   * True when A x - b is small in every row below `rows`, against the sizes of the row's own
   * terms (a round-off-aware test: a nearly floating node can move without changing any current).
   */
  residualSmall(
    vals: Float64Array,
    x: Float64Array,
    rhs: Float64Array,
    rows: number,
    rel: number,
    absAmps: number,
  ): boolean {
    if (this.res.length < rows) {
      this.res = new Float64Array(rows);
      this.mag = new Float64Array(rows);
    }
    const { res, mag } = this;
    res.fill(0, 0, rows);
    mag.fill(0, 0, rows);
    for (let s = 0; s < this.r.length; s++) {
      const i = this.r[s]!;
      if (i >= rows) continue;
      const term = vals[s]! * x[this.c[s]!]!;
      res[i]! += term;
      mag[i]! += Math.abs(term);
    }
    for (let i = 0; i < rows; i++) {
      if (Math.abs(res[i]! - rhs[i]!) > rel * (mag[i]! + Math.abs(rhs[i]!)) + absAmps) return false;
    }
    return true;
  }

  /** Number of slots. */
  get count(): number {
    return this.r.length;
  }

  /** Builds the chosen LU over this pattern. */
  solver(choice: LuChoice): LinearSolver {
    const rows = Int32Array.from(this.r);
    const cols = Int32Array.from(this.c);
    return choice === "dense"
      ? new DenseLu(this.size, rows, cols)
      : new SparseLu(this.size, rows, cols);
  }
}

/** Adds v at (row, col) unless either is ground. */
export function addAt(
  p: MnaPattern,
  vals: Float64Array,
  row: number,
  col: number,
  v: number,
): void {
  if (row < 0 || col < 0) return;
  vals[p.slot(row, col)]! += v;
}

/** Stamps a conductance g between nodes a and b. */
export function addConductance(
  p: MnaPattern,
  vals: Float64Array,
  a: number,
  b: number,
  g: number,
): void {
  addAt(p, vals, a, a, g);
  addAt(p, vals, b, b, g);
  addAt(p, vals, a, b, -g);
  addAt(p, vals, b, a, -g);
}

/** Adds a current i flowing out of node a into node b (a current source from a to b). */
export function addCurrent(rhs: Float64Array, a: number, b: number, i: number): void {
  if (a >= 0) rhs[a]! -= i;
  if (b >= 0) rhs[b]! += i;
}

/** Voltage of node n in solution x (0 for the reference). */
export function nodeV(x: Float64Array, n: number): number {
  return n === GROUND ? 0 : x[n]!;
}

/** Reserves every entry the real (time-domain) stamps of these devices use. */
export function reserveTransientPattern(c: Circuit): MnaPattern {
  const p = new MnaPattern(c.size);
  for (let i = 0; i < c.nodeCount; i++) p.reserve(i, i);
  for (const d of c.devices) reserveDevice(p, d);
  return p;
}

function reserveDevice(p: MnaPattern, d: CircuitDevice): void {
  const t = d.terminals;
  switch (d.type) {
    case "conductance":
    case "capacitor":
    case "varistor":
      p.reserveBranch(t[0]!, t[1]!);
      break;
    case "junction":
      p.reserveBranch(d.inner, t[1]!);
      if (d.inner !== t[0]) p.reserveBranch(t[0]!, d.inner);
      break;
    case "switching":
      p.reserveBranch(t[0]!, t[2]!);
      p.reserveBranch(t[1]!, t[2]!);
      break;
    case "supply":
    case "short":
      for (const [n, b] of [
        [t[0]!, d.branch],
        [t[1]!, d.branch],
      ] as const) {
        p.reserve(n, b);
        p.reserve(b, n);
      }
      break;
    case "coupled":
      d.branches.forEach((b, w) => {
        for (const n of [t[2 * w]!, t[2 * w + 1]!]) {
          p.reserve(n, b);
          p.reserve(b, n);
        }
        for (const b2 of d.branches) p.reserve(b, b2);
      });
      break;
    default: {
      const never: never = d;
      throw new Error(`unhandled device ${String(never)}`);
    }
  }
}
