/**
 * A diode-capacitor voltage multiplier (the Cockcroft-Walton ladder) as the trade draws it: a
 * regular ladder of two rows of capacitors in series, the input's coupling row on top and the
 * DC stack along the bottom, with the diodes standing between the rows in a zigzag, one pair
 * per stage. Found by wiring alone, laid out by ELK as one box like a bridge, opened up after.
 *
 * Wiring of stage i (i = 1..k), with top nodes t0..tk and bottom nodes b0..bk:
 *   capacitor t(i-1)-t(i) on top, diode b(i-1)->t(i) up, diode t(i)->b(i) down,
 *   capacitor b(i-1)-b(i) along the bottom.
 * t0 is the input, b0 the reference, bk the output; the nodes between are the ladder's own (no
 * other part touches them). The diodes may all point the other way (a negative multiplier).
 *
 * The box: stage i's up diode stands at x = (2i-1)·PITCH, its down diode PITCH to the right;
 * t(i) runs along the top row between them, b(i) along the bottom from one stage's down diode
 * to the next one's up diode; each row's capacitors sit in the gaps. The input enters on the
 * left of the top row, the output leaves on the right of the bottom row, the reference leaves
 * downward (onto the bottom rail) or to the left along the bottom row.
 */
import type { Part } from "../record/types.js";
import type { Box, PlacedPart, PlacedPin, Point, Side, WireSection } from "./layout-types.js";
import { rotateSymbol, symbolFor, type QuarterRotation } from "./symbol-table.js";

/** Horizontal distance between a stage's two diodes, and from a down diode to the next up one. */
const PITCH_PX = 70;
/** y of the top row; room above it for the top capacitors' upper half. */
const TOP_ROW_PX = 20;
/** Distance between the rows: a diode's length plus a lead at each end. */
const ROW_GAP_PX = 90;
/** Room right of the last down diode before the output port. */
const RIGHT_MARGIN_PX = 20;
/** Room below the bottom row. */
const BOTTOM_MARGIN_PX = 20;
/** Fewest stages drawn as a ladder: one stage is a doubler, often drawn other ways. */
const MIN_STAGES = 2;

/** One stage's four parts. */
interface Stage {
  top: Part;
  up: Part;
  down: Part;
  bottom: Part;
}

/** A multiplier found in the record: its stages in order and its node nets. */
export interface MultiplierMatch {
  stages: Stage[];
  /** Top nodes t0..tk and bottom nodes b0..bk. */
  tops: string[];
  bottoms: string[];
  /** Anode of the up diodes at the bottom (a positive multiplier), else at the top. */
  positive: boolean;
  /** b0 is a bottom rail: its lead leaves downward. */
  referenceDown: boolean;
}

const isDiode = (p: Part): boolean =>
  (p.kind === "diode" || p.kind === "zener") &&
  p.pins.anode !== undefined &&
  p.pins.cathode !== undefined;
const twoPinCapacitor = (p: Part): boolean =>
  p.kind === "capacitor" && Object.keys(p.pins).length === 2;
const nets = (p: Part): string[] => Object.values(p.pins);
const joins = (p: Part, a: string, b: string): boolean => {
  const n = nets(p);
  return n.length === 2 && a !== b && n.includes(a) && n.includes(b);
};

/**
 * Every ladder of at least MIN_STAGES stages among the parts, each part in one ladder at most,
 * skipping parts in `taken`. `bottomRails` says which reference nets drop to a rail.
 */
export function findMultipliers(
  parts: readonly Part[],
  taken: ReadonlySet<string>,
  bottomRails: ReadonlySet<string>,
): MultiplierMatch[] {
  const used = new Set(taken);
  const free = (p: Part): boolean => !used.has(p.ref);
  const diodes = parts.filter((p) => isDiode(p) && free(p));
  const caps = parts.filter((p) => twoPinCapacitor(p) && free(p));
  const pinsOn = new Map<string, number>();
  for (const p of parts) for (const n of nets(p)) pinsOn.set(n, (pinsOn.get(n) ?? 0) + 1);
  const found: MultiplierMatch[] = [];
  for (const positive of [true, false]) {
    const from = positive ? "anode" : "cathode";
    const to = positive ? "cathode" : "anode";
    for (const first of diodes) {
      if (!free(first)) continue;
      const stages: Stage[] = [];
      const tops: string[] = [];
      const bottoms = [first.pins[from]!];
      const inStage = new Set<Part>();
      for (let up: Part | undefined = first; up !== undefined;) {
        const b0 = bottoms.at(-1)!;
        const t1 = up.pins[to]!;
        const pick = (list: readonly Part[], ok: (p: Part) => boolean): Part | undefined =>
          list.find((p) => free(p) && !inStage.has(p) && p !== up && ok(p));
        const down = pick(diodes, (d) => d.pins[from] === t1 && d.pins[to] !== b0);
        if (down === undefined) break;
        const b1 = down.pins[to]!;
        const t0 = tops.at(-1);
        const top = pick(caps, (c) =>
          t0 === undefined ? nets(c).includes(t1) && !nets(c).includes(b0) : joins(c, t0, t1),
        );
        const bottom = pick(caps, (c) => c !== top && joins(c, b0, b1));
        if (top === undefined || bottom === undefined) break;
        if (t0 === undefined) tops.push(nets(top).find((n) => n !== t1)!);
        const stage = { top, up, down, bottom };
        stages.push(stage);
        for (const p of Object.values(stage)) inStage.add(p);
        tops.push(t1);
        bottoms.push(b1);
        up = pick(diodes, (d) => d.pins[from] === b1);
      }
      // The nodes between input, reference and output are the ladder's own.
      while (stages.length >= MIN_STAGES) {
        const k = stages.length;
        const own = [...tops.slice(1), ...bottoms.slice(1, k)];
        const pinCount = (n: string): number =>
          stages.flatMap((s) => Object.values(s).flatMap(nets)).filter((x) => x === n).length;
        if (own.every((n) => pinsOn.get(n) === pinCount(n))) break;
        stages.pop();
        tops.pop();
        bottoms.pop();
      }
      const named = new Set([...tops, ...bottoms]);
      if (stages.length < MIN_STAGES || named.size !== tops.length + bottoms.length) continue;
      for (const s of stages) for (const p of Object.values(s)) used.add(p.ref);
      found.push({
        stages,
        tops,
        bottoms,
        positive,
        referenceDown: bottomRails.has(bottoms[0]!),
      });
    }
  }
  return found;
}

const upX = (i: number): number => (2 * i + 1) * PITCH_PX;
const bottomRowY = TOP_ROW_PX + ROW_GAP_PX;

/** The ladder's box size. */
export function multiplierSize(m: MultiplierMatch): { width: number; height: number } {
  return {
    width: 2 * m.stages.length * PITCH_PX + RIGHT_MARGIN_PX,
    height: bottomRowY + BOTTOM_MARGIN_PX,
  };
}

/** The box's three ports: input, reference, output. */
export function multiplierPorts(
  m: MultiplierMatch,
): { key: "input" | "reference" | "output"; net: string; side: Side; x: number; y: number }[] {
  const { width, height } = multiplierSize(m);
  return [
    { key: "input", net: m.tops[0]!, side: "WEST", x: 0, y: TOP_ROW_PX },
    m.referenceDown
      ? { key: "reference", net: m.bottoms[0]!, side: "SOUTH", x: upX(0), y: height }
      : { key: "reference", net: m.bottoms[0]!, side: "WEST", x: 0, y: bottomRowY },
    { key: "output", net: m.bottoms.at(-1)!, side: "EAST", x: width, y: bottomRowY },
  ];
}

/** The ladder opened up at its placed box: its parts (labels come later) and every lead. */
export function expandMultiplier(
  m: MultiplierMatch,
  box: Box,
): { parts: Omit<PlacedPart, "labels">[]; wires: { net: string; section: WireSection }[] } {
  const at = (x: number, y: number): Point => ({ x: box.x + x, y: box.y + y });
  const parts: Omit<PlacedPart, "labels">[] = [];
  const wires: { net: string; section: WireSection }[] = [];
  const line = (net: string, ...pts: Point[]): void => {
    wires.push({ net, section: { start: pts[0]!, end: pts.at(-1)!, bends: pts.slice(1, -1) } });
  };
  /** Places a part centred at (cx, cy) turned by `rotation`; returns its pins by net. */
  const place = (part: Part, cx: number, cy: number, rotation: QuarterRotation) => {
    const g = rotateSymbol(symbolFor(part), rotation);
    const origin = at(cx - g.width / 2, cy - g.height / 2);
    const pins: PlacedPin[] = g.pins.map((p) => ({
      role: p.role,
      net: part.pins[p.role]!,
      x: origin.x + p.x,
      y: origin.y + p.y,
      side: p.side,
    }));
    parts.push({
      ref: part.ref,
      kind: part.kind,
      symbol: g.symbol,
      rotation,
      ...origin,
      width: g.width,
      height: g.height,
      pins,
    });
    return (net: string): Point => pins.find((p) => p.net === net)!;
  };
  /** A row capacitor between two nets, the left net's pin on the left. */
  const rowCap = (part: Part, left: string, cx: number, y: number) => {
    const first = symbolFor(part).pins[0]!.role;
    return place(part, cx, y, part.pins[first] === left ? 0 : 180);
  };
  // Up diodes point from the bottom row to the top one: anode down when positive.
  const upTurn: QuarterRotation = m.positive ? 270 : 90;
  const downTurn: QuarterRotation = m.positive ? 90 : 270;
  const diodeY = TOP_ROW_PX + ROW_GAP_PX / 2;
  const top = TOP_ROW_PX;
  const bot = bottomRowY;
  let topFrom = at(0, top);
  m.stages.forEach((s, i) => {
    const [t0, t1, b0, b1] = [m.tops[i]!, m.tops[i + 1]!, m.bottoms[i]!, m.bottoms[i + 1]!];
    const u = upX(i);
    const d = u + PITCH_PX;
    const topCap = rowCap(s.top, t0, u - PITCH_PX / 2, top);
    const botCap = rowCap(s.bottom, b0, u + PITCH_PX / 2, bot);
    const up = place(s.up, u, diodeY, upTurn);
    const down = place(s.down, d, diodeY, downTurn);
    // The top row into this stage's capacitor, then t(i) along the top between the diodes.
    line(t0, topFrom, topCap(t0));
    line(t1, topCap(t1), at(u, top), up(t1));
    line(t1, at(u, top), at(d, top), down(t1));
    topFrom = at(d, top);
    // b(i-1) from the up diode's foot to the bottom capacitor; b(i) from it to the down diode.
    line(b0, up(b0), at(u, bot), botCap(b0));
    line(b1, botCap(b1), at(d, bot), down(b1));
    if (i > 0) line(b0, at(upX(i - 1) + PITCH_PX, bot), at(u, bot));
  });
  const { width, height } = multiplierSize(m);
  const last = upX(m.stages.length - 1) + PITCH_PX;
  line(m.bottoms.at(-1)!, at(last, bot), at(width, bot));
  const ref = m.bottoms[0]!;
  if (m.referenceDown) line(ref, at(upX(0), bot), at(upX(0), height));
  else line(ref, at(upX(0), bot), at(0, bot));
  return { parts, wires };
}
