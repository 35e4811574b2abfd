/**
 * An independent geometric check of a laid-out schematic. It reads only the finished drawing
 * (the `SchematicLayout` JSON: wire polylines, pins, boxes, dots, labels) and walks the wire
 * segments itself; it never looks at how the layout stage built them. Used by the layout tests
 * (hard faults must be zero) and by the layout-quality bench (the softer figures).
 *
 * Rules, as a practitioner reads a drawing:
 * - a junction dot belongs exactly where three or more wire directions of one net meet (a pin
 *   counts as one direction: the lead into its part); every other dot is stray;
 * - two nets never share a track, nor run parallel closer than `CROWDED_PX`;
 * - a wire of one net never ends on, bends on or passes a pin of another net (that would read
 *   as a connection);
 * - no part or terminal box overlaps another, no wire runs through one;
 * - labels (refs, values, net names, captions) touch no wire, no dot, no box, no other label;
 * - an isolation boundary crosses no part but its own transformer, and touches no label.
 */
import type { Box, Point, SchematicLayout } from "@teardown/engine";

/** Parallel runs of different nets closer than this are crowded. */
export const CROWDED_PX = 5;
/** Coordinates closer than this are the same point. */
const EPS = 0.01;
/** Drawn dot radius: a label must keep clear of the dot, not only its centre. */
const DOT_RADIUS_PX = 3.5;

interface Segment {
  net: string;
  /** Horizontal segments run along y = c from lo to hi; vertical ones along x = c. */
  horizontal: boolean;
  c: number;
  lo: number;
  hi: number;
}

/** Every figure the checker measures; `hard` sums the ones that must be zero. */
export interface DrawingReport {
  strayDots: number;
  missingDots: number;
  sharedTracks: number;
  crowdedTracks: number;
  falseConnections: number;
  diagonalWires: number;
  boxOverlaps: number;
  wiresThroughBodies: number;
  labelsTouching: number;
  brokenNets: number;
  crossings: number;
  bends: number;
  wireLength: number;
  area: number;
  parts: number;
  /** Human-readable description of each hard fault, for test failure messages. */
  faults: string[];
}

const near = (a: number, b: number): boolean => Math.abs(a - b) < EPS;
const key = (p: Point): string => `${Math.round(p.x * 100)},${Math.round(p.y * 100)}`;

/** The drawing's wires as maximal straight segments, same-net overlaps merged. */
function segmentsOf(layout: SchematicLayout, report: DrawingReport): Segment[] {
  const raw: Segment[] = [];
  for (const w of layout.wires)
    for (const s of w.sections) {
      const pts = [s.start, ...s.bends, s.end];
      let lastDir: boolean | null = null;
      for (let i = 1; i < pts.length; i++) {
        const a = pts[i - 1]!;
        const b = pts[i]!;
        if (near(a.x, b.x) && near(a.y, b.y)) continue;
        if (!near(a.x, b.x) && !near(a.y, b.y)) {
          report.diagonalWires += 1;
          report.faults.push(`net ${w.net}: diagonal wire (${a.x},${a.y})-(${b.x},${b.y})`);
          continue;
        }
        const horizontal = near(a.y, b.y);
        if (lastDir !== null && lastDir !== horizontal) report.bends += 1;
        lastDir = horizontal;
        raw.push(
          horizontal
            ? { net: w.net, horizontal, c: a.y, lo: Math.min(a.x, b.x), hi: Math.max(a.x, b.x) }
            : { net: w.net, horizontal, c: a.x, lo: Math.min(a.y, b.y), hi: Math.max(a.y, b.y) },
        );
      }
    }
  // Merge collinear overlapping (or end-to-end) runs of one net into one segment.
  const groups = new Map<string, Segment[]>();
  for (const s of raw) {
    const k = `${s.net}\u0000${s.horizontal}\u0000${Math.round(s.c * 100)}`;
    groups.set(k, [...(groups.get(k) ?? []), s]);
  }
  const merged: Segment[] = [];
  for (const list of groups.values()) {
    list.sort((a, b) => a.lo - b.lo);
    let cur = { ...list[0]! };
    for (const s of list.slice(1)) {
      if (s.lo <= cur.hi + EPS) cur.hi = Math.max(cur.hi, s.hi);
      else {
        merged.push(cur);
        cur = { ...s };
      }
    }
    merged.push(cur);
  }
  return merged;
}

const pointOf = (s: Segment, t: number): Point =>
  s.horizontal ? { x: t, y: s.c } : { x: s.c, y: t };

/** Where point p sits on s: "end", "inside", or null when off the segment. */
function onSegment(s: Segment, p: Point): "end" | "inside" | null {
  const along = s.horizontal ? p.x : p.y;
  const across = s.horizontal ? p.y : p.x;
  if (!near(across, s.c) || along < s.lo - EPS || along > s.hi + EPS) return null;
  return near(along, s.lo) || near(along, s.hi) ? "end" : "inside";
}

/** Directions (of "N", "E", "S", "W") in which segment s leaves point p, which lies on s. */
function directionsAt(s: Segment, p: Point): string[] {
  const along = s.horizontal ? p.x : p.y;
  const [minus, plus] = s.horizontal ? ["W", "E"] : ["N", "S"];
  const out: string[] = [];
  if (along > s.lo + EPS) out.push(minus!);
  if (along < s.hi - EPS) out.push(plus!);
  return out;
}

function interiorOverlap(a: Box, b: Box, inset = 0.5): boolean {
  return (
    a.x + inset < b.x + b.width &&
    b.x + inset < a.x + a.width &&
    a.y + inset < b.y + b.height &&
    b.y + inset < a.y + a.height
  );
}

/** True when the segment enters the box's interior (shrunk by `inset`). */
function segmentInBox(s: Segment, b: Box, inset: number): boolean {
  const x0 = b.x + inset;
  const x1 = b.x + b.width - inset;
  const y0 = b.y + inset;
  const y1 = b.y + b.height - inset;
  if (x0 >= x1 || y0 >= y1) return false;
  if (s.horizontal) return s.c > y0 && s.c < y1 && s.hi > x0 && s.lo < x1;
  return s.c > x0 && s.c < x1 && s.hi > y0 && s.lo < y1;
}

class UnionFind {
  private readonly parent = new Map<string, string>();
  find(a: string): string {
    let p = this.parent.get(a) ?? a;
    if (p !== a) {
      p = this.find(p);
      this.parent.set(a, p);
    }
    return p;
  }
  union(a: string, b: string): void {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra !== rb) this.parent.set(ra, rb);
  }
}

/** Checks a drawing; see the file comment for the rules. */
export function checkDrawing(layout: SchematicLayout): DrawingReport {
  const report: DrawingReport = {
    strayDots: 0,
    missingDots: 0,
    sharedTracks: 0,
    crowdedTracks: 0,
    falseConnections: 0,
    diagonalWires: 0,
    boxOverlaps: 0,
    wiresThroughBodies: 0,
    labelsTouching: 0,
    brokenNets: 0,
    crossings: 0,
    bends: 0,
    wireLength: 0,
    area: layout.width * layout.height,
    parts: layout.parts.length,
    faults: [],
  };
  const fault = (field: keyof DrawingReport, text: string): void => {
    (report[field] as number) += 1;
    report.faults.push(text);
  };
  const segs = segmentsOf(layout, report);
  for (const s of segs) report.wireLength += s.hi - s.lo;
  const pins = [
    ...layout.parts.flatMap((p) => p.pins.map((pin) => ({ ...pin, owner: p.ref }))),
    ...layout.terminals.flatMap((t) => t.pins.map((pin) => ({ ...pin, owner: `${t.kind}` }))),
  ];

  // Pairs of segments: crossings, shared and crowded tracks, false touches.
  for (let i = 0; i < segs.length; i++) {
    for (let j = i + 1; j < segs.length; j++) {
      const a = segs[i]!;
      const b = segs[j]!;
      if (a.net === b.net) continue;
      const where = `nets ${a.net} and ${b.net}`;
      if (a.horizontal === b.horizontal) {
        const overlap = Math.min(a.hi, b.hi) - Math.max(a.lo, b.lo);
        const gap = Math.abs(a.c - b.c);
        if (overlap > EPS && gap < EPS) fault("sharedTracks", `${where} share a track at ${a.c}`);
        else if (overlap > EPS && gap < CROWDED_PX)
          fault("crowdedTracks", `${where} run ${gap.toFixed(1)} px apart`);
        else if (overlap > -EPS && gap < EPS)
          fault("falseConnections", `${where} meet end to end at ${a.c}`);
        continue;
      }
      const [h, v] = a.horizontal ? [a, b] : [b, a];
      const x = v.c;
      const y = h.c;
      if (x < h.lo - EPS || x > h.hi + EPS || y < v.lo - EPS || y > v.hi + EPS) continue;
      const p = { x, y };
      if (onSegment(h, p) === "inside" && onSegment(v, p) === "inside") report.crossings += 1;
      else fault("falseConnections", `${where} touch at (${x}, ${y})`);
    }
  }

  // Pins of one net on another net's wire read as connections.
  for (const pin of pins)
    for (const s of segs)
      if (s.net !== pin.net && onSegment(s, pin) !== null)
        fault("falseConnections", `net ${s.net} runs over pin ${pin.owner}.${pin.role}`);

  // Junction dots: count the directions leaving every candidate point of each net.
  const candidates = new Map<string, { net: string; p: Point }>();
  const addCandidate = (net: string, p: Point): void => {
    candidates.set(`${net}\u0000${key(p)}`, { net, p });
  };
  for (const s of segs) {
    addCandidate(s.net, pointOf(s, s.lo));
    addCandidate(s.net, pointOf(s, s.hi));
  }
  for (const pin of pins) addCandidate(pin.net, pin);
  for (const a of segs)
    for (const b of segs)
      if (a.net === b.net && a.horizontal && !b.horizontal) {
        const p = { x: b.c, y: a.c };
        if (onSegment(a, p) && onSegment(b, p)) addCandidate(a.net, p);
      }
  const degree = (net: string, p: Point): number => {
    const dirs = new Set<string>();
    for (const s of segs)
      if (s.net === net && onSegment(s, p) !== null)
        for (const d of directionsAt(s, p)) dirs.add(d);
    const pinCount = pins.filter((q) => q.net === net && near(q.x, p.x) && near(q.y, p.y)).length;
    return dirs.size + pinCount;
  };
  const dotAt = new Set(layout.junctions.map((j) => `${j.net}\u0000${key(j)}`));
  for (const [k, { net, p }] of candidates) {
    const d = degree(net, p);
    if (d >= 3 && !dotAt.has(k)) fault("missingDots", `net ${net}: no dot at (${p.x}, ${p.y})`);
  }
  for (const j of layout.junctions)
    if (degree(j.net, j) < 3) fault("strayDots", `net ${j.net}: stray dot at (${j.x}, ${j.y})`);
  // A dot of one net on another net's wire joins them to the eye.
  for (const j of layout.junctions)
    for (const s of segs)
      if (s.net !== j.net && onSegment(s, j) !== null)
        fault("falseConnections", `dot of ${j.net} on net ${s.net}`);

  // Boxes: parts and terminals apart, no wire through a body.
  const bodies: (Box & { name: string })[] = [
    ...layout.parts.map((p) => ({ ...p, name: p.ref })),
    ...layout.terminals.map((t) => ({ ...t, name: `${t.kind} terminal` })),
  ];
  for (let i = 0; i < bodies.length; i++)
    for (let j = i + 1; j < bodies.length; j++)
      if (interiorOverlap(bodies[i]!, bodies[j]!))
        fault("boxOverlaps", `${bodies[i]!.name} overlaps ${bodies[j]!.name}`);
  for (const b of bodies)
    for (const s of segs)
      if (segmentInBox(s, b, 0.5))
        fault("wiresThroughBodies", `net ${s.net} runs through ${b.name}`);

  // Labels: clear of wires, dots, bodies and each other.
  const labels: (Box & { text: string })[] = [
    ...layout.parts.flatMap((p) => p.labels),
    ...layout.netLabels,
    ...layout.terminals.map((t) => t.caption),
  ];
  for (let i = 0; i < labels.length; i++) {
    const l = labels[i]!;
    for (let j = i + 1; j < labels.length; j++)
      if (interiorOverlap(l, labels[j]!, 0))
        fault("labelsTouching", `label "${l.text}" touches label "${labels[j]!.text}"`);
    for (const b of bodies)
      if (interiorOverlap(l, b, 0)) fault("labelsTouching", `label "${l.text}" covers ${b.name}`);
    for (const s of segs)
      if (segmentInBox(s, l, -0.75))
        fault("labelsTouching", `label "${l.text}" touches net ${s.net}`);
    for (const d of layout.junctions) {
      const dot = {
        x: d.x - DOT_RADIUS_PX,
        y: d.y - DOT_RADIUS_PX,
        width: 2 * DOT_RADIUS_PX,
        height: 2 * DOT_RADIUS_PX,
      };
      if (interiorOverlap(l, dot, 0)) fault("labelsTouching", `label "${l.text}" covers a dot`);
    }
  }

  // An isolation boundary crosses only its own transformer and touches no label.
  for (const b of layout.barriers ?? []) {
    const line: Segment = { net: "", horizontal: false, c: b.x, lo: b.y1, hi: b.y2 };
    for (const body of bodies)
      if (body.name !== b.ref && segmentInBox(line, body, 0.5))
        fault("boxOverlaps", `the isolation boundary of ${b.ref} runs through ${body.name}`);
    for (const l of labels)
      if (segmentInBox(line, l, -0.75))
        fault("labelsTouching", `label "${l.text}" touches the isolation boundary of ${b.ref}`);
  }

  // Every net drawn as one connected piece joining all of its pins.
  const uf = new UnionFind();
  const nets = new Set(pins.map((p) => p.net));
  for (const net of nets) {
    const own = segs.filter((s) => s.net === net);
    const ownPins = pins.filter((p) => p.net === net);
    if (ownPins.length < 2) continue;
    own.forEach((s, i) => {
      own.forEach((t, k) => {
        if (k <= i) return;
        const touch =
          s.horizontal === t.horizontal
            ? near(s.c, t.c) && s.lo <= t.hi + EPS && t.lo <= s.hi + EPS
            : (() => {
                const [h, v] = s.horizontal ? [s, t] : [t, s];
                const p = { x: v.c, y: h.c };
                return onSegment(h, p) !== null && onSegment(v, p) !== null;
              })();
        if (touch) uf.union(`${net}#${i}`, `${net}#${k}`);
      });
    });
    ownPins.forEach((pin, pi) => {
      own.forEach((s, i) => {
        if (onSegment(s, pin) !== null) uf.union(`${net}@${pi}`, `${net}#${i}`);
      });
    });
    const roots = new Set(ownPins.map((_, pi) => uf.find(`${net}@${pi}`)));
    if (roots.size > 1) fault("brokenNets", `net ${net} is drawn in ${roots.size} pieces`);
  }
  return report;
}

/** The faults a drawing must never have. */
export function hardFaults(r: DrawingReport): number {
  return (
    r.strayDots +
    r.missingDots +
    r.sharedTracks +
    r.crowdedTracks +
    r.falseConnections +
    r.diagonalWires +
    r.boxOverlaps +
    r.wiresThroughBodies +
    r.labelsTouching +
    r.brokenNets
  );
}
