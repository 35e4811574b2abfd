/**
 * The laid-out schematic as a standalone SVG document: wires, junction dots, symbols, labels
 * and terminals, in a plain scheme of our own (dark grey on white, the line conductor dark
 * red, the neutral dark blue). Pure: geometry in, text out; the web app serves it as the
 * schematic export.
 */
import type { NetRole } from "../record/types.js";
import type { PlacedTerminal, PlacedWire, SchematicLayout } from "./layout-types.js";
import { escapeXml, fmt, partSymbolSvg, SYMBOL_STROKE } from "./svg-symbols.js";
import { LABEL_FONT_SIZE_PX, LABEL_PADDING_PX } from "./text-size.js";

const BACKGROUND = "#ffffff";
const WIRE_COLOUR = "#3c3c3c";
const LINE_COLOUR = "#8b1a1a";
const NEUTRAL_COLOUR = "#1f3a8a";
const TERMINAL_FILL = "#f2f2f2";
const TOUCHABLE_FILL = "#c07a00";
const BARRIER_COLOUR = "#5a5a5a";
const WIRE_WIDTH_PX = 1.5;
const JUNCTION_RADIUS_PX = 3.5;
/** Distance from a label box's bottom edge to the text baseline. */
const BASELINE_LIFT_PX = 3.5;

/** The colour a net is drawn in: mains line and neutral stand out, everything else is grey. */
export function netColour(role: NetRole | null): string {
  if (role === "line") return LINE_COLOUR;
  if (role === "neutral") return NEUTRAL_COLOUR;
  return WIRE_COLOUR;
}

function text(
  x: number,
  y: number,
  height: number,
  content: string,
  fill: string,
  extra = "",
): string {
  const baseline = y + height - BASELINE_LIFT_PX;
  return `<text x="${fmt(x + LABEL_PADDING_PX)}" y="${fmt(baseline)}" fill="${fill}"${extra}>${escapeXml(content)}</text>`;
}

function wireSvg(w: PlacedWire): string {
  const lines = w.sections.map((s) => {
    const pts = [s.start, ...s.bends, s.end].map((p) => `${fmt(p.x)},${fmt(p.y)}`).join(" ");
    return `<polyline points="${pts}"/>`;
  });
  return `<g data-net="${escapeXml(w.net)}" stroke="${netColour(w.role)}" stroke-width="${WIRE_WIDTH_PX}" fill="none">${lines.join("")}</g>`;
}

function terminalSvg(t: PlacedTerminal): string {
  const box = `<rect x="${fmt(t.x)}" y="${fmt(t.y)}" width="${fmt(t.width)}" height="${fmt(t.height)}" fill="${TERMINAL_FILL}" stroke="${SYMBOL_STROKE}" stroke-width="1.4"/>`;
  // Each port's net name is written inside the box, next to where its wire leaves.
  const names = t.pins.map((pin) => {
    const colour = netColour(pin.role === "line" || pin.role === "neutral" ? pin.role : null);
    const content = escapeXml(pin.net);
    switch (pin.side) {
      case "EAST":
        return `<text x="${fmt(pin.x - 4)}" y="${fmt(pin.y + 4)}" text-anchor="end" fill="${colour}">${content}</text>`;
      case "WEST":
        return `<text x="${fmt(pin.x + 4)}" y="${fmt(pin.y + 4)}" fill="${colour}">${content}</text>`;
      default:
        return `<text x="${fmt(pin.x)}" y="${fmt(pin.y - 5)}" text-anchor="middle" fill="${colour}">${content}</text>`;
    }
  });
  // A net a person can touch gets a filled square terminal instead of the open ring.
  const pins = t.pins.map((pin) =>
    pin.accessible
      ? `<rect data-touchable="${escapeXml(pin.net)}" x="${fmt(pin.x - 3)}" y="${fmt(pin.y - 3)}" width="6" height="6" fill="${TOUCHABLE_FILL}" stroke="${SYMBOL_STROKE}"/>`
      : `<circle cx="${fmt(pin.x)}" cy="${fmt(pin.y)}" r="2.5" fill="${BACKGROUND}" stroke="${SYMBOL_STROKE}"/>`,
  );
  const caption = text(t.caption.x, t.caption.y, t.caption.height, t.caption.text, SYMBOL_STROKE);
  return `<g data-terminal="${t.kind}">${box}${names.join("")}${pins.join("")}${caption}</g>`;
}

/** Draws a laid-out schematic as a standalone SVG document (a string, UTF-8 text). */
export function renderSchematicSvg(layout: SchematicLayout): string {
  const w = fmt(layout.width);
  const h = fmt(layout.height);
  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}" viewBox="0 0 ${w} ${h}" font-family="sans-serif" font-size="${LABEL_FONT_SIZE_PX}">`,
    `<rect x="0" y="0" width="${w}" height="${h}" fill="${BACKGROUND}"/>`,
  ];
  const roles = new Map(layout.wires.map((wire) => [wire.net, wire.role]));
  // Isolation boundaries first, under everything: a long-dashed line through the transformer.
  for (const b of layout.barriers ?? [])
    out.push(
      `<line data-isolation="${escapeXml(b.ref)}" x1="${fmt(b.x)}" y1="${fmt(b.y1)}" x2="${fmt(b.x)}" y2="${fmt(b.y2)}" stroke="${BARRIER_COLOUR}" stroke-width="1" stroke-dasharray="8 4"/>`,
    );
  out.push(...layout.wires.map(wireSvg));
  out.push(
    ...layout.junctions.map(
      (j) =>
        `<circle data-net="${escapeXml(j.net)}" cx="${fmt(j.x)}" cy="${fmt(j.y)}" r="${JUNCTION_RADIUS_PX}" fill="${netColour(roles.get(j.net) ?? null)}"/>`,
    ),
  );
  out.push(...layout.terminals.map(terminalSvg));
  for (const p of layout.parts) {
    out.push(partSymbolSvg(p));
    for (const l of p.labels) out.push(text(l.x, l.y, l.height, l.text, SYMBOL_STROKE));
  }
  for (const l of layout.netLabels)
    out.push(
      text(l.x, l.y, l.height, l.text, netColour(roles.get(l.net) ?? null), ` font-style="italic"`),
    );
  out.push("</svg>");
  return out.join("\n");
}
