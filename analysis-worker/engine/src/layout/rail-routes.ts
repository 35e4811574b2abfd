/**
 * A rail: a net drawn as one straight horizontal line below everything else (the neutral or
 * the negative side) or above it (the positive DC side), with a lead from each of the net's
 * pins straight to it, so the parts on the net hang from the rail. ELK routes every net
 * first; a rail replaces that route only when every pin finds a clean lead (through no part,
 * along no other net's track, over no other net's pin) and the rail crosses no more wires than
 * ELK's route did. Otherwise ELK's route stays: a rail is a reading aid, never a fault.
 *
 * A pin facing the rail drops straight to it when it can; any other pin (or one whose way is
 * blocked by a part below it) first steps out of its part, then runs sideways to the nearest
 * clear channel and turns toward the rail there.
 */
import type { Box, Point, Side, WireSection } from "./layout-types.js";

/** Rails keep this far from the nearest other drawing. */
export const RAIL_GAP_PX = 20;
/** Parallel runs of two nets must be at least this far apart (the drawing checker's limit). */
const TRACK_GAP_PX = 5;
/** How far a lead steps out of its part before turning. */
const STUB_PX = 10;
/** Step and reach of the search for a clear channel beside a pin. */
const CHANNEL_STEP_PX = 2.5;
const CHANNEL_REACH_PX = 300;
/** Once a clean channel is found, how much further the search goes for one crossing less. */
const CHANNEL_LOOK_FURTHER_PX = 40;
const EPS = 0.01;

/** A straight piece of some net's wire, horizontal along y = at or vertical along x = at. */
export interface Run {
  net: string;
  horizontal: boolean;
  at: number;
  lo: number;
  hi: number;
}

/** Where a rail's lead starts: a pin (or a block's port) of the rail's net. */
export interface RailEnd extends Point {
  side: Side;
}

/** Everything already drawn that a rail's leads must respect. */
export interface RailObstacles {
  bodies: readonly Box[];
  runs: readonly Run[];
  /** Pins of every net (the rail's own are skipped by net). */
  pins: readonly (Point & { net: string })[];
}

/** Runs of some sections, for obstacle lists. */
export function runsOfSections(net: string, sections: readonly WireSection[]): Run[] {
  const out: Run[] = [];
  for (const s of sections) {
    const pts = [s.start, ...s.bends, s.end];
    for (let i = 1; i < pts.length; i++) {
      const a = pts[i - 1]!;
      const b = pts[i]!;
      if (Math.abs(a.y - b.y) < EPS && Math.abs(a.x - b.x) >= EPS)
        out.push({
          net,
          horizontal: true,
          at: a.y,
          lo: Math.min(a.x, b.x),
          hi: Math.max(a.x, b.x),
        });
      else if (Math.abs(a.x - b.x) < EPS && Math.abs(a.y - b.y) >= EPS)
        out.push({
          net,
          horizontal: false,
          at: a.x,
          lo: Math.min(a.y, b.y),
          hi: Math.max(a.y, b.y),
        });
    }
  }
  return out;
}

function runOf(net: string, a: Point, b: Point): Run | null {
  if (Math.abs(a.y - b.y) < EPS && Math.abs(a.x - b.x) >= EPS)
    return { net, horizontal: true, at: a.y, lo: Math.min(a.x, b.x), hi: Math.max(a.x, b.x) };
  if (Math.abs(a.x - b.x) < EPS && Math.abs(a.y - b.y) >= EPS)
    return { net, horizontal: false, at: a.x, lo: Math.min(a.y, b.y), hi: Math.max(a.y, b.y) };
  return null;
}

/** True when the run enters the box's interior. */
function runInBox(r: Run, b: Box): boolean {
  const inset = 0.5;
  const x0 = b.x + inset;
  const x1 = b.x + b.width - inset;
  const y0 = b.y + inset;
  const y1 = b.y + b.height - inset;
  if (r.horizontal) return r.at > y0 && r.at < y1 && r.hi > x0 && r.lo < x1;
  return r.at > x0 && r.at < x1 && r.hi > y0 && r.lo < y1;
}

const inside = (t: number, lo: number, hi: number): boolean => t > lo + EPS && t < hi - EPS;
const within = (t: number, lo: number, hi: number): boolean => t > lo - EPS && t < hi + EPS;

/**
 * How many wires of other nets the run crosses, or null when it meets one in a way that reads
 * as a connection or a shared track (touching, running alongside closer than the track gap).
 */
function crossingsOf(r: Run, obstacles: RailObstacles): number | null {
  let crossings = 0;
  for (const o of obstacles.runs) {
    if (o.net === r.net) continue;
    if (o.horizontal === r.horizontal) {
      const overlap = Math.min(o.hi, r.hi) - Math.max(o.lo, r.lo);
      if (overlap > -EPS && Math.abs(o.at - r.at) < TRACK_GAP_PX + EPS) return null;
      continue;
    }
    // Perpendicular: a clean crossing has both runs passing through the point.
    if (!within(o.at, r.lo, r.hi) || !within(r.at, o.lo, o.hi)) continue;
    if (inside(o.at, r.lo, r.hi) && inside(r.at, o.lo, o.hi)) crossings += 1;
    else return null;
  }
  for (const p of obstacles.pins) {
    if (p.net === r.net) continue;
    const along = r.horizontal ? p.x : p.y;
    const across = r.horizontal ? p.y : p.x;
    if (Math.abs(across - r.at) < TRACK_GAP_PX && within(along, r.lo, r.hi)) return null;
  }
  for (const b of obstacles.bodies) if (runInBox(r, b)) return null;
  return crossings;
}

/** A candidate lead as points, its crossings, or null when it is not clean. */
function scorePath(net: string, pts: readonly Point[], obstacles: RailObstacles): number | null {
  let total = 0;
  for (let i = 1; i < pts.length; i++) {
    const r = runOf(net, pts[i - 1]!, pts[i]!);
    if (r === null) {
      if (Math.abs(pts[i - 1]!.x - pts[i]!.x) < EPS && Math.abs(pts[i - 1]!.y - pts[i]!.y) < EPS)
        continue;
      return null;
    }
    const c = crossingsOf(r, obstacles);
    if (c === null) return null;
    total += c;
  }
  return total;
}

const STEP: Record<Side, Point> = {
  NORTH: { x: 0, y: -1 },
  SOUTH: { x: 0, y: 1 },
  EAST: { x: 1, y: 0 },
  WEST: { x: -1, y: 0 },
};

/** The cleanest lead from a pin to the rail at `railY`: fewest crossings, then shortest. */
function leadTo(
  net: string,
  end: RailEnd,
  railY: number,
  obstacles: RailObstacles,
): { points: Point[]; crossings: number } | null {
  const toward: Side = railY > end.y ? "SOUTH" : "NORTH";
  const step = STEP[end.side];
  const out = { x: end.x + step.x * STUB_PX, y: end.y + step.y * STUB_PX };
  let best = null as { points: Point[]; crossings: number; length: number } | null;
  let foundAt = Infinity;
  const consider = (points: Point[]): void => {
    const crossings = scorePath(net, points, obstacles);
    if (crossings === null) return;
    let length = 0;
    for (let i = 1; i < points.length; i++)
      length +=
        Math.abs(points[i]!.x - points[i - 1]!.x) + Math.abs(points[i]!.y - points[i - 1]!.y);
    if (
      best === null ||
      crossings < best.crossings ||
      (crossings === best.crossings && length < best.length)
    )
      best = { points, crossings, length };
  };
  if (end.side === toward) consider([end, { x: end.x, y: railY }]);
  if (best !== null && best.crossings === 0) return best;
  for (let d = 0; d <= CHANNEL_REACH_PX; d += CHANNEL_STEP_PX) {
    // Past the first clean channel, look only a little further for one that crosses less.
    if (d > foundAt + CHANNEL_LOOK_FURTHER_PX) break;
    // Sideways pins look for their channel in the direction they face; up- or down-facing ones
    // on either side.
    const xs =
      end.side === "EAST"
        ? [out.x + d]
        : end.side === "WEST"
          ? [out.x - d]
          : d === 0
            ? []
            : [end.x + d, end.x - d];
    for (const x of xs)
      consider(
        end.side === "EAST" || end.side === "WEST"
          ? [end, { x, y: end.y }, { x, y: railY }]
          : [end, out, { x, y: out.y }, { x, y: railY }],
      );
    if (best !== null && foundAt === Infinity) foundAt = d;
    if (best !== null && best.crossings === 0) break;
  }
  return best === null ? null : { points: best.points, crossings: best.crossings };
}

/**
 * The rail for one net, as sections (the rail line and one lead per end), with the crossings
 * it makes; null when some end finds no clean lead. The leads are laid one by one, each
 * respecting the ones before it, nearest the rail's source (leftmost) first.
 */
export function railFor(
  net: string,
  ends: readonly RailEnd[],
  railY: number,
  obstacles: RailObstacles,
): { sections: WireSection[]; crossings: number } | null {
  if (ends.length < 2) return null;
  const placed: Run[] = [];
  const sections: WireSection[] = [];
  let crossings = 0;
  const feet: number[] = [];
  const order = [...ends].sort((a, b) => a.x - b.x || a.y - b.y);
  for (const end of order) {
    const lead = leadTo(net, end, railY, {
      ...obstacles,
      runs: [...obstacles.runs, ...placed],
    });
    if (lead === null) return null;
    crossings += lead.crossings;
    const pts = lead.points;
    sections.push({ start: pts[0]!, end: pts[pts.length - 1]!, bends: pts.slice(1, -1) });
    // Later leads of this net must not run alongside this one either (they would merge).
    for (let i = 1; i < pts.length; i++) {
      const r = runOf(`${net}\u0000lead`, pts[i - 1]!, pts[i]!);
      if (r !== null) placed.push(r);
    }
    feet.push(pts[pts.length - 1]!.x);
  }
  const x0 = Math.min(...feet);
  const x1 = Math.max(...feet);
  if (x1 - x0 > EPS) {
    const rail: Run = { net, horizontal: true, at: railY, lo: x0, hi: x1 };
    const c = crossingsOf(rail, obstacles);
    if (c === null) return null;
    crossings += c;
    sections.push({ start: { x: x0, y: railY }, end: { x: x1, y: railY }, bends: [] });
  }
  return { sections, crossings };
}
