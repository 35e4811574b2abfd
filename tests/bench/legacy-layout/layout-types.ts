/**
 * The schematic geometry that `layoutSchematic` returns: plain JSON, every coordinate absolute
 * (pixels, origin top left, y grows downward), so the web app and `renderSchematicSvg` draw it
 * without knowing anything about ELK.
 */
import type { NetRole } from "@teardown/engine";

/** A side of a box; pins sit on one. */
export type Side = "NORTH" | "EAST" | "SOUTH" | "WEST";

/** Clockwise rotation of a symbol from its drawn orientation, in degrees. */
export type Rotation = 0 | 90 | 180 | 270;

/** A point in drawing pixels. */
export interface Point {
  x: number;
  y: number;
}

/** An axis-aligned box; (x, y) is its top-left corner. */
export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/**
 * Symbol names after IEC 60617; the drawing belongs to the web app and `render-svg.ts`.
 * `generic` is the plain box used for kinds the engine does not know.
 */
export const SYMBOL_NAMES = [
  "resistor",
  "capacitor",
  "polarised-capacitor",
  "inductor",
  "diode",
  "zener",
  "led",
  "thyristor",
  "triac",
  "transformer",
  "fuse",
  "varistor",
  "load",
  "switch",
  "connector",
  "testpoint",
  "generic",
] as const;
/** One of `SYMBOL_NAMES`. */
export type SymbolName = (typeof SYMBOL_NAMES)[number];

/** A pin of a placed part or terminal: where its wire ends. Always on its box's `side`. */
export interface PlacedPin {
  /** The pin role (`a`, `anode`, `gate`, ...); for terminals, the net's role. */
  role: string;
  net: string;
  x: number;
  y: number;
  side: Side;
}

/** A ref or value text beside a part; its box never covers a part, terminal or other label. */
export interface PlacedLabel extends Box {
  text: string;
  of: "ref" | "value";
}

/** A part's box, symbol, rotation, pins and labels. */
export interface PlacedPart extends Box {
  ref: string;
  kind: string;
  symbol: SymbolName;
  rotation: Rotation;
  pins: PlacedPin[];
  labels: PlacedLabel[];
}

/** The dot where three or more wires of one net meet (its centre). */
export interface PlacedJunction extends Point {
  net: string;
}

/** One routed run of a wire: start, orthogonal bends, end. */
export interface WireSection {
  start: Point;
  end: Point;
  bends: Point[];
}

/** All routed sections of one net, junction stubs included. */
export interface PlacedWire {
  net: string;
  /** The net's declared role, so a drawing can colour the mains conductors. */
  role: NetRole | null;
  sections: WireSection[];
}

/** A net's name written next to its wire (nets that end at a terminal are named there). */
export interface PlacedNetLabel extends Box {
  net: string;
  text: string;
}

/**
 * A supply entry (left, first layer: the line and neutral nets) or an output (right, last
 * layer: nets with role output). `caption` describes it ("230 V 50 Hz", "output").
 */
export interface PlacedTerminal extends Box {
  kind: "supply" | "output";
  pins: PlacedPin[];
  caption: Box & { text: string };
}

/** The whole drawing: its size and everything on it, in absolute coordinates. */
export interface SchematicLayout {
  width: number;
  height: number;
  parts: PlacedPart[];
  junctions: PlacedJunction[];
  wires: PlacedWire[];
  netLabels: PlacedNetLabel[];
  terminals: PlacedTerminal[];
}

/** Caller's spacing choices; every field optional, pixels. */
export interface SchematicLayoutOptions {
  /** Gap between parts in one column. */
  nodeSpacingPx?: number;
  /** Gap between columns (layers). */
  layerSpacingPx?: number;
  /** Margin around the whole drawing. */
  paddingPx?: number;
  /** Write each net's name beside its wire (default true). */
  labelNets?: boolean;
}

/** What can go wrong while laying out: bad options, or ELK refusing the graph. */
export type LayoutErrorCode = "invalid-layout-option" | "layout-engine-failed";

/** The geometry, or an expected failure as a value. */
export type LayoutResult =
  | { ok: true; layout: SchematicLayout }
  | { ok: false; code: LayoutErrorCode; message: string; where: string | null };
