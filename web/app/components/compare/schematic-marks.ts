/**
 * The comparison's marks drawn over a stored schematic: each matched part carries its pair
 * number (the same number on both boards), a part whose values differ gets a dashed outline and
 * "≠", a part on one board only a hatched box and "only A" or "only B". Shape and text carry the
 * meaning, so the marks read without colour. Pure: layout and marks in, SVG text out.
 */
import { renderSchematicSvg, type SchematicLayout } from "@teardown/engine";

/** What to mark on one part. */
export interface PartMark {
  pair: number | null;
  differs: boolean;
  onlyHere: boolean;
}

const MARK_INK = "#5b2a86";
const TAG_FONT_PX = 11;
const TAG_HEIGHT_PX = 14;
const OUTLINE_PAD_PX = 4;

function esc(s: string): string {
  return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** Width of a tag's text, roughly (the renderer's own labels use the same font). */
function tagWidth(text: string): number {
  return Math.ceil(text.length * TAG_FONT_PX * 0.62) + 6;
}

/** The schematic of one board with the comparison's marks, or null when it cannot be drawn. */
export function markedSchematicSvg(
  layout: unknown,
  marks: ReadonlyMap<string, PartMark>,
  side: "A" | "B",
): string | null {
  const l = layout as Partial<SchematicLayout> | null;
  if (l === null || typeof l !== "object" || !Array.isArray(l.parts) || !Array.isArray(l.wires))
    return null;
  let svg: string;
  try {
    svg = renderSchematicSvg(l as SchematicLayout);
  } catch {
    return null;
  }
  const hatch = `compare-hatch-${side}`;
  const out: string[] = [
    `<defs><pattern id="${hatch}" patternUnits="userSpaceOnUse" width="6" height="6" patternTransform="rotate(45)"><line x1="0" y1="0" x2="0" y2="6" stroke="${MARK_INK}" stroke-width="1.5"/></pattern></defs>`,
  ];
  for (const p of l.parts) {
    const m = marks.get(p.ref);
    if (m === undefined) continue;
    const x = p.x - OUTLINE_PAD_PX;
    const y = p.y - OUTLINE_PAD_PX;
    const w = p.width + 2 * OUTLINE_PAD_PX;
    const h = p.height + 2 * OUTLINE_PAD_PX;
    const attrs = `data-compare-ref="${esc(p.ref)}"`;
    if (m.onlyHere)
      out.push(
        `<rect ${attrs} data-compare="only" x="${x}" y="${y}" width="${w}" height="${h}" fill="url(#${hatch})" fill-opacity="0.35" stroke="${MARK_INK}" stroke-width="2.5"/>`,
      );
    else if (m.differs)
      out.push(
        `<rect ${attrs} data-compare="differs" x="${x}" y="${y}" width="${w}" height="${h}" fill="none" stroke="${MARK_INK}" stroke-width="2" stroke-dasharray="5 3"/>`,
      );
    const tag = m.onlyHere ? `only ${side}` : `#${m.pair}${m.differs ? " ≠" : ""}`;
    const tw = tagWidth(tag);
    const ty = Math.max(0, y - TAG_HEIGHT_PX);
    out.push(
      `<g ${attrs} data-compare-tag="${esc(tag)}"><rect x="${x}" y="${ty}" width="${tw}" height="${TAG_HEIGHT_PX}" fill="#ffffff" stroke="${MARK_INK}" stroke-width="1"${m.onlyHere || m.differs ? "" : ' stroke-dasharray="1 0"'}/><text x="${x + 3}" y="${ty + TAG_HEIGHT_PX - 3}" font-size="${TAG_FONT_PX}" font-weight="bold" fill="${MARK_INK}">${esc(tag)}</text></g>`,
    );
  }
  return svg.replace(/<\/svg>\s*$/, `${out.join("\n")}\n</svg>`);
}
