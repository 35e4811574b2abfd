/**
 * The front door of the layout stage: a record in, schematic geometry out. The record becomes
 * a layout graph (layout-graph.ts), ELK places and routes it (elk-adapter.ts), and the result
 * is rebuilt as plain JSON with labels moved wherever ELK left them on top of something.
 */
import type { TeardownRecord } from "../record/types.js";
import {
  runElkLayered,
  type LayeredSettings,
  type PlacedGraph,
  type PlacedNode,
} from "./elk-adapter.js";
import { boundsOf, FreeSpace, sectionBoxes } from "./free-space.js";
import { buildLayoutGraph, drawnNodes, type GraphNode, type LayoutGraph } from "./layout-graph.js";
import type {
  Box,
  LayoutResult,
  PlacedBarrier,
  PlacedJunction,
  PlacedLabel,
  PlacedNetLabel,
  PlacedPart,
  PlacedPin,
  PlacedTerminal,
  PlacedWire,
  Point,
  SchematicLayout,
  SchematicLayoutOptions,
  WireSection,
} from "./layout-types.js";
import { BRIDGE_SIZE_PX, expandBridge } from "./bridge-block.js";
import { expandDivider } from "./divider-block.js";
import { expandMultiplier } from "./multiplier-block.js";
import { junctionDots } from "./junction-dots.js";
import { mergeNetSections } from "./merge-wires.js";
import { drawRails } from "./draw-rails.js";
import { labelSize } from "./text-size.js";

const DEFAULT_NODE_SPACING_PX = 30;
const DEFAULT_LAYER_SPACING_PX = 40;
const DEFAULT_PADDING_PX = 20;
const EDGE_SPACING_PX = 10;
const EDGE_NODE_SPACING_PX = 12;
/** Half the side of the square kept clear around a junction dot (the dot's radius is 3.5). */
const DOT_CLEAR_RADIUS_PX = 4;
/** Air between a part and its labels. */
const LABEL_GAP_PX = 3;
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

function settingsFrom(opts: SchematicLayoutOptions): LayeredSettings | Invalid {
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

function pinsOf(node: GraphNode, placed: PlacedNode): PlacedPin[] {
  return node.ports.map((p) => {
    const at = placed.ports.get(p.id)!;
    const pin: PlacedPin = { role: p.role, net: p.net, x: at.x, y: at.y, side: p.side };
    if (p.accessible) pin.accessible = true;
    return pin;
  });
}

/** The drawn dot's square, so no label covers it. */
function dotBox(p: Point): Box {
  const r = DOT_CLEAR_RADIUS_PX;
  return { x: p.x - r, y: p.y - r, width: 2 * r, height: 2 * r };
}

const boxOf = (b: Box): Box => ({ x: b.x, y: b.y, width: b.width, height: b.height });

/** Label positions to try around a box, nearest first, starting on the preferred side. */
function candidatesAround(
  box: Box,
  width: number,
  height: number,
  first: GraphNode["labelSide"],
): Point[] {
  const cx = box.x + box.width / 2;
  const cy = box.y + box.height / 2;
  const g = LABEL_GAP_PX;
  const bySide: Record<GraphNode["labelSide"], Point[]> = {
    NORTH: [],
    SOUTH: [],
    EAST: [],
    WEST: [],
  };
  for (let k = 0; k < 3; k++) {
    const dy = k * (height + 1);
    bySide.NORTH.push({ x: cx - width / 2, y: box.y - g - height - dy });
    bySide.SOUTH.push({ x: cx - width / 2, y: box.y + box.height + g + dy });
    bySide.EAST.push(
      { x: box.x + box.width + g, y: cy - height / 2 - dy },
      { x: box.x + box.width + g, y: cy - height / 2 + dy },
    );
    bySide.WEST.push(
      { x: box.x - g - width, y: cy - height / 2 - dy },
      { x: box.x - g - width, y: cy - height / 2 + dy },
    );
  }
  const order = [
    first,
    ...(["NORTH", "SOUTH", "EAST", "WEST"] as const).filter((s) => s !== first),
  ];
  return order.flatMap((s) => bySide[s]);
}

/** Where a net's name may go: beside its junction, then above or below its longest runs. */
function netLabelCandidates(
  sections: readonly WireSection[],
  junctions: readonly PlacedJunction[],
  width: number,
  height: number,
): Point[] {
  const out: Point[] = [];
  for (const j of junctions) {
    out.push(
      { x: j.x + 4, y: j.y - 4 - height },
      { x: j.x - 4 - width, y: j.y - 4 - height },
      { x: j.x + 4, y: j.y + 4 },
      { x: j.x - 4 - width, y: j.y + 4 },
    );
  }
  const runs: { x0: number; x1: number; y: number }[] = [];
  for (const s of sections) {
    const pts = [s.start, ...s.bends, s.end];
    for (let i = 1; i < pts.length; i++) {
      const a = pts[i - 1]!;
      const b = pts[i]!;
      if (a.y === b.y && a.x !== b.x)
        runs.push({ x0: Math.min(a.x, b.x), x1: Math.max(a.x, b.x), y: a.y });
    }
  }
  runs.sort((a, b) => b.x1 - b.x0 - (a.x1 - a.x0) || a.y - b.y || a.x0 - b.x0);
  for (const r of runs) {
    const mid = (r.x0 + r.x1) / 2 - width / 2;
    out.push(
      { x: mid, y: r.y - 2 - height },
      { x: mid, y: r.y + 2 },
      { x: r.x0 + 3, y: r.y - 2 - height },
      { x: r.x1 - 3 - width, y: r.y - 2 - height },
    );
  }
  return out;
}

function assemble(
  graph: LayoutGraph,
  placed: PlacedGraph,
  labelNets: boolean,
  isolated: boolean,
): Omit<SchematicLayout, "width" | "height"> {
  const space = new FreeSpace();
  const parts: PlacedPart[] = [];
  const terminals: PlacedTerminal[] = [];
  const sectionsByNet = new Map<string, WireSection[]>();
  const terminalNets = new Set<string>();

  // Bridges open up into four diagonal diodes, ladders into their rows and zigzag, each with
  // the leads from its parts to the box's ports.
  const shapeParts: { node: GraphNode; part: Omit<PlacedPart, "labels"> }[] = [];
  const blockParts: PlacedPart[] = [];
  for (const node of graph.nodes) {
    const at = placed.nodes.get(node.id)!;
    if (node.origin.type === "divider") {
      // A divider's resistors come with their labels already placed inside its box.
      const opened = expandDivider(node.origin.divider, at);
      for (const part of opened.parts) {
        space.addSolid(boxOf(part));
        for (const l of part.labels) space.addSolid(boxOf(l));
        blockParts.push(part);
      }
      for (const w of opened.wires)
        sectionsByNet.set(w.net, [...(sectionsByNet.get(w.net) ?? []), w.section]);
      continue;
    }
    // A gate group's box is never drawn: only its parts and wires are solid.
    if (node.origin.type === "gate-group") continue;
    if (node.origin.type !== "bridge" && node.origin.type !== "multiplier") {
      space.addSolid(boxOf(at));
      continue;
    }
    const opened =
      node.origin.type === "bridge"
        ? expandBridge(node.origin.bridge, at)
        : expandMultiplier(node.origin.multiplier, at);
    for (const part of opened.parts) {
      space.addSolid(boxOf(part));
      shapeParts.push({ node, part });
    }
    for (const w of opened.wires)
      sectionsByNet.set(w.net, [...(sectionsByNet.get(w.net) ?? []), w.section]);
  }
  // The bridge's own leads, kept apart so a rail that replaces ELK's route keeps them.
  const leadsByNet = new Map([...sectionsByNet].map(([net, list]) => [net, [...list]]));
  for (const edge of graph.edges) {
    const list = sectionsByNet.get(edge.net) ?? [];
    list.push(...placed.edges.get(edge.id)!);
    sectionsByNet.set(edge.net, list);
  }
  // The ports of blocks (bridges, dividers) and gate groups only join wires inside them to the
  // wires outside; the pins of the parts they hold are the pins.
  const allPins = [
    ...drawnNodes(graph)
      .filter((n) => !["bridge", "divider", "multiplier"].includes(n.origin.type))
      .flatMap((n) => pinsOf(n, placed.nodes.get(n.id)!)),
    ...shapeParts.flatMap((b) => b.part.pins),
    ...blockParts.flatMap((p) => p.pins),
  ];
  for (const [net, sections] of sectionsByNet)
    sectionsByNet.set(
      net,
      mergeNetSections(
        sections,
        allPins.filter((p) => p.net === net),
      ),
    );
  drawRails(graph, placed, sectionsByNet, leadsByNet, allPins);
  for (const sections of sectionsByNet.values()) for (const s of sections) space.addWire(s);
  const wires: PlacedWire[] = [...graph.netRoles.keys()]
    .filter((net) => sectionsByNet.has(net))
    .map((net) => ({
      net,
      role: graph.netRoles.get(net) ?? null,
      sections: sectionsByNet.get(net)!,
    }));
  const junctions = junctionDots(wires, allPins);
  for (const j of junctions) space.addSolid(dotBox(j));
  // Isolation boundaries go in before any label, so no label is placed across one.
  const barriers = isolated ? barriersFor(graph, placed) : [];
  for (const b of barriers)
    space.addWire({ start: { x: b.x, y: b.y1 }, end: { x: b.x, y: b.y2 }, bends: [] });

  for (const node of graph.nodes) {
    const at = placed.nodes.get(node.id)!;
    if (node.origin.type === "terminal") {
      node.ports.forEach((p) => terminalNets.add(p.net));
      const label = node.labels[0]!;
      const elkBox = at.labels[0]!;
      const caption = space.place(
        label.width,
        label.height,
        [elkBox, ...candidatesAround(at, label.width, label.height, "NORTH")],
        elkBox,
      );
      terminals.push({
        ...boxOf(at),
        kind: node.origin.kind,
        pins: pinsOf(node, at),
        caption: { ...caption, text: label.text },
      });
    }
  }
  for (const node of graph.nodes) {
    if (node.origin.type !== "part") continue;
    const at = placed.nodes.get(node.id)!;
    const labels: PlacedLabel[] = node.labels.map((l, i) => {
      const elkBox = at.labels[i]!;
      const box = space.place(
        l.width,
        l.height,
        [elkBox, ...candidatesAround(at, l.width, l.height, node.labelSide)],
        elkBox,
      );
      return { ...box, text: l.text, of: l.of === "value" ? "value" : "ref" };
    });
    const { part, symbol, rotation } = node.origin;
    parts.push({
      ref: part.ref,
      kind: part.kind,
      symbol,
      rotation,
      ...boxOf(at),
      pins: pinsOf(node, at),
      labels,
    });
  }
  for (const { node, part } of shapeParts) {
    const o = node.origin;
    if (o.type !== "bridge" && o.type !== "multiplier") continue;
    const source = (
      o.type === "bridge"
        ? [o.bridge.topLeft, o.bridge.topRight, o.bridge.bottomLeft, o.bridge.bottomRight]
        : o.multiplier.stages.flatMap((s) => [s.top, s.up, s.down, s.bottom])
    ).find((d) => d.ref === part.ref)!;
    const box = placed.nodes.get(node.id)!;
    // A bridge's labels go outside the diamond, beside each diode's outer side; a ladder's
    // beside its upright diodes, above its top row and below its bottom row.
    const side =
      o.type === "bridge"
        ? part.x < box.x + BRIDGE_SIZE_PX / 2
          ? "WEST"
          : "EAST"
        : part.height > part.width
          ? "EAST"
          : part.y + part.height / 2 < box.y + box.height / 2
            ? "NORTH"
            : "SOUTH";
    const texts: { text: string; of: "ref" | "value" }[] = [{ text: source.ref, of: "ref" }];
    if (source.value_text !== null && source.value_text !== "")
      texts.push({ text: source.value_text, of: "value" });
    // Above a part the value goes first, nearest the part, so the ref still reads above it.
    if (side === "NORTH") texts.reverse();
    const labels = texts.map(({ text, of }): PlacedLabel => {
      const { width, height } = labelSize(text);
      const box = space.place(width, height, candidatesAround(part, width, height, side), part);
      return { ...box, text, of };
    });
    parts.push({ ...part, labels });
  }
  parts.push(...blockParts);
  parts.sort((a, b) => (a.ref < b.ref ? -1 : a.ref > b.ref ? 1 : 0));

  const netLabels: PlacedNetLabel[] = [];
  if (labelNets) {
    const pinsByNet = new Map<string, PlacedPin[]>();
    for (const p of parts)
      for (const pin of p.pins) pinsByNet.set(pin.net, [...(pinsByNet.get(pin.net) ?? []), pin]);
    for (const net of [...graph.netRoles.keys()].sort()) {
      if (terminalNets.has(net)) continue;
      const { width, height } = labelSize(net);
      const sections = sectionsByNet.get(net) ?? [];
      const pin = pinsByNet.get(net)![0]!;
      const candidates = netLabelCandidates(
        sections,
        junctions.filter((j) => j.net === net),
        width,
        height,
      );
      // A net with one pin has no wire: its name goes just off the pin.
      candidates.push(
        { x: pin.x + 3, y: pin.y - 3 - height },
        { x: pin.x - 3 - width, y: pin.y - 3 - height },
        { x: pin.x + 3, y: pin.y + 3 },
      );
      const box = space.place(width, height, candidates, pin);
      netLabels.push({ ...box, net, text: net });
    }
  }
  const body: Omit<SchematicLayout, "width" | "height"> = {
    parts,
    terminals,
    junctions,
    wires,
    netLabels,
  };
  if (isolated) body.barriers = barriers;
  return body;
}

function shiftPoint(p: Point, dx: number, dy: number): Point {
  return { x: p.x + dx, y: p.y + dy };
}

/** Moves everything so the whole drawing, labels included, sits `padding` from the top-left. */
function normalise(
  body: Omit<SchematicLayout, "width" | "height">,
  padding: number,
): SchematicLayout {
  const boxes: Box[] = [
    ...body.parts.flatMap((p) => [p, ...p.labels]),
    ...body.terminals.flatMap((t) => [t, t.caption]),
    ...body.netLabels,
    ...body.wires.flatMap((w) => w.sections.flatMap(sectionBoxes)),
    ...body.junctions.map((j) => ({ x: j.x, y: j.y, width: 0, height: 0 })),
    ...(body.barriers ?? []).map((b) => ({ x: b.x, y: b.y1, width: 0, height: b.y2 - b.y1 })),
  ];
  const bounds = boundsOf(boxes) ?? { x: padding, y: padding, width: 0, height: 0 };
  const dx = padding - bounds.x;
  const dy = padding - bounds.y;
  const move = <T extends Point>(b: T): T => ({ ...b, x: b.x + dx, y: b.y + dy });
  return {
    width: bounds.width + 2 * padding,
    height: bounds.height + 2 * padding,
    parts: body.parts.map((p) => ({
      ...move(p),
      pins: p.pins.map(move),
      labels: p.labels.map(move),
    })),
    terminals: body.terminals.map((t) => ({
      ...move(t),
      pins: t.pins.map(move),
      caption: move(t.caption),
    })),
    junctions: body.junctions.map(move),
    netLabels: body.netLabels.map(move),
    ...(body.barriers
      ? {
          barriers: body.barriers.map((b) => ({ ...b, x: b.x + dx, y1: b.y1 + dy, y2: b.y2 + dy })),
        }
      : {}),
    wires: body.wires.map((w) => ({
      ...w,
      sections: w.sections.map((s) => ({
        start: shiftPoint(s.start, dx, dy),
        end: shiftPoint(s.end, dx, dy),
        bends: s.bends.map((b) => shiftPoint(b, dx, dy)),
      })),
    })),
  };
}

/** How far an isolation boundary reaches past the parts and wires above and below. */
const BARRIER_OVERHANG_PX = 10;

/**
 * A dashed boundary through each transformer, between its windings, from above the highest
 * part or wire to below the lowest one.
 */
function barriersFor(graph: LayoutGraph, placed: PlacedGraph): PlacedBarrier[] {
  const extent = boundsOf([
    ...[...placed.nodes.values()].map(boxOf),
    ...[...placed.edges.values()].flat().flatMap(sectionBoxes),
  ]);
  if (extent === null) return [];
  return graph.nodes.flatMap((n) => {
    if (n.origin.type !== "part" || n.partition !== 1) return [];
    const at = placed.nodes.get(n.id)!;
    const x = at.x + at.width / 2;
    // Should ELK ever put another box across the line, draw no boundary rather than a false one.
    const crossed = drawnNodes(graph).some((m) => {
      const b = placed.nodes.get(m.id)!;
      return m !== n && b.x < x && x < b.x + b.width;
    });
    if (crossed) return [];
    return [
      {
        ref: n.origin.part.ref,
        x,
        y1: extent.y - BARRIER_OVERHANG_PX,
        y2: extent.y + extent.height + BARRIER_OVERHANG_PX,
      },
    ];
  });
}

/**
 * Lays out a record as a schematic: supply entry on the left, outputs and loads on the right,
 * neutral pins at the bottom, orthogonal wires, junction dots, labels clear of everything.
 */
export async function layoutSchematic(
  record: TeardownRecord,
  opts: SchematicLayoutOptions = {},
): Promise<LayoutResult> {
  const settings = settingsFrom(opts);
  if ("ok" in settings) return settings;
  const graph = buildLayoutGraph(record);
  const run = await runElkLayered(graph, settings);
  if (!run.ok) return run;
  const isolated = graph.nodes.some((n) => n.partition === 1);
  const body = assemble(graph, run.placed, opts.labelNets ?? true, isolated);
  return { ok: true, layout: normalise(body, settings.paddingPx) };
}
