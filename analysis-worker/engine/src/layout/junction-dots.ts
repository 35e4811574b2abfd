/**
 * Junction dots from the finished wires: a dot goes exactly where three or more wire
 * directions of one net meet, and nowhere else. A pin counts as one direction (the lead into
 * its part), so a T at a pin gets its dot too. Working from the drawn geometry rather than from
 * the graph is the point: ELK splits a hyperedge wherever it likes, and only the drawing knows
 * where the branches are.
 */
import type { PlacedJunction, PlacedPin, PlacedWire, Point } from "./layout-types.js";

/** Points closer than this are one point (ELK's coordinates are exact sums of integers). */
const EPS = 0.01;

interface Run {
  net: string;
  horizontal: boolean;
  /** The fixed coordinate (y of a horizontal run, x of a vertical one). */
  at: number;
  lo: number;
  hi: number;
}

const same = (a: number, b: number): boolean => Math.abs(a - b) < EPS;

function runsOf(wires: readonly PlacedWire[]): Run[] {
  const runs: Run[] = [];
  for (const w of wires)
    for (const s of w.sections) {
      const pts = [s.start, ...s.bends, s.end];
      for (let i = 1; i < pts.length; i++) {
        const a = pts[i - 1]!;
        const b = pts[i]!;
        if (same(a.y, b.y) && !same(a.x, b.x))
          runs.push({
            net: w.net,
            horizontal: true,
            at: a.y,
            lo: Math.min(a.x, b.x),
            hi: Math.max(a.x, b.x),
          });
        else if (same(a.x, b.x) && !same(a.y, b.y))
          runs.push({
            net: w.net,
            horizontal: false,
            at: a.x,
            lo: Math.min(a.y, b.y),
            hi: Math.max(a.y, b.y),
          });
      }
    }
  return runs;
}

/** The directions ("-" toward lo, "+" toward hi, tagged by axis) in which a run leaves p. */
function leaving(r: Run, p: Point, into: Set<string>): void {
  const along = r.horizontal ? p.x : p.y;
  const across = r.horizontal ? p.y : p.x;
  if (!same(across, r.at) || along < r.lo - EPS || along > r.hi + EPS) return;
  const axis = r.horizontal ? "h" : "v";
  if (along > r.lo + EPS) into.add(`${axis}-`);
  if (along < r.hi - EPS) into.add(`${axis}+`);
}

/** Every point where three or more directions of one net meet, in a stable order. */
export function junctionDots(
  wires: readonly PlacedWire[],
  pins: readonly PlacedPin[],
): PlacedJunction[] {
  const runs = runsOf(wires);
  const byNet = new Map<string, Run[]>();
  for (const r of runs) byNet.set(r.net, [...(byNet.get(r.net) ?? []), r]);
  const dots: PlacedJunction[] = [];
  for (const [net, own] of byNet) {
    const netPins = pins.filter((p) => p.net === net);
    const candidates = new Map<string, Point>();
    const add = (p: Point): void => {
      candidates.set(`${Math.round(p.x * 100)},${Math.round(p.y * 100)}`, p);
    };
    for (const r of own) {
      add(r.horizontal ? { x: r.lo, y: r.at } : { x: r.at, y: r.lo });
      add(r.horizontal ? { x: r.hi, y: r.at } : { x: r.at, y: r.hi });
    }
    for (const p of netPins) add(p);
    // Two runs of one net crossing mid-way also meet (four directions).
    for (const h of own)
      for (const v of own) if (h.horizontal && !v.horizontal) add({ x: v.at, y: h.at });
    for (const p of candidates.values()) {
      const directions = new Set<string>();
      for (const r of own) leaving(r, p, directions);
      if (directions.size === 0) continue;
      const pinsHere = netPins.filter((q) => same(q.x, p.x) && same(q.y, p.y)).length;
      if (directions.size + pinsHere >= 3) dots.push({ net, x: p.x, y: p.y });
    }
  }
  return dots.sort((a, b) => (a.net < b.net ? -1 : a.net > b.net ? 1 : a.x - b.x || a.y - b.y));
}
