/**
 * Line-art symbols after IEC 60617, drawn as SVG fragments. Each fixed symbol is drawn
 * horizontally about its box centre, in the box's unrotated size, so its leads end exactly
 * on the pins that symbol-table.ts declares; the caller wraps it in the part's rotation.
 */
import type { PlacedPart, SymbolName } from "./layout-types.js";

/** Stroke colour of symbol line work. */
export const SYMBOL_STROKE = "#222222";

/** Numbers written short and stable: at most two decimals, never "-0". */
export function fmt(n: number): string {
  const r = Math.round(n * 100) / 100;
  return String(r === 0 ? 0 : r);
}

/** Text made safe for SVG content and attribute values. */
export function escapeXml(text: string): string {
  return text
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;")
    .replace(/'/g, "&apos;");
}

const line = (x1: number, y1: number, x2: number, y2: number): string =>
  `<line x1="${fmt(x1)}" y1="${fmt(y1)}" x2="${fmt(x2)}" y2="${fmt(y2)}"/>`;
const rect = (x: number, y: number, w: number, h: number, fill = "none"): string =>
  `<rect x="${fmt(x)}" y="${fmt(y)}" width="${fmt(w)}" height="${fmt(h)}" fill="${fill}"/>`;
const poly = (points: [number, number][], fill = "none"): string =>
  `<polygon points="${points.map(([x, y]) => `${fmt(x)},${fmt(y)}`).join(" ")}" fill="${fill}"/>`;
const path = (d: string, fill = "none"): string => `<path d="${d}" fill="${fill}"/>`;

/** Straight leads from both box ends (±half) to the body edges (±inner), on the centre line. */
function leads(half: number, inner: number): string {
  return line(-half, 0, -inner, 0) + line(inner, 0, half, 0);
}

/** A right-pointing diode body between x = -8 and x = 8 (triangle and cathode bar). */
function diodeBody(bar: string): string {
  return (
    poly([
      [-8, -8],
      [-8, 8],
      [8, 0],
    ]) + bar
  );
}

/** A small arrow from (x, y) by (dx, dy), the way light leaves an LED. */
function arrow(x: number, y: number, dx: number, dy: number): string {
  const ex = x + dx;
  const ey = y + dy;
  return (
    line(x, y, ex, ey) +
    poly(
      [
        [ex, ey],
        [ex - 4, ey + 1],
        [ex - 1, ey + 4],
      ],
      SYMBOL_STROKE,
    )
  );
}

/** A row of four half-turns from (x, -20) to (x, 20), bulging to the side `bulge` (±1). */
function coil(x: number, bulge: 1 | -1): string {
  const sweep = bulge === 1 ? 1 : 0;
  let d = `M ${fmt(x)} -20`;
  for (let i = 0; i < 4; i++) d += ` a 5 5 0 0 ${sweep} 0 10`;
  return path(d);
}

/** The body of a fixed symbol, centred at the origin, horizontal, in a box `width` wide. */
function fixedSymbol(
  symbol: Exclude<SymbolName, "connector" | "testpoint" | "generic">,
  width: number,
  rotation: number,
): string {
  const half = width / 2;
  switch (symbol) {
    case "resistor":
      return leads(half, 15) + rect(-15, -6, 30, 12);
    case "fuse":
      return leads(half, 15) + rect(-15, -5, 30, 10) + line(-15, 0, 15, 0);
    case "varistor":
      return leads(half, 15) + rect(-15, -7, 30, 14) + path("M -24 11 L -18 11 L 18 -11");
    case "capacitor":
      return leads(half, 4) + line(-4, -11, -4, 11) + line(4, -11, 4, 11);
    case "polarised-capacitor":
      return (
        leads(half, 4) +
        rect(-6, -11, 3, 22) +
        line(4, -11, 4, 11) +
        path("M -13 -12 L -9 -12 M -11 -14 L -11 -10")
      );
    case "inductor":
      return (
        leads(half, 16) +
        path("M -16 0 a 4 4 0 0 1 8 0 a 4 4 0 0 1 8 0 a 4 4 0 0 1 8 0 a 4 4 0 0 1 8 0")
      );
    case "diode":
      return leads(half, 8) + diodeBody(line(8, -8, 8, 8));
    case "zener":
      return leads(half, 8) + diodeBody(path("M 4 -10 L 8 -8 L 8 8 L 12 10"));
    case "led":
      return (
        leads(half, 8) + diodeBody(line(8, -8, 8, 8)) + arrow(1, -9, 6, -6) + arrow(6, -7, 6, -6)
      );
    case "thyristor":
      // Gate pin at (15, 20) in the centred frame: the box is 50 x 40 with the gate at (40, 40).
      return leads(half, 8) + diodeBody(line(8, -8, 8, 8)) + path("M 8 6 L 15 12 L 15 20");
    case "triac":
      return (
        leads(half, 8) +
        line(-8, -12, -8, 12) +
        line(8, -12, 8, 12) +
        poly([
          [-8, -12],
          [-8, 0],
          [8, -6],
        ]) +
        poly([
          [8, 0],
          [8, 12],
          [-8, 6],
        ]) +
        path("M 8 10 L 15 14 L 15 20")
      );
    case "transformer":
      return (
        path("M -30 -20 L -8 -20 M -30 20 L -8 20 M 8 -20 L 30 -20 M 8 20 L 30 20") +
        coil(-8, -1) +
        coil(8, 1) +
        line(-1, -20, -1, 20) +
        line(1, -20, 1, 20) +
        `<circle cx="-15" cy="-25" r="1.8" fill="${SYMBOL_STROKE}"/><circle cx="15" cy="-25" r="1.8" fill="${SYMBOL_STROKE}"/>`
      );
    case "load":
      return (
        leads(half, 22) +
        rect(-22, -12, 44, 24) +
        `<text x="0" y="3.5" font-size="9" text-anchor="middle" stroke="none" fill="${SYMBOL_STROKE}" transform="rotate(${-rotation})">load</text>`
      );
    case "switch":
      return (
        leads(half, 12) +
        line(-12, 0, 10, -9) +
        `<circle cx="-12" cy="0" r="1.8"/><circle cx="12" cy="0" r="1.8"/>`
      );
  }
}

/** Pins drawn in absolute place for the symbols that never turn (connector, test point, plain box). */
function uprightSymbol(p: PlacedPart): string {
  const cx = p.x + p.width / 2;
  const cy = p.y + p.height / 2;
  switch (p.symbol) {
    case "connector":
      return (
        rect(p.x + 2, p.y, p.width - 14, p.height) +
        p.pins
          .map(
            (pin) =>
              `<circle cx="${fmt(pin.x - 9)}" cy="${fmt(pin.y)}" r="3"/>` +
              line(pin.x - 6, pin.y, pin.x, pin.y),
          )
          .join("")
      );
    case "testpoint":
      return (
        `<circle cx="${fmt(cx)}" cy="${fmt(cy)}" r="5"/>` +
        p.pins.map((pin) => line(pin.x, pin.y, cx - 5, cy)).join("")
      );
    default:
      return (
        rect(p.x, p.y, p.width, p.height) +
        `<text x="${fmt(cx)}" y="${fmt(cy + 3.5)}" font-size="9" text-anchor="middle" stroke="none" fill="${SYMBOL_STROKE}">${escapeXml(p.kind)}</text>`
      );
  }
}

/** One part's symbol as an SVG group, turned by the part's rotation about its box centre. */
export function partSymbolSvg(p: PlacedPart): string {
  const attrs = `data-ref="${escapeXml(p.ref)}" stroke="${SYMBOL_STROKE}" stroke-width="1.4" fill="none"`;
  if (p.symbol === "connector" || p.symbol === "testpoint" || p.symbol === "generic")
    return `<g ${attrs}>${uprightSymbol(p)}</g>`;
  const quarter = p.rotation === 90 || p.rotation === 270;
  // A diagonal part (a bridge diode) spans its square box corner to corner.
  const diagonal = p.rotation % 90 !== 0;
  const drawnWidth = diagonal ? p.width * Math.SQRT2 : quarter ? p.height : p.width;
  const cx = fmt(p.x + p.width / 2);
  const cy = fmt(p.y + p.height / 2);
  return `<g ${attrs} transform="translate(${cx} ${cy}) rotate(${p.rotation})">${fixedSymbol(p.symbol, drawnWidth, p.rotation)}</g>`;
}
