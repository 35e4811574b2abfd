/**
 * A net's wires as directed edges for ELK. Each net is a hyperedge: one end feeds it and every
 * other end is wired from that one, so ELK's orthogonal router draws the net as one branching
 * tree whose branch points are real T-joints.
 *
 * A net that reaches into a gate group (gate-group.ts) from outside gets one port on the
 * group's box: inside the box the group's ends are wired to that port, outside the port is one
 * end of the net like any pin. ELK lays the group's inside out first and then places the box
 * as a whole, which is what keeps a gate network beside its thyristor or triac.
 */
import type { GraphEdge, GraphNode, GraphPort } from "./layout-graph.js";

/** A port as one end of a net, with whether wires should leave it (source) or enter it. */
interface Endpoint {
  port: GraphPort;
  node: GraphNode;
  source: boolean;
}

/** Which ends of a net feed it: supply ports and right-hand pins do, last-layer nodes never. */
function isSource(port: GraphPort, node: GraphNode): boolean {
  if (node.layer === "first") return true;
  if (node.layer === "last") return false;
  if (node.origin.type === "bridge") return port.role === "plus" || port.role === "minus";
  return port.side === "EAST";
}

/**
 * The end a net's wires start from: the supply entry when the net has one (ELK lets nothing
 * enter a first-layer node), else the first feeding end (a right-hand pin), else the first end
 * that is not in the last layer (ELK lets nothing leave one).
 */
function rootOf(ends: readonly Endpoint[]): Endpoint {
  return (
    ends.find((e) => e.node.layer === "first") ??
    // A rectifier's output feeds its rail, whatever part comes first in the list.
    ends.find((e) => e.source && e.node.origin.type === "bridge") ??
    ends.find((e) => e.source) ??
    ends.find((e) => e.node.layer !== "last") ??
    ends[0]!
  );
}

/**
 * The side of a group's box where a net leaves it, chosen by where the rest of the net is: a
 * bottom rail (the neutral, a return) at the bottom, so it can drop onto the rail; a net fed
 * from outside (the supply, a right-hand pin) on the left, where its feed comes from; a net
 * that only goes on to loads and outputs (drawn last) on the right, toward them.
 */
function groupPortSide(outside: readonly Endpoint[], bottomRail: boolean): GraphPort["side"] {
  if (bottomRail) return "SOUTH";
  return outside.some((e) => e.source) ? "WEST" : "EAST";
}

/**
 * The edges of every net, in net order, each tagged with the group box it is drawn inside
 * (null for the drawing itself). Adds the ports nets need on the group boxes.
 */
export function netEdges(
  netNames: readonly string[],
  nodes: readonly GraphNode[],
  bottomRails: ReadonlySet<string>,
): GraphEdge[] {
  const byId = new Map(nodes.map((n) => [n.id, n]));
  const endsByNet = new Map<string, Endpoint[]>(netNames.map((n) => [n, []]));
  for (const node of nodes) {
    if (node.origin.type === "gate-group") continue;
    for (const port of node.ports)
      endsByNet.get(port.net)!.push({ port, node, source: isSource(port, node) });
  }
  const edges: GraphEdge[] = [];
  const wire = (net: string, ends: readonly Endpoint[], scope: string | null): void => {
    if (ends.length < 2) return;
    const root = rootOf(ends);
    for (const end of ends)
      if (end !== root)
        edges.push({
          id: `e${edges.length}`,
          net,
          source: root.port.id,
          target: end.port.id,
          scope,
        });
  };
  for (const net of netNames) {
    const ends = endsByNet.get(net)!;
    const scopes = [...new Set(ends.map((e) => e.node.group))];
    if (scopes.length <= 1) {
      wire(net, ends, scopes[0] ?? null);
      continue;
    }
    // Port sides are chosen from the net's own ends outside; the group ports join them after.
    const ownOutside = ends.filter((e) => e.node.group === null);
    const outside = [...ownOutside];
    for (const scope of scopes) {
      if (scope === null) continue;
      const group = byId.get(scope)!;
      const inner = ends.filter((e) => e.node.group === scope);
      const side = groupPortSide(ownOutside, bottomRails.has(net));
      const port: GraphPort = {
        id: `${group.id}.${group.ports.length}`,
        net,
        role: "group",
        side,
        x: 0,
        y: 0,
      };
      group.ports.push(port);
      // Seen from inside, a port on the left feeds the group; seen from outside, one on the
      // right feeds the drawing.
      wire(net, [...inner, { port, node: group, source: side === "WEST" }], scope);
      outside.push({ port, node: group, source: side === "EAST" });
    }
    wire(net, outside, null);
  }
  return edges;
}
