/**
 * The record as a graph of boxes, ports and directed edges, ready for a layered layout but
 * free of ELK's vocabulary. Parts are taken in ref order and nets in name order, and ids are
 * handed out in that order, so the same record always gives the same graph (and ELK, which is
 * deterministic for a given input order, the same drawing).
 */
import type { NetRole, Part, TeardownRecord } from "@teardown/engine";
import type { Rotation, Side, SymbolName } from "./layout-types.js";
import { rotateSymbol, rotationFor, symbolFor } from "./symbol-table.js";
import { labelSize } from "./text-size.js";

/** Side length of the junction box; the dot is drawn at its centre. */
export const JUNCTION_SIZE_PX = 8;
/** Vertical pitch of the ports on a terminal. */
const TERMINAL_PORT_PITCH_PX = 20;
/** Narrowest terminal box; it widens to fit its longest net name. */
const TERMINAL_MIN_WIDTH_PX = 30;

/** A pin of a node, fixed in place on one side of its box. */
export interface GraphPort {
  id: string;
  net: string;
  /** The part's pin role, or the net's role for terminal ports. */
  role: string;
  side: Side;
  /** Relative to the node's top-left corner. */
  x: number;
  y: number;
}

/** A text ELK keeps room for beside its node. */
export interface GraphLabel {
  text: string;
  width: number;
  height: number;
  of: "ref" | "value" | "caption";
}

/** What a node stands for, so the result can be rebuilt after layout. */
export type NodeOrigin =
  | { type: "part"; part: Part; symbol: SymbolName; rotation: Rotation }
  | { type: "terminal"; kind: "supply" | "output" }
  | { type: "junction"; net: string };

/** A box to place: a part, a terminal or a junction. */
export interface GraphNode {
  id: string;
  width: number;
  height: number;
  /**
   * Layer constraint: the supply entry alone in the first layer, the output terminal alone in
   * the last one, loads in the layer before it.
   */
  layer: "first" | "last" | "free";
  ports: GraphPort[];
  labels: GraphLabel[];
  /** The side of the box where the labels go: one with no pins when there is one. */
  labelSide: Side;
  origin: NodeOrigin;
}

/** A directed wire between two ports; direction only guides the layering (supply to load). */
export interface GraphEdge {
  id: string;
  net: string;
  source: string;
  target: string;
}

/** Nodes and edges in canonical order, with each net's declared role. */
export interface LayoutGraph {
  nodes: GraphNode[];
  edges: GraphEdge[];
  /** Net name to declared role, for every net that has at least one pin. */
  netRoles: Map<string, NetRole | null>;
}

/** A port as one end of a net, with whether wires should leave it (source) or enter it. */
interface Endpoint {
  port: GraphPort;
  node: GraphNode;
  source: boolean;
}

const byCodePoint = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

function freeLabelSide(ports: readonly GraphPort[]): Side {
  const used = new Set(ports.map((p) => p.side));
  return (["NORTH", "EAST", "WEST", "SOUTH"] as const).find((s) => !used.has(s)) ?? "NORTH";
}

function terminalNode(
  id: string,
  kind: "supply" | "output",
  nets: readonly [string, NetRole][],
  caption: string,
): GraphNode {
  const east = kind === "supply" ? nets.filter(([, r]) => r !== "neutral") : [];
  const south = kind === "supply" ? nets.filter(([, r]) => r === "neutral") : [];
  const west = kind === "output" ? nets : [];
  const longest = Math.max(0, ...nets.map(([n]) => labelSize(n).width));
  const width = Math.max(
    TERMINAL_MIN_WIDTH_PX,
    Math.ceil((longest + 10) / 10) * 10,
    south.length * TERMINAL_PORT_PITCH_PX,
  );
  const rows = Math.max(1, east.length, west.length) + (south.length > 0 ? 1 : 0);
  const height = rows * TERMINAL_PORT_PITCH_PX;
  const ports: GraphPort[] = [];
  const column = (list: readonly [string, NetRole][], side: Side, x: number): void =>
    list.forEach(([net, role], i) =>
      ports.push({
        id: `${id}.${ports.length}`,
        net,
        role,
        side,
        x,
        y: TERMINAL_PORT_PITCH_PX / 2 + i * TERMINAL_PORT_PITCH_PX,
      }),
    );
  column(east, "EAST", width);
  column(west, "WEST", 0);
  south.forEach(([net, role], i) =>
    ports.push({
      id: `${id}.${ports.length}`,
      net,
      role,
      side: "SOUTH",
      x: ((i + 1) * width) / (south.length + 1),
      y: height,
    }),
  );
  const text = labelSize(caption);
  return {
    id,
    width,
    height,
    layer: kind === "supply" ? "first" : "last",
    ports,
    labels: [{ text: caption, ...text, of: "caption" }],
    labelSide: "NORTH",
    origin: { type: "terminal", kind },
  };
}

function partNode(id: string, part: Part, neutralNets: ReadonlySet<string>): GraphNode {
  const base = symbolFor(part);
  const rotation = rotationFor(part, base, neutralNets);
  const geometry = rotateSymbol(base, rotation);
  const ports = geometry.pins.map((p, i): GraphPort => ({
    id: `${id}.${i}`,
    net: part.pins[p.role]!,
    role: p.role,
    side: p.side,
    x: p.x,
    y: p.y,
  }));
  const labels: GraphLabel[] = [{ text: part.ref, ...labelSize(part.ref), of: "ref" }];
  if (part.value_text !== null && part.value_text !== "")
    labels.push({ text: part.value_text, ...labelSize(part.value_text), of: "value" });
  return {
    id,
    width: geometry.width,
    height: geometry.height,
    layer: "free",
    ports,
    labels,
    labelSide: freeLabelSide(ports),
    origin: { type: "part", part, symbol: geometry.symbol, rotation },
  };
}

/**
 * Loads go to the last layer, except where that would wire two last-layer nodes straight
 * together (ELK refuses an edge leaving a last-layer node): a load chained to the output or
 * to an earlier load by a two-ended net, or shorted by its own pins, is left free.
 */
function pinLoadsLast(
  nodes: readonly GraphNode[],
  endpointsByNet: ReadonlyMap<string, Endpoint[]>,
): void {
  for (const node of nodes) {
    if (node.origin.type !== "part" || node.origin.part.kind !== "load") continue;
    const nets = node.ports.map((p) => p.net);
    if (new Set(nets).size < nets.length) continue;
    const chained = nets.some((net) => {
      const ends = endpointsByNet.get(net)!;
      return ends.length === 2 && ends.some((e) => e.node !== node && e.node.layer === "last");
    });
    if (!chained) node.layer = "last";
  }
}

/** Which ends of a net feed it: supply ports and right-hand pins do, last-layer nodes never. */
function isSource(end: Endpoint): boolean {
  if (end.node.layer === "first") return true;
  if (end.node.layer === "last") return false;
  return end.port.side === "EAST";
}

/**
 * Whether the wire of a two-ended net runs from `a` to `b`: a first-layer end always feeds and
 * a last-layer end is always fed (ELK insists); otherwise the sides decide, ties go to `a`.
 */
function feedsOther(a: Endpoint, b: Endpoint): boolean {
  if (a.node.layer === "first" || b.node.layer === "last") return true;
  if (b.node.layer === "first" || a.node.layer === "last") return false;
  if (a.source !== b.source) return a.source;
  return true;
}

/** The record's parts, nets and declared roles as a layout graph. */
export function buildLayoutGraph(record: TeardownRecord): LayoutGraph {
  const parts = [...record.parts].sort((a, b) => byCodePoint(a.ref, b.ref));
  const netRoles = new Map<string, NetRole | null>();
  for (const part of parts)
    for (const net of Object.values(part.pins)) netRoles.set(net, record.nets[net]?.role ?? null);
  const netNames = [...netRoles.keys()].sort(byCodePoint);
  const withRole = (roles: readonly NetRole[]): [string, NetRole][] =>
    netNames
      .filter((n) => roles.includes(netRoles.get(n) as NetRole))
      .map((n) => [n, netRoles.get(n) as NetRole]);
  const neutralNets = new Set(withRole(["neutral"]).map(([n]) => n));

  const nodes: GraphNode[] = [];
  const supplyNets = withRole(["line", "neutral"]);
  if (supplyNets.length > 0) {
    const { vrms, hz } = record.device.rated_supply;
    nodes.push(terminalNode("supply", "supply", supplyNets, `${vrms} V ${hz} Hz`));
  }
  const outputNets = withRole(["output"]);
  if (outputNets.length > 0) nodes.push(terminalNode("output", "output", outputNets, "output"));
  parts.forEach((part, i) => nodes.push(partNode(`p${i}`, part, neutralNets)));

  const endpointsByNet = new Map<string, Endpoint[]>(netNames.map((n) => [n, []]));
  for (const node of nodes)
    for (const port of node.ports)
      endpointsByNet.get(port.net)!.push({ port, node, source: false });
  pinLoadsLast(nodes, endpointsByNet);

  const edges: GraphEdge[] = [];
  const addEdge = (net: string, source: string, target: string): void => {
    edges.push({ id: `e${edges.length}`, net, source, target });
  };
  netNames.forEach((net, netIndex) => {
    const ends = endpointsByNet.get(net)!;
    for (const end of ends) end.source = isSource(end);
    if (ends.length === 2) {
      const [a, b] = ends as [Endpoint, Endpoint];
      if (feedsOther(a, b)) addEdge(net, a.port.id, b.port.id);
      else addEdge(net, b.port.id, a.port.id);
    } else if (ends.length > 2) {
      // Three or more ends meet at a junction node: wires from the feeding ends enter its left
      // port, wires to the fed ends leave its right port.
      const id = `j${netIndex}`;
      const half = JUNCTION_SIZE_PX / 2;
      const inPort: GraphPort = { id: `${id}.in`, net, role: "in", side: "WEST", x: 0, y: half };
      const outPort: GraphPort = {
        id: `${id}.out`,
        net,
        role: "out",
        side: "EAST",
        x: JUNCTION_SIZE_PX,
        y: half,
      };
      nodes.push({
        id,
        width: JUNCTION_SIZE_PX,
        height: JUNCTION_SIZE_PX,
        layer: "free",
        ports: [inPort, outPort],
        labels: [],
        labelSide: "NORTH",
        origin: { type: "junction", net },
      });
      for (const end of ends) {
        if (end.source) addEdge(net, end.port.id, inPort.id);
        else addEdge(net, outPort.id, end.port.id);
      }
    }
  });
  return { nodes, edges, netRoles };
}
