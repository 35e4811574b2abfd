/**
 * A voltage divider as the trade draws it: two resistors standing one above the other, the
 * tap between them leading off to the right. The dividers are the engine's own block finder's
 * (blocks/voltage-divider.ts); each is laid out by ELK as one box and opened up afterwards,
 * as a bridge is.
 *
 * The box: the two resistors stand in a column near its left edge, their labels to their
 * right inside the box (so nothing ELK places can crowd them); the upper net's lead leaves the
 * top resistor upward and turns to a west port at the box's top corner, the lower net's lead
 * leaves the bottom resistor downward and turns to a west port at the bottom corner (or, when
 * it is a bottom rail, goes straight down to a port below the column), and the tap leads east
 * to a port on the right edge.
 */
import type { Block } from "../blocks/block-types.js";
import type { Part, TeardownRecord } from "../record/types.js";
import type { Box, PlacedPart, PlacedPin, Point, Side, WireSection } from "./layout-types.js";
import { labelSize } from "./text-size.js";

/** A resistor stood upright: its box. */
const RES_WIDTH_PX = 20;
const RES_LENGTH_PX = 60;
/** Room above and below the column for the leads to turn to their ports. */
const END_PX = 10;
/** Gap between the two resistors, where the tap leaves. */
const TAP_GAP_PX = 30;
/** x of the column's centre line, from the box's left edge. */
const COLUMN_X_PX = 20;
/** Air between a resistor and its labels. */
const LABEL_GAP_PX = 4;

/** Two resistors forming a divider, upper one first, with their nets. */
export interface DividerMatch {
  upper: Part;
  lower: Part;
  top: string;
  tap: string;
  bottom: string;
  /** The bottom net is a bottom rail: its lead leaves straight down, to drop onto the rail. */
  bottomDown: boolean;
}

const otherPin = (p: Part, net: string): string =>
  Object.values(p.pins).find((n) => n !== net) ?? net;

const isPlainResistor = (p: Part): boolean =>
  p.kind === "resistor" && Object.keys(p.pins).length === 2 && "a" in p.pins && "b" in p.pins;

/**
 * The record's dividers whose two resistors are plain two-pin resistors, each resistor in one
 * divider at most (the first by ref order wins). The end on a `downNets` net (the neutral or
 * a return) goes at the bottom; otherwise the resistor first by ref is the upper one.
 */
export function findDividers(
  record: TeardownRecord,
  blocks: readonly Block[],
  downNets: ReadonlySet<string>,
  taken: ReadonlySet<string>,
): DividerMatch[] {
  const byRef = new Map(record.parts.map((p) => [p.ref, p]));
  const used = new Set(taken);
  const out: DividerMatch[] = [];
  for (const block of blocks) {
    if (block.kind !== "voltage-divider" || block.parts.length !== 2) continue;
    const [a, b] = block.parts.map((r) => byRef.get(r)) as [Part | undefined, Part | undefined];
    if (a === undefined || b === undefined || used.has(a.ref) || used.has(b.ref)) continue;
    if (!isPlainResistor(a) || !isPlainResistor(b)) continue;
    const shared = Object.values(a.pins).filter((n) => Object.values(b.pins).includes(n));
    if (shared.length !== 1) continue;
    const tap = shared[0]!;
    const [upper, lower] = downNets.has(otherPin(a, tap)) ? [b, a] : [a, b];
    const top = otherPin(upper, tap);
    const bottom = otherPin(lower, tap);
    if (top === tap || bottom === tap || top === bottom) continue;
    used.add(a.ref);
    used.add(b.ref);
    out.push({ upper, lower, top, tap, bottom, bottomDown: downNets.has(bottom) });
  }
  return out;
}

/** The texts written beside a resistor: its ref, then its value when it has one. */
function textsOf(p: Part): { text: string; of: "ref" | "value" }[] {
  const out: { text: string; of: "ref" | "value" }[] = [{ text: p.ref, of: "ref" }];
  if (p.value_text !== null && p.value_text !== "") out.push({ text: p.value_text, of: "value" });
  return out;
}

/** The divider's box size: the column plus room for the widest label beside it. */
export function dividerSize(m: DividerMatch): { width: number; height: number } {
  const widest = Math.max(
    ...[...textsOf(m.upper), ...textsOf(m.lower)].map((t) => labelSize(t.text).width),
  );
  const width = Math.ceil((COLUMN_X_PX + RES_WIDTH_PX / 2 + LABEL_GAP_PX + widest + 2) / 10) * 10;
  return { width, height: 2 * END_PX + 2 * RES_LENGTH_PX + TAP_GAP_PX };
}

/** The box's three ports, relative to its top-left corner. */
export function dividerPorts(
  m: DividerMatch,
): { key: "top" | "tap" | "bottom"; net: string; side: Side; x: number; y: number }[] {
  const { width, height } = dividerSize(m);
  return [
    { key: "top", net: m.top, side: "WEST", x: 0, y: 0 },
    { key: "tap", net: m.tap, side: "EAST", x: width, y: height / 2 },
    m.bottomDown
      ? { key: "bottom", net: m.bottom, side: "SOUTH", x: COLUMN_X_PX, y: height }
      : { key: "bottom", net: m.bottom, side: "WEST", x: 0, y: height },
  ];
}

/** The divider opened up at its placed box: two upright resistors, labels and leads. */
export function expandDivider(
  m: DividerMatch,
  box: Box,
): {
  parts: PlacedPart[];
  wires: { net: string; section: WireSection }[];
} {
  const at = (x: number, y: number): Point => ({ x: box.x + x, y: box.y + y });
  const { width, height } = dividerSize(m);
  const y0 = END_PX;
  const y1 = END_PX + RES_LENGTH_PX;
  const y2 = y1 + TAP_GAP_PX;
  const y3 = y2 + RES_LENGTH_PX;
  const cx = COLUMN_X_PX;
  const resistor = (p: Part, upNet: string, yTop: number, yBottom: number): PlacedPart => {
    // Turned 90 degrees clockwise pin a faces up; 270, pin b does.
    const rotation = p.pins.a === upNet ? 90 : 270;
    const pins: PlacedPin[] = Object.entries(p.pins).map(([role, net]) => {
      const up = net === upNet && (role === "a") === (rotation === 90);
      const pt = at(cx, up ? yTop : yBottom);
      return { role, net, x: pt.x, y: pt.y, side: up ? "NORTH" : "SOUTH" };
    });
    const texts = textsOf(p);
    const mid = (yTop + yBottom) / 2;
    const labels = texts.map((t, i) => {
      const size = labelSize(t.text);
      const y = mid - (texts.length * size.height) / 2 + i * size.height;
      return { ...at(cx + RES_WIDTH_PX / 2 + LABEL_GAP_PX, y), ...size, text: t.text, of: t.of };
    });
    return {
      ref: p.ref,
      kind: p.kind,
      symbol: "resistor",
      rotation,
      ...at(cx - RES_WIDTH_PX / 2, yTop),
      width: RES_WIDTH_PX,
      height: yBottom - yTop,
      pins,
      labels,
    };
  };
  const parts = [resistor(m.upper, m.top, y0, y1), resistor(m.lower, m.tap, y2, y3)];
  const tapY = height / 2;
  const wires = [
    { net: m.top, section: { start: at(cx, y0), end: at(0, 0), bends: [at(cx, 0)] } },
    { net: m.tap, section: { start: at(cx, y1), end: at(cx, y2), bends: [] } },
    { net: m.tap, section: { start: at(cx, tapY), end: at(width, tapY), bends: [] } },
    m.bottomDown
      ? { net: m.bottom, section: { start: at(cx, y3), end: at(cx, height), bends: [] } }
      : {
          net: m.bottom,
          section: { start: at(cx, y3), end: at(0, height), bends: [at(cx, height)] },
        },
  ];
  return { parts, wires };
}
