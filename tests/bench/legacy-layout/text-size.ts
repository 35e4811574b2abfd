/**
 * Text boxes without a font engine: the layout must run in a worker with no canvas, so label
 * sizes come from a fixed per-character width. `render-svg.ts` draws with the same font size,
 * so a drawn label stays inside the box the layout reserved for it.
 */

/** Font size the renderer uses for every label. */
export const LABEL_FONT_SIZE_PX = 11;
/** Mean advance of one character of an 11 px sans-serif face, rounded up so boxes err wide. */
export const LABEL_CHAR_WIDTH_PX = 7;
/** Space left and right of the text inside its box. */
export const LABEL_PADDING_PX = 2;
/** Height of a one-line label box. */
export const LABEL_HEIGHT_PX = 14;

/** The box a one-line label of `text` needs, in pixels. */
export function labelSize(text: string): { width: number; height: number } {
  // Count code points, not UTF-16 units, so "Ω" and "µ" are one character each.
  const chars = Array.from(text).length;
  return { width: chars * LABEL_CHAR_WIDTH_PX + 2 * LABEL_PADDING_PX, height: LABEL_HEIGHT_PX };
}
