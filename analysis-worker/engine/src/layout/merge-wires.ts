/**
 * One net's wire sections redrawn as a plain tree of runs. ELK routes a net as one edge per
 * end, and those edges share their trunk: drawn as they come, the trunk is stroked several
 * times over and every shared corner is a corner of each edge. Here the sections are cut at
 * every corner, end, pin and branch point, duplicates are dropped, and the pieces are joined
 * back into the fewest polylines that run from one branch point, end or pin to the next. The
 * drawing looks the same; the geometry says what the drawing shows (one corner is one bend).
 */
import type { Point, WireSection } from "./layout-types.js";

/** Coordinates closer than this are one point (ELK's coordinates are sums of integers). */
const EPS = 0.01;

const keyOf = (p: Point): string => `${Math.round(p.x * 100)},${Math.round(p.y * 100)}`;

interface Run {
  horizontal: boolean;
  /** y of a horizontal run, x of a vertical one. */
  at: number;
  lo: number;
  hi: number;
}

function runsOf(sections: readonly WireSection[]): Run[] {
  const runs: Run[] = [];
  for (const s of sections) {
    const pts = [s.start, ...s.bends, s.end];
    for (let i = 1; i < pts.length; i++) {
      const a = pts[i - 1]!;
      const b = pts[i]!;
      const flat = Math.abs(a.y - b.y) < EPS;
      const upright = Math.abs(a.x - b.x) < EPS;
      if (flat && upright) continue;
      // A slanted piece (none come from ELK) is kept out of the merge and returned as it was.
      if (!flat && !upright) return [];
      runs.push(
        flat
          ? { horizontal: true, at: a.y, lo: Math.min(a.x, b.x), hi: Math.max(a.x, b.x) }
          : { horizontal: false, at: a.x, lo: Math.min(a.y, b.y), hi: Math.max(a.y, b.y) },
      );
    }
  }
  return runs;
}

/** Collinear runs that overlap or touch, joined into one. */
function joinCollinear(runs: readonly Run[]): Run[] {
  const groups = new Map<string, Run[]>();
  for (const r of runs) {
    const k = `${r.horizontal}|${Math.round(r.at * 100)}`;
    groups.set(k, [...(groups.get(k) ?? []), r]);
  }
  const out: Run[] = [];
  for (const list of groups.values()) {
    list.sort((a, b) => a.lo - b.lo);
    let cur = { ...list[0]! };
    for (const r of list.slice(1)) {
      if (r.lo <= cur.hi + EPS) cur.hi = Math.max(cur.hi, r.hi);
      else {
        out.push(cur);
        cur = { ...r };
      }
    }
    out.push(cur);
  }
  return out;
}

const pointOn = (r: Run, t: number): Point =>
  r.horizontal ? { x: t, y: r.at } : { x: r.at, y: t };

/**
 * The net's sections as a tree of polylines with no run drawn twice. `stops` are points a
 * polyline must end at even when the wire runs straight through (the net's pins).
 */
export function mergeNetSections(
  sections: readonly WireSection[],
  stops: readonly Point[],
): WireSection[] {
  const raw = runsOf(sections);
  if (raw.length === 0) return [...sections];
  const runs = joinCollinear(raw);
  // Cut points on each run: its ends, pins on it, and where runs of the other axis meet it.
  const cuts: number[][] = runs.map((r) => [r.lo, r.hi]);
  const onRun = (r: Run, p: Point): boolean => {
    const along = r.horizontal ? p.x : p.y;
    const across = r.horizontal ? p.y : p.x;
    return Math.abs(across - r.at) < EPS && along > r.lo - EPS && along < r.hi + EPS;
  };
  runs.forEach((r, i) => {
    for (const p of stops) if (onRun(r, p)) cuts[i]!.push(r.horizontal ? p.x : p.y);
    for (const o of runs) {
      if (o.horizontal === r.horizontal) continue;
      const p = r.horizontal ? { x: o.at, y: r.at } : { x: r.at, y: o.at };
      if (onRun(r, p) && onRun(o, p)) cuts[i]!.push(r.horizontal ? p.x : p.y);
    }
  });
  // The tree: points and unit pieces between neighbouring cuts.
  const points = new Map<string, Point>();
  const adjacent = new Map<string, Set<string>>();
  const link = (a: Point, b: Point): void => {
    const ka = keyOf(a);
    const kb = keyOf(b);
    if (ka === kb) return;
    if (!points.has(ka)) points.set(ka, a);
    if (!points.has(kb)) points.set(kb, b);
    if (!adjacent.has(ka)) adjacent.set(ka, new Set());
    if (!adjacent.has(kb)) adjacent.set(kb, new Set());
    adjacent.get(ka)!.add(kb);
    adjacent.get(kb)!.add(ka);
  };
  runs.forEach((r, i) => {
    // Exact coordinates are kept (a rounded one would leave a hair-thin slant at the joint).
    const ts: number[] = [];
    for (const t of [...cuts[i]!].sort((a, b) => a - b))
      if (ts.length === 0 || t - ts[ts.length - 1]! >= EPS) ts.push(t);
    for (let k = 1; k < ts.length; k++) link(pointOn(r, ts[k - 1]!), pointOn(r, ts[k]!));
  });
  const stopKeys = new Set(stops.map(keyOf));
  const isStop = (k: string): boolean => stopKeys.has(k) || adjacent.get(k)!.size !== 2;
  const used = new Set<string>();
  const edgeKey = (a: string, b: string): string => (a < b ? `${a}|${b}` : `${b}|${a}`);
  const out: WireSection[] = [];
  const walk = (from: string, next: string): void => {
    const path = [from];
    let prev = from;
    let cur = next;
    used.add(edgeKey(prev, cur));
    while (!isStop(cur) && cur !== from) {
      path.push(cur);
      const onward = [...adjacent.get(cur)!].find((k) => k !== prev)!;
      prev = cur;
      cur = onward;
      used.add(edgeKey(prev, cur));
    }
    path.push(cur);
    out.push(toSection(path.map((k) => points.get(k)!)));
  };
  const order = [...points.keys()].sort();
  for (const k of order)
    if (isStop(k))
      for (const n of [...adjacent.get(k)!].sort()) if (!used.has(edgeKey(k, n))) walk(k, n);
  // A closed loop with no stop on it.
  for (const k of order)
    for (const n of [...adjacent.get(k)!].sort()) if (!used.has(edgeKey(k, n))) walk(k, n);
  return out;
}

/** A polyline as a section, dropping the points where it runs straight on. */
function toSection(path: readonly Point[]): WireSection {
  const kept: Point[] = [path[0]!];
  for (let i = 1; i < path.length - 1; i++) {
    const a = kept[kept.length - 1]!;
    const b = path[i]!;
    const c = path[i + 1]!;
    const straight =
      (Math.abs(a.x - b.x) < EPS && Math.abs(b.x - c.x) < EPS) ||
      (Math.abs(a.y - b.y) < EPS && Math.abs(b.y - c.y) < EPS);
    if (!straight) kept.push(b);
  }
  kept.push(path[path.length - 1]!);
  return { start: kept[0]!, end: kept[kept.length - 1]!, bends: kept.slice(1, -1) };
}
