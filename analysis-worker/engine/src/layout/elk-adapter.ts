/**
 * The one place that talks to ELK (elkjs, run in-process from its bundled build, no web
 * worker). Typed settings and our layout graph go in; ELK's string option map and JSON graph
 * are built here; ELK's exceptions come back as a value; its output is turned back into
 * absolute boxes, port points and wire sections. Everything but the `layout` call is a pure
 * conversion.
 */
import ELK from "elkjs/lib/elk.bundled.js";
import type {
  ELK as ElkInstance,
  ElkExtendedEdge,
  ElkLabel,
  ElkNode,
  ElkPort,
  LayoutOptions,
} from "elkjs/lib/elk-api.js";
import type { Box, Point, Side, WireSection } from "./layout-types.js";
import type { GraphEdge, GraphNode, LayoutGraph } from "./layout-graph.js";

/** Spacing choices for the layered algorithm, in pixels. Direction and routing are fixed. */
export interface LayeredSettings {
  nodeSpacingPx: number;
  layerSpacingPx: number;
  edgeSpacingPx: number;
  edgeNodeSpacingPx: number;
  paddingPx: number;
  labelGapPx: number;
  randomSeed: number;
  /** How hard ELK's crossing minimisation tries (its default is 7). */
  thoroughness: number;
}

/** A node after layout: absolute box, absolute port points by port id, label boxes in order. */
export interface PlacedNode extends Box {
  ports: Map<string, Point>;
  labels: Box[];
}

/** The whole graph after layout: drawing size, nodes by id, wire sections by edge id. */
export interface PlacedGraph {
  width: number;
  height: number;
  nodes: Map<string, PlacedNode>;
  /** Edge id to its routed sections, absolute. */
  edges: Map<string, WireSection[]>;
}

/** ELK's placement, or its refusal as a value. */
export type ElkRunResult =
  | { ok: true; placed: PlacedGraph }
  | { ok: false; code: "layout-engine-failed"; message: string; where: string | null };

const OPT = {
  algorithm: "org.eclipse.elk.algorithm",
  direction: "org.eclipse.elk.direction",
  edgeRouting: "org.eclipse.elk.edgeRouting",
  nodeNode: "org.eclipse.elk.spacing.nodeNode",
  betweenLayers: "org.eclipse.elk.layered.spacing.nodeNodeBetweenLayers",
  edgeEdge: "org.eclipse.elk.spacing.edgeEdge",
  edgeEdgeBetweenLayers: "org.eclipse.elk.layered.spacing.edgeEdgeBetweenLayers",
  edgeNode: "org.eclipse.elk.spacing.edgeNode",
  edgeNodeBetweenLayers: "org.eclipse.elk.layered.spacing.edgeNodeBetweenLayers",
  labelNode: "org.eclipse.elk.spacing.labelNode",
  labelLabel: "org.eclipse.elk.spacing.labelLabel",
  padding: "org.eclipse.elk.padding",
  randomSeed: "org.eclipse.elk.randomSeed",
  thoroughness: "org.eclipse.elk.layered.thoroughness",
  modelOrder: "org.eclipse.elk.layered.considerModelOrder.strategy",
  partitioning: "org.eclipse.elk.partitioning.activate",
  partition: "org.eclipse.elk.partitioning.partition",
  separateComponents: "org.eclipse.elk.separateConnectedComponents",
  portConstraints: "org.eclipse.elk.portConstraints",
  layerConstraint: "org.eclipse.elk.layered.layering.layerConstraint",
  portSide: "org.eclipse.elk.port.side",
  labelPlacement: "org.eclipse.elk.nodeLabels.placement",
  edgeCoords: "org.eclipse.elk.json.edgeCoords",
} as const;

/** Room between a gate group's box and the parts inside it. */
const GROUP_PADDING_PX = 6;

/** Where ELK puts a node's labels, by the side we chose for them. */
const LABEL_PLACEMENT: Record<Side, string> = {
  NORTH: "OUTSIDE V_TOP H_CENTER",
  SOUTH: "OUTSIDE V_BOTTOM H_CENTER",
  EAST: "OUTSIDE V_CENTER H_RIGHT",
  WEST: "OUTSIDE V_CENTER H_LEFT",
};

/**
 * ELK's layer constraints. Terminals take the `_SEPARATE` forms, which give them a layer of
 * their own, so a part with no incoming wire cannot share the supply's column.
 */
function layerConstraint(node: GraphNode): string | null {
  const terminal = node.origin.type === "terminal";
  if (node.layer === "first") return terminal ? "FIRST_SEPARATE" : "FIRST";
  if (node.layer === "last") return terminal ? "LAST_SEPARATE" : "LAST";
  return null;
}

/** ELK's root option map for our settings: layered, left to right, orthogonal wires. */
export function elkRootOptions(s: LayeredSettings): LayoutOptions {
  const p = String(s.paddingPx);
  return {
    [OPT.algorithm]: "layered",
    [OPT.direction]: "RIGHT",
    [OPT.edgeRouting]: "ORTHOGONAL",
    [OPT.nodeNode]: String(s.nodeSpacingPx),
    [OPT.betweenLayers]: String(s.layerSpacingPx),
    [OPT.edgeEdge]: String(s.edgeSpacingPx),
    [OPT.edgeEdgeBetweenLayers]: String(s.edgeSpacingPx),
    [OPT.edgeNode]: String(s.edgeNodeSpacingPx),
    [OPT.edgeNodeBetweenLayers]: String(s.edgeNodeSpacingPx),
    [OPT.labelNode]: String(s.labelGapPx),
    [OPT.labelLabel]: "1",
    [OPT.padding]: `[top=${p},left=${p},bottom=${p},right=${p}]`,
    [OPT.randomSeed]: String(s.randomSeed),
    [OPT.thoroughness]: String(s.thoroughness),
    // Ties in crossing minimisation follow the graph's order (supply first, then the record's
    // parts in their order): on the generated 5-60-part set this gave fewer crossings, bends
    // and wire (907 -> 901, 3360 -> 3338, 411 -> 398 px per part) at no measurable extra time.
    [OPT.modelOrder]: "NODES_AND_EDGES",
    // One layered graph for everything, so a stray part cannot be packed left of the supply.
    [OPT.separateComponents]: "false",
    // Every wire in drawing coordinates, also those drawn inside a gate group's box.
    [OPT.edgeCoords]: "ROOT",
  };
}

/**
 * A gate group's box: laid out inside with the drawing's own settings (ELK lays out a box's
 * inside before the graph around it), its ports on the sides we chose, placed along them by ELK.
 */
function toElkGroup(node: GraphNode, graph: LayoutGraph, s: LayeredSettings): ElkNode {
  const p = String(GROUP_PADDING_PX);
  const layoutOptions: LayoutOptions = {
    ...elkRootOptions(s),
    [OPT.padding]: `[top=${p},left=${p},bottom=${p},right=${p}]`,
    [OPT.portConstraints]: "FIXED_SIDE",
  };
  if (node.partition !== null) layoutOptions[OPT.partition] = String(node.partition);
  return {
    id: node.id,
    layoutOptions,
    ports: node.ports.map((port): ElkPort => ({
      id: port.id,
      width: 0,
      height: 0,
      layoutOptions: { [OPT.portSide]: port.side },
    })),
    children: graph.nodes.filter((n) => n.group === node.id).map(toElkNode),
    edges: graph.edges.filter((e) => e.scope === node.id).map(toElkEdge),
  };
}

const toElkEdge = (e: GraphEdge): ElkExtendedEdge => ({
  id: e.id,
  sources: [e.source],
  targets: [e.target],
});

function toElkNode(node: GraphNode): ElkNode {
  const layoutOptions: LayoutOptions = { [OPT.portConstraints]: "FIXED_POS" };
  const layer = layerConstraint(node);
  if (layer !== null) layoutOptions[OPT.layerConstraint] = layer;
  if (node.partition !== null) layoutOptions[OPT.partition] = String(node.partition);
  const placement = LABEL_PLACEMENT[node.labelSide];
  return {
    id: node.id,
    width: node.width,
    height: node.height,
    layoutOptions,
    ports: node.ports.map((p): ElkPort => ({
      id: p.id,
      x: p.x,
      y: p.y,
      width: 0,
      height: 0,
      layoutOptions: { [OPT.portSide]: p.side },
    })),
    labels: node.labels.map((l): ElkLabel => ({
      text: l.text,
      width: l.width,
      height: l.height,
      layoutOptions: { [OPT.labelPlacement]: placement },
    })),
  };
}

/** Our graph as ELK's JSON graph (pure). */
export function toElkGraph(graph: LayoutGraph, settings: LayeredSettings): ElkNode {
  const layoutOptions = elkRootOptions(settings);
  // Column groups (an isolating transformer's two sides) keep their left-to-right order.
  if (graph.nodes.some((n) => n.partition !== null)) layoutOptions[OPT.partitioning] = "true";
  return {
    id: "root",
    layoutOptions,
    children: graph.nodes
      .filter((n) => n.group === null)
      .map((n) => (n.origin.type === "gate-group" ? toElkGroup(n, graph, settings) : toElkNode(n))),
    edges: graph.edges.filter((e) => e.scope === null).map(toElkEdge),
  };
}

const num = (v: number | undefined): number => v ?? 0;

/**
 * ELK's laid-out graph back as absolute geometry (pure). Boxes, ports and labels are relative
 * to their parent box, so a gate group's offset is added to its parts; wires are asked for in
 * drawing coordinates (`edgeCoords`), so theirs already are absolute.
 */
export function fromElkGraph(laid: ElkNode): PlacedGraph {
  const nodes = new Map<string, PlacedNode>();
  const edges = new Map<string, WireSection[]>();
  collect(laid, 0, 0, nodes, edges);
  return { width: num(laid.width), height: num(laid.height), nodes, edges };
}

/** The children and wires of one box, its top-left corner at (ox, oy). */
function collect(
  box: ElkNode,
  ox: number,
  oy: number,
  nodes: Map<string, PlacedNode>,
  edges: Map<string, WireSection[]>,
): void {
  for (const child of box.children ?? []) {
    const x = ox + num(child.x);
    const y = oy + num(child.y);
    const ports = new Map<string, Point>();
    for (const port of child.ports ?? [])
      ports.set(port.id, { x: x + num(port.x), y: y + num(port.y) });
    const labels = (child.labels ?? []).map((l): Box => ({
      x: x + num(l.x),
      y: y + num(l.y),
      width: num(l.width),
      height: num(l.height),
    }));
    nodes.set(child.id, {
      x,
      y,
      width: num(child.width),
      height: num(child.height),
      ports,
      labels,
    });
    collect(child, x, y, nodes, edges);
  }
  for (const edge of box.edges ?? []) {
    const sections = ((edge as ElkExtendedEdge).sections ?? []).map((s): WireSection => ({
      start: { x: s.startPoint.x, y: s.startPoint.y },
      end: { x: s.endPoint.x, y: s.endPoint.y },
      bends: (s.bendPoints ?? []).map((b) => ({ x: b.x, y: b.y })),
    }));
    edges.set(edge.id, sections);
  }
}

// One ELK instance for the process: building it loads the whole compiled layouter.
let sharedElk: ElkInstance | null = null;
function elk(): ElkInstance {
  sharedElk ??= new ELK();
  return sharedElk;
}

/** ELK's message without its Java class prefix and stack. */
function elkMessage(error: unknown): string {
  const text = error instanceof Error ? error.message : String(error);
  const firstLine = text.split("\n")[0] ?? text;
  return firstLine.replace(/^(?:[a-z]+\.)+[A-Za-z]+(?:Exception|Error):\s*/, "");
}

/** Lays the graph out with ELK's layered algorithm; ELK's refusals come back as a value. */
export async function runElkLayered(
  graph: LayoutGraph,
  settings: LayeredSettings,
): Promise<ElkRunResult> {
  let laid: ElkNode;
  try {
    laid = await elk().layout(toElkGraph(graph, settings));
  } catch (error) {
    return {
      ok: false,
      code: "layout-engine-failed",
      message: `ELK could not lay out the schematic: ${elkMessage(error)}`,
      where: null,
    };
  }
  return { ok: true, placed: fromElkGraph(laid) };
}
