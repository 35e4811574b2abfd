import { describe, expect, it } from "vitest";
import {
  layoutSchematic,
  type Box,
  type PlacedPin,
  type SchematicLayout,
  type TeardownRecord,
} from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { allLayoutCircuits } from "./circuit-set.js";
import { LAYOUT_CIRCUITS } from "./layout-circuits.js";

const EPS = 1e-6;
const circuits = await allLayoutCircuits();

async function laidOut(r: TeardownRecord): Promise<SchematicLayout> {
  const result = await layoutSchematic(r);
  if (!result.ok) throw new Error(`layout failed: ${result.code}: ${result.message}`);
  return result.layout;
}

/** Shared area, strictly: boxes that only touch do not overlap. */
function overlaps(a: Box, b: Box): boolean {
  return (
    a.x < b.x + b.width - EPS &&
    b.x < a.x + a.width - EPS &&
    a.y < b.y + b.height - EPS &&
    b.y < a.y + a.height - EPS
  );
}

function pinOnSide(box: Box, pin: PlacedPin): boolean {
  const withinX = pin.x >= box.x - EPS && pin.x <= box.x + box.width + EPS;
  const withinY = pin.y >= box.y - EPS && pin.y <= box.y + box.height + EPS;
  switch (pin.side) {
    case "WEST":
      return Math.abs(pin.x - box.x) < EPS && withinY;
    case "EAST":
      return Math.abs(pin.x - (box.x + box.width)) < EPS && withinY;
    case "NORTH":
      return Math.abs(pin.y - box.y) < EPS && withinX;
    case "SOUTH":
      return Math.abs(pin.y - (box.y + box.height)) < EPS && withinX;
  }
}

/** How many wire ends a net has, counted from the record: its pins plus one for a terminal. */
function endCount(r: TeardownRecord, net: string): number {
  const pins = r.parts.reduce(
    (n, p) => n + Object.values(p.pins).filter((x) => x === net).length,
    0,
  );
  const role = r.nets[net]?.role ?? null;
  return pins + (role === "line" || role === "neutral" || role === "output" ? 1 : 0);
}

describe.each(circuits)("the layout of $name", ({ record: r }) => {
  it("lays out without error and keeps every part once, with all its pins", async () => {
    const layout = await laidOut(r);
    expect(layout.parts.map((p) => p.ref).sort()).toEqual(r.parts.map((p) => p.ref).sort());
    for (const p of layout.parts) {
      const source = r.parts.find((q) => q.ref === p.ref)!;
      expect(Object.fromEntries(p.pins.map((pin) => [pin.role, pin.net]))).toEqual(source.pins);
    }
  });

  it("never lets two part or terminal boxes overlap", async () => {
    const layout = await laidOut(r);
    const boxes: Box[] = [...layout.parts, ...layout.terminals];
    for (let i = 0; i < boxes.length; i++)
      for (let j = i + 1; j < boxes.length; j++) expect(overlaps(boxes[i]!, boxes[j]!)).toBe(false);
  });

  it("never lets a label cover a part, a terminal or another label", async () => {
    const layout = await laidOut(r);
    const labels: Box[] = [
      ...layout.parts.flatMap((p) => p.labels),
      ...layout.netLabels,
      ...layout.terminals.map((t) => t.caption),
    ];
    const bodies: Box[] = [...layout.parts, ...layout.terminals];
    for (const l of labels) for (const b of bodies) expect(overlaps(l, b)).toBe(false);
    for (let i = 0; i < labels.length; i++)
      for (let j = i + 1; j < labels.length; j++)
        expect(overlaps(labels[i]!, labels[j]!)).toBe(false);
  });

  it("puts every pin on its box's border, on the side it declares", async () => {
    const layout = await laidOut(r);
    for (const owner of [...layout.parts, ...layout.terminals])
      for (const pin of owner.pins) expect(pinOnSide(owner, pin)).toBe(true);
  });

  it("routes every wire section in horizontal and vertical runs only", async () => {
    const layout = await laidOut(r);
    for (const w of layout.wires) {
      for (const s of w.sections) {
        const pts = [s.start, ...s.bends, s.end];
        for (let i = 1; i < pts.length; i++) {
          const a = pts[i - 1]!;
          const b = pts[i]!;
          expect(Math.abs(a.x - b.x) < EPS || Math.abs(a.y - b.y) < EPS).toBe(true);
        }
      }
    }
  });

  it("ends a wire at every pin of a net that has two or more ends", async () => {
    const layout = await laidOut(r);
    const ends = new Map<string, { x: number; y: number }[]>();
    for (const w of layout.wires)
      ends.set(
        w.net,
        w.sections.flatMap((s) => [s.start, s.end]),
      );
    for (const owner of [...layout.parts, ...layout.terminals]) {
      for (const pin of owner.pins) {
        if (endCount(r, pin.net) < 2) continue;
        const hit = (ends.get(pin.net) ?? []).some(
          (e) => Math.abs(e.x - pin.x) < EPS && Math.abs(e.y - pin.y) < EPS,
        );
        expect(hit, `${pin.net} at ${pin.role}`).toBe(true);
      }
    }
  });

  it("keeps the supply entry left of every part and the output right of every part but the loads", async () => {
    const layout = await laidOut(r);
    const supply = layout.terminals.find((t) => t.kind === "supply");
    const hasSupplyNet = Object.values(r.nets).some(
      (n) => n.role === "line" || n.role === "neutral",
    );
    expect(supply !== undefined).toBe(hasSupplyNet);
    if (supply)
      for (const p of layout.parts) expect(supply.x + supply.width).toBeLessThanOrEqual(p.x + EPS);
    const output = layout.terminals.find((t) => t.kind === "output");
    if (output) {
      if (supply) expect(output.x).toBeGreaterThanOrEqual(supply.x + supply.width);
      for (const p of layout.parts.filter((q) => q.kind !== "load"))
        expect(p.x + p.width).toBeLessThanOrEqual(output.x + EPS);
    }
  });

  // Junction dots are checked by the independent drawing checker (drawing-quality.test.ts).

  it("turns a two- or three-pin part with one neutral pin so that pin points down", async () => {
    const layout = await laidOut(r);
    const neutral = new Set(
      Object.entries(r.nets)
        .filter(([, n]) => n.role === "neutral")
        .map(([name]) => name),
    );
    for (const p of layout.parts) {
      const onNeutral = p.pins.filter((pin) => neutral.has(pin.net));
      if (
        onNeutral.length !== 1 ||
        p.pins.length > 3 ||
        p.symbol === "generic" ||
        p.symbol === "connector" ||
        p.symbol === "testpoint" ||
        // A transformer keeps primary left and secondary right; bridge diodes sit on a diamond.
        p.symbol === "transformer" ||
        p.rotation % 90 !== 0
      )
        continue;
      expect(onNeutral[0]!.side, p.ref).toBe("SOUTH");
    }
    // The supply's nets all enter from the left, the neutral below the line.
    for (const t of layout.terminals.filter((q) => q.kind === "supply"))
      for (const pin of t.pins) {
        expect(pin.side).toBe("EAST");
        if (neutral.has(pin.net))
          for (const other of t.pins.filter((q) => !neutral.has(q.net)))
            expect(pin.y).toBeGreaterThan(other.y);
      }
  });

  it("keeps everything inside the drawing's width and height", async () => {
    const layout = await laidOut(r);
    const boxes: Box[] = [
      ...layout.parts,
      ...layout.parts.flatMap((p) => p.labels),
      ...layout.terminals,
      ...layout.netLabels,
    ];
    const points = layout.wires.flatMap((w) =>
      w.sections.flatMap((s) => [s.start, s.end, ...s.bends]),
    );
    for (const b of boxes) {
      expect(b.x).toBeGreaterThanOrEqual(0);
      expect(b.y).toBeGreaterThanOrEqual(0);
      expect(b.x + b.width).toBeLessThanOrEqual(layout.width + EPS);
      expect(b.y + b.height).toBeLessThanOrEqual(layout.height + EPS);
    }
    for (const p of points)
      expect(p.x >= 0 && p.y >= 0 && p.x <= layout.width + EPS && p.y <= layout.height + EPS).toBe(
        true,
      );
  });

  it("gives the same geometry on a second run, and for the parts in another order", async () => {
    const first = await laidOut(r);
    expect(await laidOut(r)).toEqual(first);
    expect(await laidOut({ ...r, parts: [...r.parts].reverse() })).toEqual(first);
  });
});

describe("layoutSchematic on particular circuits", () => {
  it("puts the ozone tube load right of every other part behind the pulse transformer", async () => {
    const layout = await laidOut(LAYOUT_CIRCUITS[1]!.record);
    const load = layout.parts.find((p) => p.kind === "load")!;
    for (const p of layout.parts.filter((q) => q !== load))
      expect(p.x + p.width).toBeLessThanOrEqual(load.x + EPS);
  });

  it("stands a resistor from a net to neutral upright, first pin on top", async () => {
    const layout = await laidOut(
      record([part("R1", "resistor", ["L", "A"]), part("R2", "resistor", ["A", "N"])]),
    );
    const r2 = layout.parts.find((p) => p.ref === "R2")!;
    expect(r2.rotation).toBe(90);
    expect([r2.width, r2.height]).toEqual([20, 60]);
    expect(r2.pins.map((p) => [p.role, p.side])).toEqual([
      ["a", "NORTH"],
      ["b", "SOUTH"],
    ]);
  });

  it("sends the gate of a thyristor whose cathode is on neutral out to the left", async () => {
    const layout = await laidOut(
      record([
        part("R1", "resistor", ["L", "G"]),
        part("Q1", "thyristor", { anode: "L", gate: "G", cathode: "N" }),
      ]),
    );
    const q1 = layout.parts.find((p) => p.ref === "Q1")!;
    expect(q1.rotation).toBe(90);
    expect(Object.fromEntries(q1.pins.map((p) => [p.role, p.side]))).toEqual({
      anode: "NORTH",
      gate: "WEST",
      cathode: "SOUTH",
    });
  });

  it("writes the rated supply on the supply entry", async () => {
    const r = record(
      [part("R1", "resistor", ["L", "N"])],
      {},
      { device: { category: null, rated_supply: { vrms: 120, hz: 60 }, tags: [] } },
    );
    const layout = await laidOut(r);
    expect(layout.terminals[0]!.caption.text).toBe("120 V 60 Hz");
  });

  it("lays out a record with no parts as an empty drawing", async () => {
    const layout = await laidOut(record([]));
    expect(layout.parts).toEqual([]);
    expect(layout.wires).toEqual([]);
    expect(layout.terminals).toEqual([]);
  });

  it("leaves net names off when asked", async () => {
    const result = await layoutSchematic(LAYOUT_CIRCUITS[0]!.record, { labelNets: false });
    expect(result.ok && result.layout.netLabels.length).toBe(0);
  });

  it("names each net without a terminal once, and no net that ends at one", async () => {
    const r = LAYOUT_CIRCUITS[0]!.record;
    const layout = await laidOut(r);
    const atTerminal = new Set(
      Object.entries(r.nets)
        .filter(([, n]) => n.role !== null && n.role !== "earth")
        .map(([name]) => name),
    );
    const expected = [...new Set(r.parts.flatMap((p) => Object.values(p.pins)))]
      .filter((n) => !atTerminal.has(n))
      .sort();
    expect(layout.netLabels.map((l) => l.text).sort()).toEqual(expected);
  });

  it("returns a bad spacing option as an error value naming the option", async () => {
    const result = await layoutSchematic(LAYOUT_CIRCUITS[0]!.record, { nodeSpacingPx: -5 });
    expect(result).toMatchObject({
      ok: false,
      code: "invalid-layout-option",
      where: "nodeSpacingPx",
    });
    const nan = await layoutSchematic(LAYOUT_CIRCUITS[0]!.record, { layerSpacingPx: Number.NaN });
    expect(nan).toMatchObject({
      ok: false,
      code: "invalid-layout-option",
      where: "layerSpacingPx",
    });
  });

  it("spreads parts further apart when the spacing grows", async () => {
    const r = LAYOUT_CIRCUITS[2]!.record;
    const tight = await layoutSchematic(r, { layerSpacingPx: 20 });
    const loose = await layoutSchematic(r, { layerSpacingPx: 120 });
    expect(tight.ok && loose.ok).toBe(true);
    if (tight.ok && loose.ok) expect(loose.layout.width).toBeGreaterThan(tight.layout.width);
  });
});
