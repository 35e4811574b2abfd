/**
 * The last step of a layout: the whole drawing moved so it starts `padding` from the top-left
 * corner, and its width and height measured, labels included.
 */
import { boundsOf, sectionBoxes } from "./free-space.js";
import type { Box, Point, SchematicLayout } from "./layout-types.js";

function shiftPoint(p: Point, dx: number, dy: number): Point {
  return { x: p.x + dx, y: p.y + dy };
}

/** Moves everything so the whole drawing, labels included, sits `padding` from the top-left. */
export function normalise(
  body: Omit<SchematicLayout, "width" | "height">,
  padding: number,
): SchematicLayout {
  const boxes: Box[] = [
    ...body.parts.flatMap((p) => [p, ...p.labels]),
    ...body.terminals.flatMap((t) => [t, t.caption]),
    ...body.netLabels,
    ...body.wires.flatMap((w) => w.sections.flatMap(sectionBoxes)),
    ...body.junctions.map((j) => ({ x: j.x, y: j.y, width: 0, height: 0 })),
    ...(body.barriers ?? []).map((b) => ({ x: b.x, y: b.y1, width: 0, height: b.y2 - b.y1 })),
  ];
  const bounds = boundsOf(boxes) ?? { x: padding, y: padding, width: 0, height: 0 };
  const dx = padding - bounds.x;
  const dy = padding - bounds.y;
  const move = <T extends Point>(b: T): T => ({ ...b, x: b.x + dx, y: b.y + dy });
  return {
    width: bounds.width + 2 * padding,
    height: bounds.height + 2 * padding,
    parts: body.parts.map((p) => ({
      ...move(p),
      pins: p.pins.map(move),
      labels: p.labels.map(move),
    })),
    terminals: body.terminals.map((t) => ({
      ...move(t),
      pins: t.pins.map(move),
      caption: move(t.caption),
    })),
    junctions: body.junctions.map(move),
    netLabels: body.netLabels.map(move),
    ...(body.barriers
      ? {
          barriers: body.barriers.map((b) => ({ ...b, x: b.x + dx, y1: b.y1 + dy, y2: b.y2 + dy })),
        }
      : {}),
    wires: body.wires.map((w) => ({
      ...w,
      sections: w.sections.map((s) => ({
        start: shiftPoint(s.start, dx, dy),
        end: shiftPoint(s.end, dx, dy),
        bends: s.bends.map((b) => shiftPoint(b, dx, dy)),
      })),
    })),
  };
}
