/**
 * Marks a fragment's parts on an entry's schematic. The engine draws the schematic; this adds,
 * for each matched part, a `data-matched` attribute on its symbol (the page's style thickens it)
 * and, over the drawing, a dashed frame round the part with a tag under it naming the fragment's
 * ref, so the match reads in black and white, not by colour alone.
 */
import { renderSchematicSvg, type SchematicLayout } from "@teardown/engine";

/** Space between a part's box and its frame, in drawing units. */
const FRAME_GAP_PX = 5;
/** The tag's text size and the width of one character of it (a safe over-estimate). */
const TAG_FONT_PX = 11;
const TAG_CHAR_PX = 7;

function escapeXml(s: string): string {
  return s
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;")
    .replace(/'/g, "&apos;");
}

const num = (n: number) => (Math.round(n * 10) / 10).toString();

/** True when a stored layout has what the renderer draws. */
export function isDrawableLayout(layout: unknown): layout is SchematicLayout {
  const l = layout as Partial<SchematicLayout> | null;
  return !!l && Array.isArray(l.parts) && Array.isArray(l.wires);
}

/**
 * The schematic as SVG text with the parts in `matched` (entry ref → fragment ref) marked.
 * Refs the layout does not hold are skipped (the caller lists every pair in words anyway).
 */
export function markedSchematicSvg(
  layout: SchematicLayout,
  matched: Record<string, string>,
): string {
  let svg = renderSchematicSvg(layout);
  const frames: string[] = [];
  for (const part of layout.parts) {
    const fragmentRef = matched[part.ref];
    if (fragmentRef === undefined) continue;
    const ref = escapeXml(part.ref);
    // The renderer writes each symbol's group as `<g data-ref="REF" ...`, its ref escaped.
    svg = svg.replace(
      `<g data-ref="${ref}" `,
      `<g data-ref="${ref}" data-matched="${escapeXml(fragmentRef)}" `,
    );
    const x = part.x - FRAME_GAP_PX;
    const y = part.y - FRAME_GAP_PX;
    const tag = `= ${fragmentRef}`;
    const tagWidth = tag.length * TAG_CHAR_PX + 6;
    // The tag hangs under the frame: the part's ref and value labels sit above or beside it.
    const bottom = part.y + part.height + FRAME_GAP_PX;
    frames.push(
      `<g data-match-frame="${ref}">` +
        `<rect x="${num(x)}" y="${num(y)}" width="${num(part.width + 2 * FRAME_GAP_PX)}" height="${num(part.height + 2 * FRAME_GAP_PX)}" fill="none" stroke="#000" stroke-width="2.5" stroke-dasharray="6 3"/>` +
        `<rect x="${num(x)}" y="${num(bottom)}" width="${num(tagWidth)}" height="${num(TAG_FONT_PX + 4)}" fill="#000"/>` +
        `<text x="${num(x + 3)}" y="${num(bottom + TAG_FONT_PX)}" font-size="${TAG_FONT_PX}" font-weight="bold" fill="#fff">${escapeXml(tag)}</text>` +
        `</g>`,
    );
  }
  return svg.replace(/<\/svg>\s*$/, `<g data-match-frames="">${frames.join("")}</g></svg>`);
}
