/**
 * Where a label may go, nearest first: around a part's box on its preferred side, and for a
 * net's name beside its junctions or along its longest runs. `FreeSpace` takes the first clear one.
 */
import type { GraphNode } from "./layout-graph.js";
import type { Box, PlacedJunction, Point, WireSection } from "./layout-types.js";

/** Half the side of the square kept clear around a junction dot (the dot's radius is 3.5). */
const DOT_CLEAR_RADIUS_PX = 4;
/** Air between a part and its labels. */
export const LABEL_GAP_PX = 3;

/** The drawn dot's square, so no label covers it. */
export function dotBox(p: Point): Box {
  const r = DOT_CLEAR_RADIUS_PX;
  return { x: p.x - r, y: p.y - r, width: 2 * r, height: 2 * r };
}

/** Label positions to try around a box, nearest first, starting on the preferred side. */
export function candidatesAround(
  box: Box,
  width: number,
  height: number,
  first: GraphNode["labelSide"],
): Point[] {
  const cx = box.x + box.width / 2;
  const cy = box.y + box.height / 2;
  const g = LABEL_GAP_PX;
  const bySide: Record<GraphNode["labelSide"], Point[]> = {
    NORTH: [],
    SOUTH: [],
    EAST: [],
    WEST: [],
  };
  for (let k = 0; k < 3; k++) {
    const dy = k * (height + 1);
    bySide.NORTH.push({ x: cx - width / 2, y: box.y - g - height - dy });
    bySide.SOUTH.push({ x: cx - width / 2, y: box.y + box.height + g + dy });
    bySide.EAST.push(
      { x: box.x + box.width + g, y: cy - height / 2 - dy },
      { x: box.x + box.width + g, y: cy - height / 2 + dy },
    );
    bySide.WEST.push(
      { x: box.x - g - width, y: cy - height / 2 - dy },
      { x: box.x - g - width, y: cy - height / 2 + dy },
    );
  }
  const order = [
    first,
    ...(["NORTH", "SOUTH", "EAST", "WEST"] as const).filter((s) => s !== first),
  ];
  return order.flatMap((s) => bySide[s]);
}

/** Where a net's name may go: beside its junction, then above or below its longest runs. */
export function netLabelCandidates(
  sections: readonly WireSection[],
  junctions: readonly PlacedJunction[],
  width: number,
  height: number,
): Point[] {
  const out: Point[] = [];
  for (const j of junctions) {
    out.push(
      { x: j.x + 4, y: j.y - 4 - height },
      { x: j.x - 4 - width, y: j.y - 4 - height },
      { x: j.x + 4, y: j.y + 4 },
      { x: j.x - 4 - width, y: j.y + 4 },
    );
  }
  const runs: { x0: number; x1: number; y: number }[] = [];
  for (const s of sections) {
    const pts = [s.start, ...s.bends, s.end];
    for (let i = 1; i < pts.length; i++) {
      const a = pts[i - 1]!;
      const b = pts[i]!;
      if (a.y === b.y && a.x !== b.x)
        runs.push({ x0: Math.min(a.x, b.x), x1: Math.max(a.x, b.x), y: a.y });
    }
  }
  runs.sort((a, b) => b.x1 - b.x0 - (a.x1 - a.x0) || a.y - b.y || a.x0 - b.x0);
  for (const r of runs) {
    const mid = (r.x0 + r.x1) / 2 - width / 2;
    out.push(
      { x: mid, y: r.y - 2 - height },
      { x: mid, y: r.y + 2 },
      { x: r.x0 + 3, y: r.y - 2 - height },
      { x: r.x1 - 3 - width, y: r.y - 2 - height },
    );
  }
  return out;
}
