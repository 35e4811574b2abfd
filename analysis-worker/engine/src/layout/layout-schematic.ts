/**
 * The front door of the layout stage: a record in, schematic geometry out. The record becomes
 * a layout graph (layout-graph.ts), ELK places and routes it (elk-adapter.ts), and the result
 * is rebuilt as plain JSON with labels moved wherever ELK left them on top of something.
 */
import type { TeardownRecord } from "../record/types.js";
import { runElkLayered, type PlacedGraph, type PlacedNode } from "./elk-adapter.js";
import { boxOf, FreeSpace } from "./free-space.js";
import { buildLayoutGraph, drawnNodes, type GraphNode, type LayoutGraph } from "./layout-graph.js";
import type {
  LayoutResult,
  PlacedLabel,
  PlacedNetLabel,
  PlacedPart,
  PlacedPin,
  PlacedTerminal,
  PlacedWire,
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
import { candidatesAround, dotBox, netLabelCandidates } from "./label-candidates.js";
import { barriersFor } from "./isolation-barriers.js";
import { normalise } from "./normalise-layout.js";
import { settingsFrom } from "./layout-settings.js";

function pinsOf(node: GraphNode, placed: PlacedNode): PlacedPin[] {
  return node.ports.map((p) => {
    const at = placed.ports.get(p.id)!;
    const pin: PlacedPin = { role: p.role, net: p.net, x: at.x, y: at.y, side: p.side };
    if (p.accessible) pin.accessible = true;
    return pin;
  });
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
