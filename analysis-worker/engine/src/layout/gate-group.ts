/**
 * A thyristor's or triac's gate network kept beside it as one unit. The networks are the
 * engine's own block finders' (blocks/thyristor-trigger.ts, blocks/triac-trigger.ts: the
 * device and the divider or RC network driving its gate). Each becomes a group box: ELK lays
 * the device and its network out inside the box first, then places the box in the drawing as a
 * whole, so no other part can come between the network and the gate it drives. The box itself
 * is never drawn; only its parts and wires are.
 */
import type { Block } from "../blocks/block-types.js";
import type { TeardownRecord } from "../record/types.js";
import type { GraphNode } from "./layout-graph.js";

const TRIGGER_KINDS: ReadonlySet<string> = new Set(["thyristor-trigger", "triac-trigger"]);

/** The refs of the parts a node draws, when it draws parts a group may hold. */
function refsOf(node: GraphNode): string[] {
  const o = node.origin;
  if (o.type === "part") return [o.part.ref];
  if (o.type === "divider") return [o.divider.upper.ref, o.divider.lower.ref];
  // A bridge's or a ladder's diodes are never all in a gate network; terminals draw no part.
  return [];
}

/**
 * Puts each trigger block's nodes into a group box and returns the boxes. A node joins a group
 * only when every part it draws is in the block, it is free to go in any column, and it is in
 * no group yet; a group needs its device and at least one other node, all on one side of an
 * isolating transformer.
 */
export function gateGroups(
  record: TeardownRecord,
  blocks: readonly Block[],
  nodes: readonly GraphNode[],
): GraphNode[] {
  const groups: GraphNode[] = [];
  const kindOf = new Map(record.parts.map((p) => [p.ref, p.kind]));
  for (const block of blocks) {
    if (!TRIGGER_KINDS.has(block.kind)) continue;
    const refs = new Set(block.parts);
    const members = nodes.filter((n) => {
      const mine = refsOf(n);
      return (
        mine.length > 0 && n.group === null && n.layer === "free" && mine.every((r) => refs.has(r))
      );
    });
    const device = members.find((n) => {
      const kind = kindOf.get(refsOf(n)[0]!);
      return n.origin.type === "part" && (kind === "thyristor" || kind === "triac");
    });
    if (device === undefined || members.length < 2) continue;
    if (members.some((m) => m.partition !== device.partition)) continue;
    const id = `g${groups.length}`;
    for (const m of members) m.group = id;
    groups.push({
      id,
      width: 0,
      height: 0,
      layer: "free",
      partition: device.partition,
      group: null,
      ports: [],
      labels: [],
      labelSide: "NORTH",
      origin: { type: "gate-group", device: refsOf(device)[0]! },
    });
  }
  return groups;
}
