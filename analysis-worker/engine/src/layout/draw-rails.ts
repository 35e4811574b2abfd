/**
 * Rails and buses drawn over ELK's finished routes (the choices are in README.md): the
 * neutral and rectifier returns along the bottom, rectifier outputs along the top, any other
 * net of three or more ends as a straight bus where that crosses fewer wires. Each replaces
 * ELK's route only where every lead comes out clean (rail-routes.ts decides that).
 */
import type { PlacedGraph } from "./elk-adapter.js";
import { boundsOf, boxOf } from "./free-space.js";
import { drawnNodes, type LayoutGraph } from "./layout-graph.js";
import type { PlacedPin, WireSection } from "./layout-types.js";
import { mergeNetSections } from "./merge-wires.js";
import { RAIL_GAP_PX, railFor, runsOfSections, type RailEnd, type Run } from "./rail-routes.js";

/** Crossings between one net's runs and every other net's. */
function crossingCount(net: string, runs: readonly Run[]): number {
  let n = 0;
  for (const a of runs) {
    if (a.net !== net) continue;
    for (const b of runs) {
      if (b.net === net || b.horizontal === a.horizontal) continue;
      const [h, v] = a.horizontal ? [a, b] : [b, a];
      if (v.at > h.lo && v.at < h.hi && h.at > v.lo && h.at < v.hi) n += 1;
    }
  }
  return n;
}

/** Crossings the neutral may add over ELK's route to be drawn as the straight bottom return. */
const NEUTRAL_EXTRA_CROSSINGS = 1;

/** A rail net is drawn as a rail only with at least this many ends. */
const RAIL_MIN_ENDS = 3;

/** Nets with at least this many ends may be drawn as a straight bus to cut crossings. */
const BUS_MIN_ENDS = 3;

/**
 * Rails (rail-nets.ts): the neutral and rectifier returns as straight lines along the bottom,
 * rectifier outputs along the top, every part on them hanging from them, wherever that is
 * clean and crosses no more wires than ELK's route (see rail-routes.ts). Then the same for
 * any other net of three or more ends, where it crosses strictly fewer.
 */
export function drawRails(
  graph: LayoutGraph,
  placed: PlacedGraph,
  sectionsByNet: Map<string, WireSection[]>,
  leadsByNet: ReadonlyMap<string, WireSection[]>,
  pins: readonly PlacedPin[],
): void {
  const rails = [
    ...graph.rails.bottom.map((net) => ({ net, down: true })),
    ...graph.rails.top.map((net) => ({ net, down: false })),
  ].filter(({ net }) => graph.netRoles.has(net));
  const named = new Set(rails.map((r) => r.net));
  const portCount = new Map<string, number>();
  for (const node of drawnNodes(graph))
    for (const port of node.ports) portCount.set(port.net, (portCount.get(port.net) ?? 0) + 1);
  const tries = [
    // A rail is where parts hang: a rail net with only two ends is one wire, and lifting it
    // to the edge of the drawing only makes both ends climb (the ionizer's D1 to R1).
    ...rails
      .filter((r) => (portCount.get(r.net) ?? 0) >= RAIL_MIN_ENDS)
      .map((r) => ({ ...r, strict: false })),
    // Any other net with three or more ends becomes a straight bus above or below the
    // drawing when that crosses strictly fewer wires than ELK's route.
    ...[...portCount]
      .filter(([net, n]) => n >= BUS_MIN_ENDS && !named.has(net))
      .flatMap(([net]) => [
        { net, down: true, strict: true },
        { net, down: false, strict: true },
      ]),
  ];
  // Returns whether the net was redrawn.
  const tryRail = ({ net, down, strict }: (typeof tries)[number]): boolean => {
    const ends: RailEnd[] = [];
    for (const node of drawnNodes(graph)) {
      const at = placed.nodes.get(node.id)!;
      for (const port of node.ports)
        if (port.net === net) ends.push({ ...at.ports.get(port.id)!, side: port.side });
    }
    const runs = [...sectionsByNet].flatMap(([n, list]) => runsOfSections(n, list));
    const others = runs.filter((r) => r.net !== net);
    const bodies = drawnNodes(graph).map((n) => boxOf(placed.nodes.get(n.id)!));
    const extent = boundsOf([
      ...bodies,
      ...others.map((r) =>
        r.horizontal
          ? { x: r.lo, y: r.at, width: r.hi - r.lo, height: 0 }
          : { x: r.at, y: r.lo, width: 0, height: r.hi - r.lo },
      ),
    ]);
    if (extent === null) return false;
    const railY = down ? extent.y + extent.height + RAIL_GAP_PX : extent.y - RAIL_GAP_PX;
    const rail = railFor(net, ends, railY, { bodies, runs: others, pins });
    const before = crossingCount(net, runs);
    const allowed = before + (graph.netRoles.get(net) === "neutral" ? NEUTRAL_EXTRA_CROSSINGS : 0);
    if (rail === null || rail.crossings > allowed || (strict && rail.crossings === before))
      return false;
    const leads = leadsByNet.get(net) ?? [];
    sectionsByNet.set(
      net,
      mergeNetSections(
        [...leads, ...rail.sections],
        pins.filter((p) => p.net === net),
      ),
    );
    return true;
  };
  const failed = tries.filter((t) => !tryRail(t) && !t.strict);
  // A rail blocked by another net's route may be clear once that net became a bus: one more try.
  for (const t of failed) tryRail(t);
}
