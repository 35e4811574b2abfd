/**
 * Isolation boundaries: where the record says the secondary is isolated, a dashed line through
 * each transformer between its windings (ELK's partitioning put the primary side left of it).
 */
import type { PlacedGraph } from "./elk-adapter.js";
import { boundsOf, boxOf, sectionBoxes } from "./free-space.js";
import { drawnNodes, type LayoutGraph } from "./layout-graph.js";
import type { PlacedBarrier } from "./layout-types.js";

/** How far an isolation boundary reaches past the parts and wires above and below. */
const BARRIER_OVERHANG_PX = 10;

/**
 * A dashed boundary through each transformer, between its windings, from above the highest
 * part or wire to below the lowest one.
 */
export function barriersFor(graph: LayoutGraph, placed: PlacedGraph): PlacedBarrier[] {
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
