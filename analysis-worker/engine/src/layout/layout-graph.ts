/**
 * The record as a graph of boxes, ports and directed edges, ready for a layered layout but
 * free of ELK's vocabulary. Parts are taken in ref order and nets in name order, and ids are
 * handed out in that order, so the same record always gives the same graph (and ELK, which is
 * deterministic for a given input order, the same drawing).
 */
import type { NetRole, Part, TeardownRecord } from "../record/types.js";
import type { Rotation, Side, SymbolName } from "./layout-types.js";
import { bridgePorts, BRIDGE_SIZE_PX, findBridges, type BridgeMatch } from "./bridge-block.js";
import { rotateSymbol, rotationFor, symbolFor } from "./symbol-table.js";
import { isolationSides, type IsolationSide } from "./isolation-sides.js";
import { labelSize } from "./text-size.js";
import { dividerPorts, dividerSize, findDividers, type DividerMatch } from "./divider-block.js";
import { railNets, type RailNets } from "./rail-nets.js";
import { gateGroups } from "./gate-group.js";
import { findBlocks } from "../blocks/find-blocks.js";
import { netEdges } from "./net-edges.js";
import {
  findMultipliers,
  multiplierPorts,
  multiplierSize,
  type MultiplierMatch,
} from "./multiplier-block.js";

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
  /** Terminal ports only: the record says a person can touch this net. */
  accessible?: boolean;
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
  | { type: "bridge"; bridge: BridgeMatch }
  | { type: "divider"; divider: DividerMatch }
  | { type: "multiplier"; multiplier: MultiplierMatch }
  | { type: "gate-group"; device: string };

/** A box to place: a part, a terminal or a bridge rectifier drawn as one diamond. */
export interface GraphNode {
  id: string;
  width: number;
  height: number;
  /**
   * Layer constraint: the supply entry alone in the first layer, the output terminal alone in
   * the last one, loads in the layer before it.
   */
  layer: "first" | "last" | "free";
  /**
   * Column group when an isolating transformer splits the drawing: 0 primary side, 1 the
   * transformer, 2 the secondary side; null when nothing is split.
   */
  partition: IsolationSide | null;
  /** The gate group whose box this node is drawn inside (gate-group.ts), or null. */
  group: string | null;
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
  /** The gate group whose box holds this wire, or null for the drawing itself. */
  scope: string | null;
}

/** Nodes and edges in canonical order, with each net's declared role. */
export interface LayoutGraph {
  nodes: GraphNode[];
  edges: GraphEdge[];
  /** Net name to declared role, for every net that has at least one pin. */
  netRoles: Map<string, NetRole | null>;
  /** Nets drawn as straight rails where that comes out clean (rail-nets.ts). */
  rails: RailNets;
}

const byCodePoint = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

function freeLabelSide(ports: readonly GraphPort[]): Side {
  const used = new Set(ports.map((p) => p.side));
  return (["NORTH", "EAST", "WEST", "SOUTH"] as const).find((s) => !used.has(s)) ?? "NORTH";
}

/**
 * A terminal: the supply entry (its nets leave on the right, line above neutral, so both
 * enter the drawing from the left) or the output (nets enter on its left).
 */
function terminalNode(
  id: string,
  kind: "supply" | "output",
  nets: readonly [string, string][],
  caption: string,
  accessible: ReadonlySet<string>,
): GraphNode {
  const longest = Math.max(0, ...nets.map(([n]) => labelSize(n).width));
  const width = Math.max(TERMINAL_MIN_WIDTH_PX, Math.ceil((longest + 10) / 10) * 10);
  const height = Math.max(1, nets.length) * TERMINAL_PORT_PITCH_PX;
  const side: Side = kind === "supply" ? "EAST" : "WEST";
  const ports = nets.map(([net, role], i): GraphPort => ({
    id: `${id}.${i}`,
    net,
    role,
    side,
    x: side === "EAST" ? width : 0,
    y: TERMINAL_PORT_PITCH_PX / 2 + i * TERMINAL_PORT_PITCH_PX,
    accessible: accessible.has(net),
  }));
  const text = labelSize(caption);
  return {
    id,
    width,
    height,
    layer: kind === "supply" ? "first" : "last",
    partition: null,
    group: null,
    ports,
    labels: [{ text: caption, ...text, of: "caption" }],
    labelSide: "NORTH",
    origin: { type: "terminal", kind },
  };
}

function partNode(
  id: string,
  part: Part,
  downNets: ReadonlySet<string>,
  upNets: ReadonlySet<string>,
): GraphNode {
  const base = symbolFor(part);
  const rotation = rotationFor(part, base, downNets, upNets);
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
    partition: null,
    group: null,
    ports,
    labels,
    labelSide: freeLabelSide(ports),
    origin: { type: "part", part, symbol: geometry.symbol, rotation },
  };
}

/** A port of a block drawn as a fixed shape, relative to the block's top-left corner. */
interface ShapePort {
  key: string;
  net: string;
  side: Side;
  x: number;
  y: number;
}

/**
 * A recognised block drawn as a fixed shape (a bridge's diamond, a divider's upright pair, a
 * multiplier's ladder): one
 * box for ELK with the shape's ports, opened up into its parts after layout. The box carries no
 * labels: the block places its parts' labels itself when it is opened.
 */
function shapeNode(
  id: string,
  size: { width: number; height: number },
  ports: readonly ShapePort[],
  origin: Extract<NodeOrigin, { type: "bridge" | "divider" | "multiplier" }>,
): GraphNode {
  return {
    id,
    width: size.width,
    height: size.height,
    layer: "free",
    partition: null,
    group: null,
    ports: ports.map((p) => ({
      id: `${id}.${p.key}`,
      net: p.net,
      role: p.key,
      side: p.side,
      x: p.x,
      y: p.y,
    })),
    labels: [],
    labelSide: "NORTH",
    origin,
  };
}

/**
 * Loads go to the last layer, except where a net would then have every end in the last layer
 * (its wires must leave some node, and ELK refuses an edge leaving a last-layer node): such a
 * load is left free, as is a load shorted by its own pins.
 */
function pinLoadsLast(nodes: readonly GraphNode[], netNames: readonly string[]): void {
  const nodesByNet = new Map<string, GraphNode[]>(netNames.map((n) => [n, []]));
  for (const node of nodes) for (const port of node.ports) nodesByNet.get(port.net)!.push(node);
  for (const node of nodes) {
    if (node.origin.type !== "part" || node.origin.part.kind !== "load") continue;
    const nets = node.ports.map((p) => p.net);
    if (new Set(nets).size === nets.length) node.layer = "last";
  }
  for (let changed = true; changed;) {
    changed = false;
    for (const ends of nodesByNet.values()) {
      if (ends.length < 2 || ends.some((n) => n.layer !== "last")) continue;
      const load = ends.find((n) => n.origin.type === "part");
      if (load === undefined) continue;
      load.layer = "free";
      changed = true;
    }
  }
}

/** The record's parts, nets and declared roles as a layout graph. */
export function buildLayoutGraph(record: TeardownRecord): LayoutGraph {
  const rails = railNets(record);
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

  const accessible = new Set(netNames.filter((n) => record.nets[n]?.accessible === true));
  const nodes: GraphNode[] = [];
  // Line above neutral, so the neutral is the lower of the two wires entering the drawing.
  const supplyNets = [...withRole(["line"]), ...withRole(["neutral"])];
  if (supplyNets.length > 0) {
    const { vrms, hz } = record.device.rated_supply;
    nodes.push(terminalNode("supply", "supply", supplyNets, `${vrms} V ${hz} Hz`, accessible));
  }
  // Outputs, and any other net a person can touch, end at terminals on the right.
  // Declared outputs first (the positive rail usually is one), then nets that are only touchable.
  const outputNets: [string, string][] = netNames
    .filter((n) => {
      const role = netRoles.get(n);
      return role === "output" || (accessible.has(n) && role !== "line" && role !== "neutral");
    })
    .map((n): [string, string] => [n, netRoles.get(n) ?? "touchable"])
    .sort((a, b) => Number(a[1] !== "output") - Number(b[1] !== "output"));
  if (outputNets.length > 0) {
    const touchOnly = outputNets.every(([n, r]) => r !== "output" && accessible.has(n));
    const caption = outputNets.some(([n]) => accessible.has(n))
      ? touchOnly
        ? "touchable"
        : "output, touchable"
      : "output";
    nodes.push(terminalNode("output", "output", outputNets, caption, accessible));
  }
  const bridges = findBridges(parts, neutralNets);
  // Parts turn so their neutral pins face down. Turning the other rails' pins toward their
  // rails too (negative down, positive up) gave ELK ports on the top and bottom of many more
  // boxes, and the generated set 20-30% more crossings, so those rails take sideways pins.
  const downNets = neutralNets;
  const upNets = new Set<string>();
  const inBridge = new Set(
    bridges.flatMap((b) => [b.topLeft, b.topRight, b.bottomLeft, b.bottomRight]),
  );
  // Dividers (the engine's block finder's) as upright pairs, their tap leaving east.
  // Voltage multipliers as regular ladders.
  const multipliers = findMultipliers(
    parts,
    new Set([...inBridge].map((p) => p.ref)),
    new Set(rails.bottom),
  );
  const inLadder = new Set(
    multipliers.flatMap((m) => m.stages.flatMap((s) => [s.top, s.up, s.down, s.bottom])),
  );
  // The engine's functional blocks, found once: dividers and gate networks come from them.
  const blocks = findBlocks(record);
  const dividers = findDividers(
    record,
    blocks,
    new Set(rails.bottom),
    new Set([...inBridge, ...inLadder].map((p) => p.ref)),
  );
  const inDivider = new Set(dividers.flatMap((d) => [d.upper.ref, d.lower.ref]));
  parts.forEach((part, i) => {
    if (!inBridge.has(part) && !inLadder.has(part) && !inDivider.has(part.ref))
      nodes.push(partNode(`p${i}`, part, downNets, upNets));
  });
  bridges.forEach((bridge, i) =>
    nodes.push(
      shapeNode(`b${i}`, { width: BRIDGE_SIZE_PX, height: BRIDGE_SIZE_PX }, bridgePorts(bridge), {
        type: "bridge",
        bridge,
      }),
    ),
  );
  multipliers.forEach((multiplier, i) =>
    nodes.push(
      shapeNode(`m${i}`, multiplierSize(multiplier), multiplierPorts(multiplier), {
        type: "multiplier",
        multiplier,
      }),
    ),
  );
  dividers.forEach((divider, i) =>
    nodes.push(
      shapeNode(`v${i}`, dividerSize(divider), dividerPorts(divider), {
        type: "divider",
        divider,
      }),
    ),
  );

  pinLoadsLast(nodes, netNames);
  // An isolated secondary: primary parts left of the transformer, the rest right of it.
  const sides = record.device.tags.some((t) => t.trim().toLowerCase() === "isolated")
    ? isolationSides(record)
    : null;
  if (sides !== null)
    for (const node of nodes) {
      const o = node.origin;
      node.partition =
        o.type === "terminal"
          ? o.kind === "supply"
            ? 0
            : 2
          : o.type === "part"
            ? sides.get(o.part.ref)!
            : o.type === "bridge"
              ? sides.get(o.bridge.topLeft.ref)!
              : o.type === "divider"
                ? sides.get(o.divider.upper.ref)!
                : o.type === "multiplier"
                  ? sides.get(o.multiplier.stages[0]!.up.ref)!
                  : null;
      // A load left of the transformer cannot be in the last column.
      if (o.type === "part" && node.layer === "last" && node.partition !== 2) node.layer = "free";
    }
  // Gate networks beside their thyristor or triac, each in a box of its own; then the wires.
  nodes.push(...gateGroups(record, blocks, nodes));
  const edges = netEdges(netNames, nodes, new Set(rails.bottom));
  return { nodes, edges, netRoles, rails };
}

/** The nodes that stand for something drawn: every node but the gate groups' unseen boxes. */
export const drawnNodes = (graph: LayoutGraph): GraphNode[] =>
  graph.nodes.filter((n) => n.origin.type !== "gate-group");
