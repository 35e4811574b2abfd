/**
 * The layered layout's settings: the caller's spacings, checked, plus the fixed choices that
 * keep runs repeatable and a 40-part layout inside its time budget.
 */
import type { LayeredSettings } from "./elk-adapter.js";
import { LABEL_GAP_PX } from "./label-candidates.js";
import type { LayoutResult, SchematicLayoutOptions } from "./layout-types.js";

const DEFAULT_NODE_SPACING_PX = 30;
const DEFAULT_LAYER_SPACING_PX = 40;
const DEFAULT_PADDING_PX = 20;
const EDGE_SPACING_PX = 10;
const EDGE_NODE_SPACING_PX = 12;
/** ELK's own seed; fixed so runs repeat (the layered algorithm uses it for tie-breaking). */
const ELK_RANDOM_SEED = 1;
/**
 * ELK's crossing-minimisation effort. Its default (7) took about twice the time on 40-part
 * circuits for about 3% fewer crossings (measured with the layout-quality bench); 3 keeps a
 * 40-part layout well inside its time budget.
 */
const ELK_THOROUGHNESS = 3;
/** Largest spacing accepted from a caller; beyond it the drawing is useless anyway. */
const MAX_SPACING_PX = 1000;

type Invalid = Extract<LayoutResult, { ok: false }>;

export function settingsFrom(opts: SchematicLayoutOptions): LayeredSettings | Invalid {
  const pick = (
    name: "nodeSpacingPx" | "layerSpacingPx" | "paddingPx",
    fallback: number,
  ): number | Invalid => {
    const v = opts[name] ?? fallback;
    if (!Number.isFinite(v) || v < 0 || v > MAX_SPACING_PX) {
      return {
        ok: false,
        code: "invalid-layout-option",
        message: `${name} must be a number from 0 to ${MAX_SPACING_PX}, got ${v}`,
        where: name,
      };
    }
    return v;
  };
  const nodeSpacingPx = pick("nodeSpacingPx", DEFAULT_NODE_SPACING_PX);
  if (typeof nodeSpacingPx !== "number") return nodeSpacingPx;
  const layerSpacingPx = pick("layerSpacingPx", DEFAULT_LAYER_SPACING_PX);
  if (typeof layerSpacingPx !== "number") return layerSpacingPx;
  const paddingPx = pick("paddingPx", DEFAULT_PADDING_PX);
  if (typeof paddingPx !== "number") return paddingPx;
  return {
    nodeSpacingPx,
    layerSpacingPx,
    paddingPx,
    edgeSpacingPx: EDGE_SPACING_PX,
    edgeNodeSpacingPx: EDGE_NODE_SPACING_PX,
    labelGapPx: LABEL_GAP_PX,
    randomSeed: ELK_RANDOM_SEED,
    thoroughness: ELK_THOROUGHNESS,
  };
}
