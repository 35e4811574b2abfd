/**
 * Report-grade drawings: every demo record and generated circuits of 5 to 60 parts are laid out
 * and handed to the independent checker (tests/support/drawing-check.ts), which walks the wire
 * segments itself: no stray or missing junction dot, no shared or crowded track, no overlap, no
 * wire through a part, no label touching anything, every net drawn in one piece. Also: a bridge
 * is drawn as a diamond, the supply enters on the left. The checker is first shown to catch each
 * fault on small hand-made drawings, so a clean result means something.
 */
import { describe, expect, it } from "vitest";
import {
  layoutSchematic,
  type PlacedPart,
  type SchematicLayout,
  type TeardownRecord,
} from "@teardown/engine";
import { checkDrawing, hardFaults } from "../../support/drawing-check.js";
import { generatedCircuitSet } from "../../support/generated-circuits.js";
import { ALL_TEST_CIRCUITS } from "../../support/circuits/all-test-circuits.js";
import { LAYOUT_CIRCUITS } from "./layout-circuits.js";
import { demoCircuits } from "./circuit-set.js";

const demo = demoCircuits();
const generated = generatedCircuitSet();

async function laidOut(record: TeardownRecord): Promise<SchematicLayout> {
  const out = await layoutSchematic(record);
  if (!out.ok) throw new Error(out.message);
  return out.layout;
}

/** An empty drawing to build the checker's own test cases on. */
function blank(): SchematicLayout {
  return {
    width: 400,
    height: 300,
    parts: [],
    junctions: [],
    wires: [],
    netLabels: [],
    terminals: [],
  };
}

function resistor(ref: string, x: number, y: number, a: string, b: string): PlacedPart {
  return {
    ref,
    kind: "resistor",
    symbol: "resistor",
    rotation: 0,
    x,
    y,
    width: 60,
    height: 20,
    pins: [
      { role: "a", net: a, x, y: y + 10, side: "WEST" },
      { role: "b", net: b, x: x + 60, y: y + 10, side: "EAST" },
    ],
    labels: [],
  };
}

const run = (net: string, ...pts: [number, number][]) => ({
  net,
  role: null,
  sections: [
    {
      start: { x: pts[0]![0], y: pts[0]![1] },
      end: { x: pts.at(-1)![0], y: pts.at(-1)![1] },
      bends: pts.slice(1, -1).map(([x, y]) => ({ x, y })),
    },
  ],
});

describe("the drawing checker catches each fault it claims to", () => {
  it("counts a dot where three directions meet as right, elsewhere as stray, and a bare T as missing", () => {
    const d = blank();
    // Net A: a T at (100, 50): left, right and down.
    d.wires.push(run("A", [50, 50], [150, 50]), run("A", [100, 50], [100, 120]));
    d.junctions.push({ net: "A", x: 100, y: 50 });
    expect(checkDrawing(d).strayDots + checkDrawing(d).missingDots).toBe(0);
    d.junctions.push({ net: "A", x: 60, y: 50 }); // on a straight run: stray
    expect(checkDrawing(d).strayDots).toBe(1);
    d.junctions = [];
    expect(checkDrawing(d).missingDots).toBe(1);
  });

  it("counts a pin as a direction: two wires ending at one pin need a dot", () => {
    const d = blank();
    d.parts.push(resistor("R1", 200, 40, "A", "B"));
    d.wires.push(run("A", [100, 50], [200, 50]), run("A", [200, 50], [200, 150]));
    expect(checkDrawing(d).missingDots).toBe(1);
  });

  it("finds shared and crowded tracks, crossings and false touches between nets", () => {
    const d = blank();
    d.wires.push(run("A", [0, 50], [200, 50]), run("B", [100, 50], [300, 50]));
    expect(checkDrawing(d).sharedTracks).toBe(1);
    d.wires[1] = run("B", [100, 54], [300, 54]);
    expect(checkDrawing(d).crowdedTracks).toBe(1);
    d.wires[1] = run("B", [100, 55], [300, 55]);
    expect(checkDrawing(d).crowdedTracks).toBe(0);
    d.wires[1] = run("B", [100, 0], [100, 100]);
    expect(checkDrawing(d).crossings).toBe(1);
    d.wires[1] = run("B", [100, 50], [100, 100]); // B ends on A: reads as a connection
    expect(checkDrawing(d).falseConnections).toBe(1);
  });

  it("finds overlapping parts, wires through bodies, labels on wires and broken nets", () => {
    const d = blank();
    d.parts.push(resistor("R1", 100, 100, "A", "B"), resistor("R2", 130, 105, "C", "D"));
    expect(checkDrawing(d).boxOverlaps).toBe(1);
    d.parts.pop();
    d.wires.push(run("X", [90, 110], [90, 200]), run("Y", [50, 105], [200, 105]));
    expect(checkDrawing(d).wiresThroughBodies).toBe(1);
    d.netLabels.push({ net: "X", text: "X", x: 85, y: 150, width: 11, height: 14 });
    expect(checkDrawing(d).labelsTouching).toBe(1);
    const e = blank();
    e.parts.push(resistor("R1", 100, 100, "A", "B"), resistor("R2", 300, 100, "B", "C"));
    e.wires.push(run("B", [160, 110], [200, 110]));
    expect(checkDrawing(e).brokenNets).toBe(1);
  });
});

describe("report-grade drawings", () => {
  const library = ALL_TEST_CIRCUITS.map((c) => ({ name: `library ${c.name}`, record: c.record }));
  const circuits = [...demo, ...LAYOUT_CIRCUITS, ...library, ...generated];

  it.each(circuits.map((c) => [c.name, c.record] as const))(
    "%s: no hard fault in the drawing",
    async (_name, record) => {
      const report = checkDrawing(await laidOut(record));
      expect(report.faults).toEqual([]);
      expect(hardFaults(report)).toBe(0);
    },
  );

  it.each(circuits.map((c) => [c.name, c.record] as const))(
    "%s: line and neutral enter from the left",
    async (_name, record) => {
      const layout = await laidOut(record);
      const supply = layout.terminals.find((t) => t.kind === "supply");
      const roles = new Set(Object.values(record.nets).map((n) => n.role));
      if (!roles.has("line") && !roles.has("neutral")) return;
      expect(supply).toBeDefined();
      for (const p of layout.parts) expect(supply!.x + supply!.width).toBeLessThanOrEqual(p.x);
      for (const pin of supply!.pins) {
        expect(pin.side).toBe("EAST");
        // Its wire leaves the pin to the right.
        const leaves = layout.wires
          .filter((w) => w.net === pin.net)
          .flatMap((w) => w.sections)
          .some((s) => {
            const pts = [s.start, ...s.bends, s.end];
            return pts.some(
              (p, i) =>
                Math.abs(p.x - pin.x) < 0.01 &&
                Math.abs(p.y - pin.y) < 0.01 &&
                [pts[i - 1], pts[i + 1]].some((q) => q && Math.abs(q.y - p.y) < 0.01 && q.x > p.x),
            );
          });
        if (layout.parts.some((p) => p.pins.some((q) => q.net === pin.net)))
          expect(leaves, pin.net).toBe(true);
      }
      const line = supply!.pins.find((p) => p.role === "line");
      const neutral = supply!.pins.find((p) => p.role === "neutral");
      if (line && neutral) expect(neutral.y).toBeGreaterThan(line.y);
    },
  );
});

/** The four distinct pin points of a bridge's diodes, if they form a diamond, as l/t/r/b. */
function diamondOf(diodes: PlacedPart[]) {
  const pts = new Map<string, { x: number; y: number }>();
  for (const d of diodes) for (const p of d.pins) pts.set(`${p.x.toFixed(2)},${p.y.toFixed(2)}`, p);
  const all = [...pts.values()];
  if (all.length !== 4) return null;
  const byX = [...all].sort((a, b) => a.x - b.x);
  const byY = [...all].sort((a, b) => a.y - b.y);
  return { l: byX[0]!, r: byX[3]!, t: byY[0]!, b: byY[3]! };
}

describe("a bridge rectifier is drawn as a diamond", () => {
  const bridged = [
    ["glowmoth-night-light.yaml", ["D1", "D2", "D3", "D4"]],
    ["tockly-wall-clock-supply.yaml", ["D1", "D2", "D3", "D4"]],
  ] as const;
  it.each(bridged)("%s", async (file, refs) => {
    const layout = await laidOut(demo.find((d) => d.name === file)!.record);
    const diodes = layout.parts.filter((p) => (refs as readonly string[]).includes(p.ref));
    expect(diodes).toHaveLength(4);
    const d = diamondOf(diodes);
    expect(d).not.toBeNull();
    const { l, r, t, b } = d!;
    // Left and right corners level, top and bottom corners on one vertical, equal diagonals.
    expect(l.y).toBeCloseTo(r.y, 6);
    expect(t.x).toBeCloseTo(b.x, 6);
    expect(t.x).toBeCloseTo((l.x + r.x) / 2, 6);
    expect(l.y).toBeCloseTo((t.y + b.y) / 2, 6);
    expect(r.x - l.x).toBeCloseTo(b.y - t.y, 6);
    // Every diode runs corner to corner along a side, at 45 degrees.
    for (const diode of diodes) {
      const [p, q] = diode.pins;
      expect(Math.abs(p!.x - q!.x)).toBeCloseTo(Math.abs(p!.y - q!.y), 6);
      expect(Math.abs(p!.x - q!.x)).toBeCloseTo((r.x - l.x) / 2, 6);
    }
    // The two cathodes meeting at the top are the positive output; the anodes meet at the bottom.
    const at = (pt: { x: number; y: number }) =>
      diodes.flatMap((dd) =>
        dd.pins.filter((pp) => Math.abs(pp.x - pt.x) < 0.01 && Math.abs(pp.y - pt.y) < 0.01),
      );
    expect(at(t).map((p) => p.role)).toEqual(["cathode", "cathode"]);
    expect(at(b).map((p) => p.role)).toEqual(["anode", "anode"]);
  });
});

describe("an isolated secondary is drawn apart from the mains side", () => {
  const isolated = [...demo, ...generated].filter((c) => c.record.device.tags.includes("isolated"));
  it.each(isolated.map((c) => [c.name, c.record] as const))("%s", async (_name, record) => {
    const layout = await laidOut(record);
    expect(layout.barriers).toHaveLength(1);
    const b = layout.barriers![0]!;
    const mains = new Set(
      Object.entries(record.nets)
        .filter(([, n]) => n.role === "line" || n.role === "neutral")
        .map(([name]) => name),
    );
    // Every mains wire stays left of the boundary; the output terminal is right of it.
    for (const w of layout.wires.filter((x) => mains.has(x.net)))
      for (const s of w.sections)
        for (const p of [s.start, ...s.bends, s.end]) expect(p.x).toBeLessThanOrEqual(b.x);
    const output = layout.terminals.find((t) => t.kind === "output");
    if (output) expect(output.x).toBeGreaterThan(b.x);
  });
});
