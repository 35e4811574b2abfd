/**
 * A thyristor's or triac's gate network is drawn as a unit beside its device. The networks are
 * the block stage's trigger blocks (`findBlocks`: thyristor-trigger, triac-trigger); the check
 * reads only the finished geometry:
 * - the unit, the smallest rectangle holding the device and every part of its network, holds
 *   no other part's box (nothing of another block sits between the network and the gate);
 * - the device's gate pin lies within GATE_REACH_PX of the network's own rectangle: about one
 *   column of parts plus the gap between columns, so the network stands beside the gate.
 * Run against the layout as it was before the gate groups, nine of the 27 trigger blocks here
 * failed (the fan control's unit held C2, R3, VR1 and VR2; the heater controller's C2 and VR1;
 * a 60-part circuit's network sat 519 px from its gate).
 */
import { describe, expect, it } from "vitest";
import {
  findBlocks,
  layoutSchematic,
  type Box,
  type PlacedPart,
  type SchematicLayout,
  type TeardownRecord,
} from "@teardown/engine";
import { generatedCircuitSet } from "../../support/generated-circuits.js";
import { ALL_TEST_CIRCUITS } from "../../support/circuits/all-test-circuits.js";
import { LAYOUT_CIRCUITS } from "./layout-circuits.js";
import { demoCircuits } from "./circuit-set.js";

/** How far the gate pin may be from the network's rectangle. */
const GATE_REACH_PX = 150;
const EPS = 0.01;

const all = [
  ...demoCircuits(),
  ...LAYOUT_CIRCUITS,
  ...ALL_TEST_CIRCUITS.map((c) => ({ name: `library ${c.name}`, record: c.record })),
  ...generatedCircuitSet(),
];

/** Every trigger block of a record: its device's ref and its network's refs. */
function triggers(record: TeardownRecord): { device: string; network: string[] }[] {
  const kind = new Map(record.parts.map((p) => [p.ref, p.kind]));
  return findBlocks(record)
    .filter((b) => b.kind === "thyristor-trigger" || b.kind === "triac-trigger")
    .map((b) => {
      const device = b.parts.find((r) => kind.get(r) === "thyristor" || kind.get(r) === "triac")!;
      return { device, network: b.parts.filter((r) => r !== device) };
    });
}

function enclosing(boxes: readonly Box[]): Box {
  const x0 = Math.min(...boxes.map((b) => b.x));
  const y0 = Math.min(...boxes.map((b) => b.y));
  const x1 = Math.max(...boxes.map((b) => b.x + b.width));
  const y1 = Math.max(...boxes.map((b) => b.y + b.height));
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

const overlaps = (a: Box, b: Box): boolean =>
  a.x < b.x + b.width - EPS &&
  b.x < a.x + a.width - EPS &&
  a.y < b.y + b.height - EPS &&
  b.y < a.y + a.height - EPS;

/** The measure: other parts inside the unit, and the gate pin's distance from the network. */
function unitMeasure(
  layout: SchematicLayout,
  device: string,
  network: readonly string[],
): { foreign: string[]; gateDistance: number } {
  const byRef = new Map(layout.parts.map((p) => [p.ref, p]));
  const dev = byRef.get(device)!;
  const net = network.map((r) => byRef.get(r)!);
  const unit = enclosing([dev, ...net]);
  const mine = new Set([device, ...network]);
  const foreign = layout.parts
    .filter((p: PlacedPart) => !mine.has(p.ref) && overlaps(p, unit))
    .map((p) => p.ref);
  const gate = dev.pins.find((p) => p.role === "gate")!;
  const box = enclosing(net);
  const dx = Math.max(0, box.x - gate.x, gate.x - (box.x + box.width));
  const dy = Math.max(0, box.y - gate.y, gate.y - (box.y + box.height));
  return { foreign, gateDistance: Math.hypot(dx, dy) };
}

function part(ref: string, x: number, y: number, pins: PlacedPart["pins"] = []): PlacedPart {
  return {
    ref,
    kind: "resistor",
    symbol: "resistor",
    rotation: 0,
    x,
    y,
    width: 60,
    height: 20,
    pins,
    labels: [],
  };
}

describe("the unit measure catches what it claims to", () => {
  it("finds a part inside the unit and a gate far from its network", () => {
    const layout: SchematicLayout = {
      width: 800,
      height: 400,
      parts: [
        part("Q1", 300, 100, [{ role: "gate", net: "G", x: 340, y: 120, side: "SOUTH" }]),
        part("R1", 100, 100),
        part("X9", 200, 100),
      ],
      junctions: [],
      wires: [],
      netLabels: [],
      terminals: [],
    };
    // R1 ends at x = 160; the gate is 180 px to its right, and X9 stands between them.
    expect(unitMeasure(layout, "Q1", ["R1"])).toEqual({ foreign: ["X9"], gateDistance: 180 });
    layout.parts[2] = part("X9", 200, 300);
    expect(unitMeasure(layout, "Q1", ["R1"]).foreign).toEqual([]);
  });
});

describe("a gate network is drawn as a unit beside its thyristor or triac", () => {
  const cases = all.flatMap((c) =>
    triggers(c.record).map((t) => [`${c.name}: ${t.device}`, c.record, t] as const),
  );

  it("the demo records and generated circuits have such blocks to check", () => {
    expect(cases.filter(([name]) => name.includes(".yaml")).length).toBeGreaterThanOrEqual(4);
    expect(cases.filter(([name]) => name.startsWith("generated")).length).toBeGreaterThanOrEqual(
      15,
    );
  });

  it.each(cases)("%s", async (_name, record, { device, network }) => {
    const out = await layoutSchematic(record);
    if (!out.ok) throw new Error(out.message);
    const m = unitMeasure(out.layout, device, network);
    expect(m.foreign).toEqual([]);
    expect(m.gateDistance).toBeLessThanOrEqual(GATE_REACH_PX);
  });
});
