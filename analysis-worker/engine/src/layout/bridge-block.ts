/**
 * The bridge rectifier as the trade draws it: four diodes on the sides of a diamond, the AC
 * inputs at the left and right corners, the positive output at the top, the negative at the
 * bottom. The four diodes are found in the record by their wiring alone (two share a cathode
 * net, two share an anode net, and each AC net has one anode and one cathode), laid out by ELK
 * as one box with four ports, and opened up again into four diagonal diodes afterwards.
 *
 * The box (BRIDGE_SIZE_PX square): the diamond's corners sit MARGIN inside it; the left AC
 * corner leads straight out west; the right AC corner leads right and down to a south port (so
 * a neutral coming along the bottom enters from below); the positive corner leads up and right
 * to an east port; the negative corner leads down to a south port.
 */
import type { Part } from "../record/types.js";
import type { Box, PlacedPart, PlacedPin, Point, Side, WireSection } from "./layout-types.js";

/** Half the diamond's width: each diode fills a HALF x HALF quadrant. */
const HALF_PX = 40;
/** Room between the diamond and the box edge, where the corner leads run. */
const MARGIN_PX = 10;
/** Side of the bridge's box. */
export const BRIDGE_SIZE_PX = 2 * HALF_PX + 2 * MARGIN_PX;
/** How far inside the box edge the positive and right-hand AC leads run. */
const LEAD_INSET_PX = MARGIN_PX / 2;

/** Four diodes forming a bridge, with the nets at its corners. */
export interface BridgeMatch {
  /** AC net at the left corner, AC net at the right corner, DC plus (top), DC minus (bottom). */
  left: string;
  right: string;
  plus: string;
  minus: string;
  /** The diodes on each side of the diamond. */
  topLeft: Part;
  topRight: Part;
  bottomLeft: Part;
  bottomRight: Part;
}

const isDiode = (p: Part): boolean =>
  p.kind === "diode" && p.pins.anode !== undefined && p.pins.cathode !== undefined;

/**
 * Every bridge among the parts (parts in ref order, each diode in one bridge at most). Of the
 * two AC nets, a neutral goes to the right corner (its lead leaves downward, toward the bottom
 * return); otherwise the first by name goes left.
 */
export function findBridges(parts: readonly Part[], neutral: ReadonlySet<string>): BridgeMatch[] {
  const diodes = parts.filter(isDiode);
  const used = new Set<Part>();
  const found: BridgeMatch[] = [];
  const free = (p: Part): boolean => !used.has(p);
  for (const a of diodes) {
    for (const b of diodes) {
      if (a === b || !free(a) || !free(b)) continue;
      const plus = a.pins.cathode!;
      const [x, y] = [a.pins.anode!, b.pins.anode!];
      if (b.pins.cathode !== plus || x === y || x === plus || y === plus) continue;
      const c = diodes.find((d) => free(d) && d !== a && d !== b && d.pins.cathode === x);
      if (c === undefined) continue;
      const minus = c.pins.anode!;
      const d = diodes.find(
        (e) =>
          free(e) &&
          e !== a &&
          e !== b &&
          e !== c &&
          e.pins.cathode === y &&
          e.pins.anode === minus,
      );
      if (d === undefined || minus === plus || minus === x || minus === y) continue;
      // x is fed by a (to plus) and c (from minus); y by b and d.
      const swap = neutral.has(x) && !neutral.has(y) ? true : !neutral.has(y) && x > y;
      const [left, right] = swap ? [y, x] : [x, y];
      const byAc = (net: string): [Part, Part] => (net === x ? [a, c] : [b, d]);
      const [topLeft, bottomLeft] = byAc(left);
      const [topRight, bottomRight] = byAc(right);
      for (const p of [a, b, c, d]) used.add(p);
      found.push({ left, right, plus, minus, topLeft, topRight, bottomLeft, bottomRight });
    }
  }
  return found;
}

/** The bridge box's four ports, relative to its top-left corner. */
export function bridgePorts(
  m: BridgeMatch,
): { key: "left" | "right" | "plus" | "minus"; net: string; side: Side; x: number; y: number }[] {
  const s = BRIDGE_SIZE_PX;
  return [
    { key: "left", net: m.left, side: "WEST", x: 0, y: s / 2 },
    { key: "plus", net: m.plus, side: "EAST", x: s, y: LEAD_INSET_PX },
    { key: "minus", net: m.minus, side: "SOUTH", x: s / 2, y: s },
    { key: "right", net: m.right, side: "SOUTH", x: s - LEAD_INSET_PX, y: s },
  ];
}

/** The bridge opened up at its placed box: four diagonal diodes and the corner leads. */
export function expandBridge(
  m: BridgeMatch,
  box: Box,
): { parts: Omit<PlacedPart, "labels">[]; wires: { net: string; section: WireSection }[] } {
  const at = (x: number, y: number): Point => ({ x: box.x + x, y: box.y + y });
  const c = MARGIN_PX + HALF_PX;
  const corner = {
    left: at(MARGIN_PX, c),
    right: at(MARGIN_PX + 2 * HALF_PX, c),
    top: at(c, MARGIN_PX),
    bottom: at(c, MARGIN_PX + 2 * HALF_PX),
  };
  const pin = (role: string, net: string, p: Point, side: Side): PlacedPin => ({
    role,
    net,
    x: p.x,
    y: p.y,
    side,
  });
  // Each diode fills one quadrant; the rotation points it from anode to cathode.
  const diode = (
    part: Part,
    qx: number,
    qy: number,
    rotation: 225 | 315,
    anode: [Point, Side],
    cathode: [Point, Side],
  ): Omit<PlacedPart, "labels"> => ({
    ref: part.ref,
    kind: part.kind,
    symbol: "diode",
    rotation,
    ...at(qx, qy),
    width: HALF_PX,
    height: HALF_PX,
    pins: [
      pin("anode", part.pins.anode!, anode[0], anode[1]),
      pin("cathode", part.pins.cathode!, cathode[0], cathode[1]),
    ],
  });
  const q0 = MARGIN_PX;
  const q1 = MARGIN_PX + HALF_PX;
  const parts = [
    diode(m.topLeft, q0, q0, 315, [corner.left, "WEST"], [corner.top, "NORTH"]),
    diode(m.topRight, q1, q0, 225, [corner.right, "EAST"], [corner.top, "NORTH"]),
    diode(m.bottomLeft, q0, q1, 225, [corner.bottom, "SOUTH"], [corner.left, "WEST"]),
    diode(m.bottomRight, q1, q1, 315, [corner.bottom, "SOUTH"], [corner.right, "EAST"]),
  ];
  const s = BRIDGE_SIZE_PX;
  const i = LEAD_INSET_PX;
  const wires = [
    { net: m.left, section: { start: corner.left, end: at(0, c), bends: [] } },
    {
      net: m.plus,
      section: { start: corner.top, end: at(s, i), bends: [at(c, i)] },
    },
    { net: m.minus, section: { start: corner.bottom, end: at(c, s), bends: [] } },
    {
      net: m.right,
      section: { start: corner.right, end: at(s - i, s), bends: [at(s - i, c)] },
    },
  ];
  return { parts, wires };
}
