import { describe, expect, it } from "vitest";
import {
  buildCircuitGraph,
  joins,
  neighbourParts,
  netOfPin,
  netsWithRole,
  otherNet,
  partsOnNet,
  pinRoleClass,
} from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { nightLightDropper } from "../../support/circuits/mains-circuits.js";

describe("buildCircuitGraph", () => {
  it("makes one part node per part and one net node per net, joined by one edge per pin", () => {
    const graph = buildCircuitGraph(nightLightDropper());
    expect(graph.parts).toHaveLength(12);
    expect(graph.nets.map((n) => n.name)).toEqual(["A", "B", "K", "L", "L1", "M", "N", "P"]);
    const pinCount = graph.parts.reduce((sum, p) => sum + p.pins.length, 0);
    expect(pinCount).toBe(24);
    expect(graph.nets.reduce((sum, n) => sum + n.pins.length, 0)).toBe(pinCount);
  });

  it("labels each edge with the pin role, and symmetric kinds' pins with one role class", () => {
    const graph = buildCircuitGraph(nightLightDropper());
    const d1 = graph.partByRef.get("D1")!;
    expect(d1.pins.map((e) => [e.role, e.roleClass, e.net])).toEqual([
      ["anode", "anode", "B"],
      ["cathode", "cathode", "P"],
    ]);
    const r1 = graph.partByRef.get("R1")!;
    expect(r1.pins.map((e) => e.roleClass)).toEqual(["end", "end"]);
    const c2 = graph.partByRef.get("C2")!;
    expect(c2.symmetric).toBe(false);
    expect(c2.pins.map((e) => e.roleClass)).toEqual(["plus", "minus"]);
  });

  it("keeps net roles from the record and never reads them from names", () => {
    const rec = record([part("R1", "resistor", ["L", "X"], 10)], {
      X: { role: "line" },
      L: { role: null },
    });
    const graph = buildCircuitGraph(rec);
    expect(netsWithRole(graph, ["line"])).toEqual(["X"]);
    expect(graph.netByName.get("L")!.role).toBeNull();
  });

  it("marks unknown kinds and documentation-only kinds as left out of the simulation", () => {
    const rec = record([
      part("U1", "optocoupler", { p1: "A", p2: "B" }),
      part("J1", "connector", ["A"]),
      part("R1", "resistor", ["A", "B"], 1),
    ]);
    const graph = buildCircuitGraph(rec);
    expect(graph.partByRef.get("U1")).toMatchObject({ known: false, simulated: false });
    expect(graph.partByRef.get("J1")).toMatchObject({ known: true, simulated: false });
    expect(graph.partByRef.get("R1")).toMatchObject({ known: true, simulated: true });
  });

  it("keeps nets declared in `nets` that no pin names", () => {
    const graph = buildCircuitGraph(record([part("R1", "resistor", ["A", "B"], 1)], { SPARE: {} }));
    expect(graph.netByName.get("SPARE")!.pins).toEqual([]);
  });

  it("answers adjacency questions from the edges", () => {
    const graph = buildCircuitGraph(nightLightDropper());
    const r1 = graph.partByRef.get("R1")!;
    expect(otherNet(r1, "L1")).toBe("A");
    expect(otherNet(r1, "P")).toBeNull();
    expect(joins(r1, "A", "L1")).toBe(true);
    expect(netOfPin(graph.partByRef.get("Z1")!, "cathode")).toBe("P");
    expect(partsOnNet(graph, "A").map((p) => p.ref)).toEqual(["R1", "C1", "R2"]);
    expect(neighbourParts(graph, r1).map((p) => p.ref)).toEqual(["F1", "C1", "R2"]);
  });

  it("gives variadic kinds one contact class and unknown kinds their own roles", () => {
    expect(pinRoleClass("connector", false, "p3")).toBe("contact");
    expect(pinRoleClass("optocoupler", false, "p3")).toBe("p3");
    expect(pinRoleClass("capacitor", true, "plus")).toBe("plus");
    expect(pinRoleClass("capacitor", false, "a")).toBe("end");
  });
});
