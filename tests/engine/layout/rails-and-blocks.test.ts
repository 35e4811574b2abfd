/**
 * The trade's drawing habits, checked on the finished geometry: the neutral as a straight
 * return along the bottom with every part on it hanging down to it, and a voltage divider as
 * an upright pair of resistors whose tap leaves sideways. Expectations are plain geometry read
 * off the layout JSON, not the layout code's own helpers.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import {
  layoutSchematic,
  readCircuitFile,
  type SchematicLayout,
  type TeardownRecord,
} from "@teardown/engine";
import { projectRoot } from "@teardown/db";
import { part, record } from "../../support/record-factory.js";
import { checkDrawing, hardFaults } from "../../support/drawing-check.js";

const RECORDS = path.join(projectRoot(), "seed-demo", "records");

function demo(file: string): TeardownRecord {
  const parsed = readCircuitFile(readFileSync(path.join(RECORDS, file), "utf8"), {
    filename: file,
  });
  if (!parsed.ok) throw new Error(`${file}: ${parsed.errors[0]?.message}`);
  return parsed.record;
}

async function laidOut(record: TeardownRecord): Promise<SchematicLayout> {
  const out = await layoutSchematic(record);
  if (!out.ok) throw new Error(out.message);
  return out.layout;
}

const EPS = 0.01;

/** Horizontal runs of one net as [y, x0, x1]. */
function horizontalRuns(layout: SchematicLayout, net: string): [number, number, number][] {
  const out: [number, number, number][] = [];
  for (const w of layout.wires.filter((x) => x.net === net))
    for (const s of w.sections) {
      const pts = [s.start, ...s.bends, s.end];
      for (let i = 1; i < pts.length; i++) {
        const a = pts[i - 1]!;
        const b = pts[i]!;
        if (Math.abs(a.y - b.y) < EPS && Math.abs(a.x - b.x) > EPS)
          out.push([a.y, Math.min(a.x, b.x), Math.max(a.x, b.x)]);
      }
    }
  return out;
}

describe("the neutral is a straight return along the bottom", () => {
  it.each([
    "dimmbo-lamp-dimmer.yaml",
    "breezel-desk-ionizer.yaml",
    "thermbrook-heater-controller.yaml",
  ])("%s", async (file) => {
    const layout = await laidOut(demo(file));
    const neutralPins = [...layout.parts, ...layout.terminals].flatMap((o) =>
      o.pins.filter((p) => p.net === "N"),
    );
    expect(neutralPins.length).toBeGreaterThanOrEqual(3);
    // The lowest horizontal line of the neutral is unbroken, lies below every part and spans
    // every pin.
    // (The rail is drawn in pieces between the points where the drops join it.)
    const runs = horizontalRuns(layout, "N");
    const y = Math.max(...runs.map((r) => r[0]));
    const rail = runs.filter((r) => Math.abs(r[0] - y) < EPS).sort((a, b) => a[1] - b[1]);
    for (let i = 1; i < rail.length; i++) expect(rail[i]![1]).toBeCloseTo(rail[i - 1]![2], 6);
    const x0 = rail[0]![1];
    const x1 = rail[rail.length - 1]![2];
    for (const p of layout.parts) expect(p.y + p.height).toBeLessThan(y);
    // It is the bottom return: no other net's wire runs below it.
    for (const w of layout.wires.filter((x) => x.net !== "N"))
      for (const s of w.sections)
        for (const pt of [s.start, ...s.bends, s.end])
          expect(pt.y, `${w.net} below the neutral`).toBeLessThan(y);
    for (const pin of neutralPins) {
      expect(pin.x).toBeGreaterThanOrEqual(x0 - 20);
      expect(pin.x).toBeLessThanOrEqual(x1 + 20);
    }
    // In the dimmer nothing stands below a part on the neutral, so each down-facing neutral
    // pin drops straight onto the rail: a vertical wire from the pin to it. (Where a part
    // stands below, as C1 under the ionizer's divider, the lead steps aside instead.)
    if (file !== "dimmbo-lamp-dimmer.yaml") return;
    for (const part of layout.parts)
      for (const pin of part.pins.filter((p) => p.net === "N" && p.side === "SOUTH")) {
        const drops = layout.wires
          .filter((w) => w.net === "N")
          .flatMap((w) => w.sections)
          .some((s) => {
            const pts = [s.start, ...s.bends, s.end];
            return pts.some(
              (a, i) =>
                i > 0 &&
                Math.abs(a.x - pin.x) < EPS &&
                Math.abs(pts[i - 1]!.x - pin.x) < EPS &&
                Math.min(a.y, pts[i - 1]!.y) <= pin.y + EPS &&
                Math.max(a.y, pts[i - 1]!.y) >= y - EPS,
            );
          });
        expect(drops, `${part.ref} drops to the rail`).toBe(true);
      }
  });
});

describe("a voltage divider is an upright pair", () => {
  it("breezel-desk-ionizer: R2 above R3 in one column, the tap leaving to the right", async () => {
    const layout = await laidOut(demo("breezel-desk-ionizer.yaml"));
    const r2 = layout.parts.find((p) => p.ref === "R2")!;
    const r3 = layout.parts.find((p) => p.ref === "R3")!;
    // Both stand upright (taller than wide), centred on one vertical line, one above the other.
    for (const r of [r2, r3]) expect(r.height).toBeGreaterThan(r.width);
    expect(r2.x + r2.width / 2).toBeCloseTo(r3.x + r3.width / 2, 6);
    const [upper, lower] = r2.y < r3.y ? [r2, r3] : [r3, r2];
    expect(upper.y + upper.height).toBeLessThan(lower.y);
    // The tap joins the upper's bottom pin to the lower's top pin, and a wire of the tap runs
    // right from the column.
    const tap = upper.pins.find((p) => p.side === "SOUTH")!.net;
    expect(lower.pins.find((p) => p.side === "NORTH")!.net).toBe(tap);
    const cx = upper.x + upper.width / 2;
    const right = horizontalRuns(layout, tap).some(([, x0, x1]) => x0 <= cx + EPS && x1 > cx + 20);
    expect(right).toBe(true);
  });
});

describe("a voltage multiplier is a regular ladder", () => {
  const centre = (p: { x: number; y: number; width: number; height: number }) => ({
    x: p.x + p.width / 2,
    y: p.y + p.height / 2,
  });

  it("zaptrel-bug-zapper: coupling capacitors on top, DC stack below, diodes in a zigzag between", async () => {
    const layout = await laidOut(demo("zaptrel-bug-zapper.yaml"));
    const at = (ref: string) => layout.parts.find((p) => p.ref === ref)!;
    // The two-stage ladder's rows: C1, C3 (input side) and C2, C4 (from the neutral to HV).
    const [c1, c3, c2, c4] = ["C1", "C3", "C2", "C4"].map((r) => centre(at(r)));
    expect(c1!.y).toBeCloseTo(c3!.y, 6);
    expect(c2!.y).toBeCloseTo(c4!.y, 6);
    expect(c2!.y).toBeGreaterThan(c1!.y);
    // Every diode stands upright between the rows, all at one height, evenly spaced.
    const diodes = ["D1", "D2", "D3", "D4"].map(at);
    for (const d of diodes) {
      expect(d.height).toBeGreaterThan(d.width);
      for (const pin of d.pins) {
        expect(pin.y).toBeGreaterThan(c1!.y);
        expect(pin.y).toBeLessThan(c2!.y);
      }
    }
    const xs = diodes.map((d) => centre(d).x);
    const ys = diodes.map((d) => centre(d).y);
    for (const y of ys) expect(y).toBeCloseTo(ys[0]!, 6);
    for (let i = 2; i < xs.length; i++) expect(xs[i]! - xs[i - 1]!).toBeCloseTo(xs[1]! - xs[0]!, 6);
    // The zigzag: each capacitor in the gap between two diodes, top and bottom in turn.
    const order = ["C1", "D1", "C2", "D2", "C3", "D3", "C4", "D4"].map((r) => centre(at(r)).x);
    for (let i = 1; i < order.length; i++) expect(order[i]).toBeGreaterThan(order[i - 1]!);
    // Up diodes (anode on the bottom row's side) alternate with down ones.
    const anodeBelow = diodes.map((d) => {
      const anode = d.pins.find((p) => p.role === "anode")!;
      const cathode = d.pins.find((p) => p.role === "cathode")!;
      return anode.y > cathode.y;
    });
    expect(anodeBelow).toEqual([true, false, true, false]);
  });
});

describe("a negative three-stage multiplier, and a ladder with a tapped node", () => {
  /** A k-stage ladder with every diode reversed: top nodes T0..Tk, bottom nodes N, B1..Bk. */
  function negativeLadder(stages: number, tap: boolean) {
    const t = (i: number) => (i === 0 ? "IN" : `T${i}`);
    const b = (i: number) => (i === 0 ? "N" : i === stages ? "OUT" : `B${i}`);
    const parts = [part("F1", "fuse", ["L", "IN"], 1, { value_text: "1A" })];
    for (let i = 1; i <= stages; i++)
      parts.push(
        part(`C${2 * i - 1}`, "capacitor", [t(i - 1), t(i)], 1e-8, { value_text: "10n" }),
        part(`D${2 * i - 1}`, "diode", { cathode: b(i - 1), anode: t(i) }),
        part(`D${2 * i}`, "diode", { cathode: t(i), anode: b(i) }),
        part(`C${2 * i}`, "capacitor", [b(i - 1), b(i)], 1e-8, { value_text: "10n" }),
      );
    parts.push(part("R1", "resistor", ["OUT", "N"], 1e8, { value_text: "100M" }));
    // A part on a node inside the ladder: that node can no longer be the ladder's own.
    if (tap) parts.push(part("R9", "resistor", ["T2", "N"], 1e6, { value_text: "1M" }));
    return record(parts, { OUT: { role: "output" } });
  }

  it("draws three stages of reversed diodes as a ladder: upright, level, evenly spaced", async () => {
    const layout = await laidOut(negativeLadder(3, false));
    expect(hardFaults(checkDrawing(layout))).toBe(0);
    const at = (ref: string) => layout.parts.find((p) => p.ref === ref)!;
    const diodes = ["D1", "D2", "D3", "D4", "D5", "D6"].map(at);
    const mid = diodes.map((d) => ({ x: d.x + d.width / 2, y: d.y + d.height / 2 }));
    for (const d of diodes) expect(d.height).toBeGreaterThan(d.width);
    for (const m of mid) expect(m.y).toBeCloseTo(mid[0]!.y, 6);
    for (let i = 2; i < mid.length; i++)
      expect(mid[i]!.x - mid[i - 1]!.x).toBeCloseTo(mid[1]!.x - mid[0]!.x, 6);
    // Reversed: the first diode's cathode is on the bottom row (the neutral), its anode above.
    const d1 = diodes[0]!;
    const cathode = d1.pins.find((p) => p.role === "cathode")!;
    const anode = d1.pins.find((p) => p.role === "anode")!;
    expect(cathode.y).toBeGreaterThan(anode.y);
  });

  it("keeps a node another part taps out of the ladder: only the stage before it is drawn so", async () => {
    const layout = await laidOut(negativeLadder(3, true));
    expect(hardFaults(checkDrawing(layout))).toBe(0);
    // T2 is tapped, so at most the first stage could form a ladder, and one stage is too few:
    // the diodes are left to the general layout, which draws them lying down.
    const lying = ["D1", "D2", "D3", "D4", "D5", "D6"]
      .map((r) => layout.parts.find((p) => p.ref === r)!)
      .filter((d) => d.width > d.height);
    expect(lying.length).toBeGreaterThan(0);
  });
});

describe("a rectifier output with only two ends is a plain wire, not a rail", () => {
  it("breezel-desk-ionizer: D1 to R1 (net P) is one straight run between the two pins", async () => {
    const layout = await laidOut(demo("breezel-desk-ionizer.yaml"));
    const pins = layout.parts.flatMap((p) => p.pins.filter((pin) => pin.net === "P"));
    expect(pins).toHaveLength(2);
    const sections = layout.wires.filter((w) => w.net === "P").flatMap((w) => w.sections);
    expect(sections).toHaveLength(1);
    expect(sections[0]!.bends).toHaveLength(0);
    // The wire is as long as the gap between the pins: no climb to the top of the drawing.
    const length =
      Math.abs(sections[0]!.end.x - sections[0]!.start.x) +
      Math.abs(sections[0]!.end.y - sections[0]!.start.y);
    expect(length).toBeCloseTo(
      Math.abs(pins[0]!.x - pins[1]!.x) + Math.abs(pins[0]!.y - pins[1]!.y),
      6,
    );
  });
});
