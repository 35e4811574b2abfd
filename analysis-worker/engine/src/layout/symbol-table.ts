/**
 * Box size and pin places of each symbol, and the rotation that brings a part's neutral pins
 * to the bottom. Sizes sit on a 10 px grid so leads line up when drawn; pins always lie on
 * the box border, on their side.
 */
import type { Part } from "../record/types.js";
import { kindInfo, pinRolesFor } from "../graph/kinds.js";
import type { Rotation, Side, SymbolName } from "./layout-types.js";
import { labelSize } from "./text-size.js";

/** Grid every box size and pin position is a multiple of. */
export const GRID_PX = 10;
/** Vertical distance between pins stacked on one side of a connector or plain box. */
const PIN_PITCH_PX = 20;
/** Narrowest plain box (unknown kinds); it widens to fit the kind word. */
const GENERIC_MIN_WIDTH_PX = 60;

/** A pin of a symbol: role, side and place on the box. */
export interface SymbolPin {
  role: string;
  side: Side;
  /** Relative to the box's top-left corner. */
  x: number;
  y: number;
}

/** A symbol's box and pins in one orientation. */
export interface SymbolGeometry {
  symbol: SymbolName;
  width: number;
  height: number;
  pins: SymbolPin[];
}

type FixedSymbol = Exclude<SymbolName, "connector" | "testpoint" | "generic">;

/** Two pins level with the middle of the box: the first on the left, the second on the right. */
function inline(
  symbol: FixedSymbol,
  width: number,
  height: number,
  roles: [string, string],
): SymbolGeometry {
  const y = height / 2;
  return {
    symbol,
    width,
    height,
    pins: [
      { role: roles[0], side: "WEST", x: 0, y },
      { role: roles[1], side: "EAST", x: width, y },
    ],
  };
}

/** Drawn orientation (rotation 0) of every symbol with a fixed pin set. */
const FIXED_SYMBOLS: Record<FixedSymbol, SymbolGeometry> = {
  resistor: inline("resistor", 60, 20, ["a", "b"]),
  capacitor: inline("capacitor", 40, 30, ["a", "b"]),
  "polarised-capacitor": inline("polarised-capacitor", 40, 30, ["plus", "minus"]),
  inductor: inline("inductor", 60, 20, ["a", "b"]),
  diode: inline("diode", 50, 30, ["anode", "cathode"]),
  zener: inline("zener", 50, 30, ["anode", "cathode"]),
  led: inline("led", 50, 30, ["anode", "cathode"]),
  // The gate leaves the cathode end of the triangle, downward.
  thyristor: {
    symbol: "thyristor",
    width: 50,
    height: 40,
    pins: [
      { role: "anode", side: "WEST", x: 0, y: 20 },
      { role: "cathode", side: "EAST", x: 50, y: 20 },
      { role: "gate", side: "SOUTH", x: 40, y: 40 },
    ],
  },
  triac: {
    symbol: "triac",
    width: 50,
    height: 40,
    pins: [
      { role: "mt2", side: "WEST", x: 0, y: 20 },
      { role: "mt1", side: "EAST", x: 50, y: 20 },
      { role: "gate", side: "SOUTH", x: 40, y: 40 },
    ],
  },
  // Dotted ends (p1, s1) on top, as docs/teardown-record.md defines them.
  transformer: {
    symbol: "transformer",
    width: 60,
    height: 60,
    pins: [
      { role: "p1", side: "WEST", x: 0, y: 10 },
      { role: "p2", side: "WEST", x: 0, y: 50 },
      { role: "s1", side: "EAST", x: 60, y: 10 },
      { role: "s2", side: "EAST", x: 60, y: 50 },
    ],
  },
  fuse: inline("fuse", 60, 20, ["a", "b"]),
  varistor: inline("varistor", 60, 30, ["a", "b"]),
  load: inline("load", 70, 40, ["a", "b"]),
  switch: inline("switch", 60, 20, ["a", "b"]),
};

function roundUpToGrid(px: number): number {
  return Math.ceil(px / GRID_PX) * GRID_PX;
}

/** A column of pins on the right: a connector's contacts. */
function connector(roles: readonly string[]): SymbolGeometry {
  const height = Math.max(1, roles.length) * PIN_PITCH_PX;
  const pins = roles.map((role, i): SymbolPin => ({
    role,
    side: "EAST",
    x: 30,
    y: PIN_PITCH_PX / 2 + i * PIN_PITCH_PX,
  }));
  return { symbol: "connector", width: 30, height, pins };
}

/** A test point: a ring with its pins entering from the left. */
function testpoint(roles: readonly string[]): SymbolGeometry {
  const height = Math.max(1, roles.length) * PIN_PITCH_PX;
  const pins = roles.map((role, i): SymbolPin => ({
    role,
    side: "WEST",
    x: 0,
    y: PIN_PITCH_PX / 2 + i * PIN_PITCH_PX,
  }));
  return { symbol: "testpoint", width: 20, height, pins };
}

/** A plain box wide enough for the kind word: the first half of the pins left, the rest right. */
function generic(kind: string, roles: readonly string[]): SymbolGeometry {
  const leftCount = Math.ceil(roles.length / 2);
  const rows = Math.max(1, leftCount, roles.length - leftCount);
  const height = rows * PIN_PITCH_PX;
  const width = Math.max(GENERIC_MIN_WIDTH_PX, roundUpToGrid(labelSize(kind).width + GRID_PX));
  const pins = roles.map((role, i): SymbolPin => {
    const left = i < leftCount;
    const row = left ? i : i - leftCount;
    return {
      role,
      side: left ? "WEST" : "EAST",
      x: left ? 0 : width,
      y: PIN_PITCH_PX / 2 + row * PIN_PITCH_PX,
    };
  });
  return { symbol: "generic", width, height, pins };
}

/** The symbol a kind is drawn with (rotation 0); a part whose pins do not fit it gets a plain box. */
export function symbolFor(part: Part): SymbolGeometry {
  const roles = Object.keys(part.pins);
  const info = kindInfo(part.kind);
  if (info?.variadic) return part.kind === "connector" ? connector(roles) : testpoint(roles);
  const expected = pinRolesFor(part.kind, part.polarised);
  const fits =
    expected !== null &&
    roles.length === expected.length &&
    roles.every((r) => expected.includes(r));
  if (!fits || info === null) return generic(part.kind, roles);
  const name: FixedSymbol =
    part.kind === "capacitor" && part.polarised
      ? "polarised-capacitor"
      : (part.kind as FixedSymbol);
  return FIXED_SYMBOLS[name];
}

/** The right-angle turns a fixed symbol takes on its own (diagonals are for bridge diodes). */
export type QuarterRotation = Extract<Rotation, 0 | 90 | 180 | 270>;

const CLOCKWISE: readonly Side[] = ["NORTH", "EAST", "SOUTH", "WEST"];

/** The side a pin on `side` faces after turning the symbol clockwise by `rotation`. */
export function rotateSide(side: Side, rotation: QuarterRotation): Side {
  return CLOCKWISE[(CLOCKWISE.indexOf(side) + rotation / 90) % 4]!;
}

/** The symbol turned clockwise by `rotation` about its box; width and height swap at 90/270. */
export function rotateSymbol(geometry: SymbolGeometry, rotation: QuarterRotation): SymbolGeometry {
  const { width: w, height: h } = geometry;
  const turn = (x: number, y: number): [number, number] => {
    switch (rotation) {
      case 0:
        return [x, y];
      case 90:
        return [h - y, x];
      case 180:
        return [w - x, h - y];
      case 270:
        return [y, w - x];
    }
  };
  const quarter = rotation === 90 || rotation === 270;
  return {
    symbol: geometry.symbol,
    width: quarter ? h : w,
    height: quarter ? w : h,
    pins: geometry.pins.map((p) => {
      const [x, y] = turn(p.x, p.y);
      return { role: p.role, side: rotateSide(p.side, rotation), x, y };
    }),
  };
}

/** Rotations tried in order; the first that fits wins. */
const ROTATION_PREFERENCE: readonly QuarterRotation[] = [0, 90, 270, 180];

/**
 * The rotation that puts all of a part's pins on `downNets` (the neutral and the negative
 * rails) on the SOUTH side and all its pins on `upNets` (the positive rails) on the NORTH
 * side, so the part hangs between its rails; failing both, the one that brings the down pins
 * down, then the one that brings the up pins up; 0 when none does. Only fixed symbols turn:
 * connectors and plain boxes keep their text upright.
 */
export function rotationFor(
  part: Part,
  geometry: SymbolGeometry,
  downNets: ReadonlySet<string>,
  upNets: ReadonlySet<string> = new Set(),
): QuarterRotation {
  if (
    geometry.symbol === "connector" ||
    geometry.symbol === "testpoint" ||
    geometry.symbol === "generic" ||
    // A transformer keeps its primary on the left and its secondary on the right.
    geometry.symbol === "transformer"
  )
    return 0;
  const rolesOn = (nets: ReadonlySet<string>): string[] =>
    geometry.pins.filter((p) => nets.has(part.pins[p.role]!)).map((p) => p.role);
  const down = rolesOn(downNets);
  const up = rolesOn(upNets).filter((r) => !down.includes(r));
  if (down.length === 0 && up.length === 0) return 0;
  const fits = (rotation: QuarterRotation, roles: string[], side: Side): boolean =>
    rotateSymbol(geometry, rotation).pins.every((p) => !roles.includes(p.role) || p.side === side);
  for (const test of [
    (r: QuarterRotation) => fits(r, down, "SOUTH") && fits(r, up, "NORTH"),
    (r: QuarterRotation) => down.length > 0 && fits(r, down, "SOUTH"),
    (r: QuarterRotation) => up.length > 0 && fits(r, up, "NORTH"),
  ])
    for (const rotation of ROTATION_PREFERENCE) if (test(rotation)) return rotation;
  return 0;
}
