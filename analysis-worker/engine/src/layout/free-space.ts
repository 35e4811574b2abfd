/**
 * Finding room for a label: a set of boxes nothing may cover (parts, terminals, junction dots,
 * labels already placed) and thin boxes along the wires, which a label may not touch either (a
 * name sitting on a wire reads as belonging to it). A label takes the first candidate that is
 * clear; when none is, a widening search around its anchor always ends, because past the
 * drawing's edge everything is clear.
 */
import type { Box, Point, WireSection } from "./layout-types.js";

/** Labels keep this much air from everything they must not cover. */
export const LABEL_CLEARANCE_PX = 1;
/** Step between the rings of the widening search. */
const SEARCH_STEP_PX = 6;
/** Positions tried on each ring of the widening search. */
const SEARCH_DIRECTIONS = 16;

/** A plain copy of a box's position and size (dropping whatever else the object carries). */
export const boxOf = (b: Box): Box => ({ x: b.x, y: b.y, width: b.width, height: b.height });

/** True when the two boxes share some area (touching edges do not count). */
export function boxesOverlap(a: Box, b: Box): boolean {
  return a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
}

function inflate(b: Box, by: number): Box {
  return { x: b.x - by, y: b.y - by, width: b.width + 2 * by, height: b.height + 2 * by };
}

/** The segments of a wire section as hair-thin boxes. */
export function sectionBoxes(section: WireSection): Box[] {
  const points = [section.start, ...section.bends, section.end];
  const boxes: Box[] = [];
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1]!;
    const b = points[i]!;
    const x = Math.min(a.x, b.x);
    const y = Math.min(a.y, b.y);
    boxes.push({
      x: x - 0.5,
      y: y - 0.5,
      width: Math.abs(a.x - b.x) + 1,
      height: Math.abs(a.y - b.y) + 1,
    });
  }
  return boxes;
}

/** The smallest box around all the given boxes, or null for none. */
export function boundsOf(boxes: readonly Box[]): Box | null {
  if (boxes.length === 0) return null;
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const b of boxes) {
    x0 = Math.min(x0, b.x);
    y0 = Math.min(y0, b.y);
    x1 = Math.max(x1, b.x + b.width);
    y1 = Math.max(y1, b.y + b.height);
  }
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

/** The occupied parts of the drawing, growing as labels are placed. */
export class FreeSpace {
  private readonly solid: Box[] = [];
  private readonly wires: Box[] = [];
  private extent: Box | null = null;

  /** Marks a box that no label may cover. */
  addSolid(box: Box): void {
    this.solid.push(box);
    this.extent = boundsOf(this.extent === null ? [box] : [this.extent, box]);
  }

  /** Marks a wire that labels avoid where they can. */
  addWire(section: WireSection): void {
    for (const b of sectionBoxes(section)) {
      this.wires.push(b);
      this.extent = boundsOf(this.extent === null ? [b] : [this.extent, b]);
    }
  }

  /** Whether a box could go here: clear of solids and wires, with a little air. */
  isClear(box: Box): boolean {
    const padded = inflate(box, LABEL_CLEARANCE_PX);
    if (this.solid.some((s) => boxesOverlap(padded, s))) return false;
    return !this.wires.some((w) => boxesOverlap(padded, w));
  }

  /**
   * Places a box of the given size at the first clear candidate (top-left corners, in order of
   * preference), else by a widening search around `anchor`; the placed box becomes solid.
   */
  place(width: number, height: number, candidates: readonly Point[], anchor: Point): Box {
    const at = (p: Point): Box => ({ x: p.x, y: p.y, width, height });
    for (const c of candidates) {
      if (this.isClear(at(c))) return this.take(at(c));
    }
    const reach =
      this.extent === null ? 0 : Math.max(this.extent.width, this.extent.height) + width + height;
    const rings = Math.ceil(reach / SEARCH_STEP_PX) + 2;
    for (let ring = 1; ring <= rings; ring++) {
      const r = ring * SEARCH_STEP_PX;
      for (let k = 0; k < SEARCH_DIRECTIONS; k++) {
        const angle = (2 * Math.PI * k) / SEARCH_DIRECTIONS;
        const box = at({
          x: Math.round(anchor.x + r * Math.cos(angle) - width / 2),
          y: Math.round(anchor.y - r * Math.sin(angle) - height / 2),
        });
        if (this.isClear(box)) return this.take(box);
      }
    }
    // Past the last ring the box is outside everything placed so far, so this cannot happen.
    throw new Error(`free-space search found no room for a ${width}x${height} label`);
  }

  private take(box: Box): Box {
    this.addSolid(box);
    return box;
  }
}
