import { describe, expect, it } from "vitest";
import { BLOCK_KINDS, findBlocks, type Block } from "@teardown/engine";
import { ALL_TEST_CIRCUITS, testCircuit } from "../../support/circuits/all-test-circuits.js";
import { part, record } from "../../support/record-factory.js";

const BRIDGE = ["D1", "D2", "D3", "D4"];

/** The exact block list each hand-made circuit must give (worked out by hand from its netlist). */
const EXPECTED: Record<string, Block[]> = {
  "night-light-dropper": [
    { kind: "fuse", parts: ["F1"] },
    { kind: "surge-limiter", parts: ["R1"] },
    { kind: "capacitive-dropper", parts: ["C1", "R1", "R2"] },
    { kind: "bleeder", parts: ["C1", "R2"] },
    { kind: "bridge-rectifier", parts: BRIDGE },
    { kind: "smoothing-capacitor", parts: ["C2"] },
    { kind: "zener-shunt-regulator", parts: ["Z1"] },
  ],
  "thyristor-igniter": [
    { kind: "half-wave-rectifier", parts: ["D1"] },
    { kind: "voltage-divider", parts: ["R2", "R3"] },
    { kind: "thyristor-trigger", parts: ["Q1", "R2", "R3"] },
    { kind: "pulse-transformer", parts: ["C1", "Q1", "T1"] },
  ],
  "triac-dimmer": [
    { kind: "fuse", parts: ["F1"] },
    { kind: "triac-trigger", parts: ["C1", "DB1", "R1", "TR1"] },
  ],
  "half-wave-resistive": [
    { kind: "surge-limiter", parts: ["R1"] },
    { kind: "half-wave-rectifier", parts: ["D1"] },
    { kind: "smoothing-capacitor", parts: ["C1"] },
    { kind: "zener-shunt-regulator", parts: ["R2", "Z1"] },
  ],
  "fused-transformer-supply": [
    { kind: "fuse", parts: ["F1"] },
    { kind: "bridge-rectifier", parts: BRIDGE },
    { kind: "smoothing-capacitor", parts: ["C1"] },
    { kind: "voltage-divider", parts: ["R1", "R2"] },
  ],
  "varistor-protected-input": [
    { kind: "fuse", parts: ["F1"] },
    { kind: "surge-limiter", parts: ["RV1"] },
    { kind: "bleeder", parts: ["CX", "RX"] },
    { kind: "half-wave-rectifier", parts: ["D1"] },
    { kind: "smoothing-capacitor", parts: ["C1"] },
  ],
  "half-wave-dropper": [
    { kind: "surge-limiter", parts: ["R1"] },
    { kind: "capacitive-dropper", parts: ["C1", "R1", "R2"] },
    { kind: "bleeder", parts: ["C1", "R2"] },
    { kind: "half-wave-rectifier", parts: ["D1"] },
    { kind: "smoothing-capacitor", parts: ["C2"] },
    { kind: "zener-shunt-regulator", parts: ["Z1"] },
  ],
  "neutral-side-dropper": [
    { kind: "capacitive-dropper", parts: ["C1", "R1"] },
    { kind: "bleeder", parts: ["C1", "R1"] },
    { kind: "bridge-rectifier", parts: BRIDGE },
    { kind: "smoothing-capacitor", parts: ["C2"] },
  ],
  "thyristor-rc-heater": [
    { kind: "bridge-rectifier", parts: BRIDGE },
    { kind: "thyristor-trigger", parts: ["C1", "Q1", "R1", "R2"] },
  ],
  // The diode across the LED the other way round protects it; it rectifies nothing.
  "resistive-led-indicator": [{ kind: "reverse-protection", parts: ["D1", "LED1"] }],
  "capacitive-led-indicator": [
    { kind: "capacitive-dropper", parts: ["C1", "R1"] },
    { kind: "bleeder", parts: ["C1", "R1"] },
    { kind: "reverse-protection", parts: ["D1", "LED1"] },
  ],
  // Near misses: none of these may show the block it imitates.
  "two-diodes-in-series": [
    { kind: "half-wave-rectifier", parts: ["D1", "D2"] },
    { kind: "smoothing-capacitor", parts: ["C1"] },
  ],
  "capacitor-across-supply": [{ kind: "fuse", parts: ["F1"] }],
  "divider-feeding-nothing": [
    { kind: "half-wave-rectifier", parts: ["D1"] },
    { kind: "smoothing-capacitor", parts: ["C1"] },
  ],
  "resistor-across-supply": [{ kind: "fuse", parts: ["F1"] }],
  // Each diode still rectifies one half-cycle on its own; what matters is that no bridge is seen.
  "bridge-with-reversed-diode": [
    { kind: "half-wave-rectifier", parts: ["D1"] },
    { kind: "half-wave-rectifier", parts: ["D2"] },
    { kind: "half-wave-rectifier", parts: ["D3"] },
    { kind: "half-wave-rectifier", parts: ["D4"] },
  ],
  "rc-snubber-across-supply": [],
};

describe("findBlocks on the hand-made circuits", () => {
  for (const c of ALL_TEST_CIRCUITS) {
    it(`finds exactly the expected blocks in ${c.name}`, () => {
      expect(findBlocks(c.record)).toEqual(EXPECTED[c.name]);
    });
  }

  it("has an expectation for every test circuit, and the working ones cover every block kind", () => {
    expect(Object.keys(EXPECTED).sort()).toEqual(ALL_TEST_CIRCUITS.map((c) => c.name).sort());
    const covered = new Set(
      ALL_TEST_CIRCUITS.filter((c) => !c.nearMiss).flatMap((c) =>
        EXPECTED[c.name]!.map((b) => b.kind),
      ),
    );
    expect([...covered].sort()).toEqual([...BLOCK_KINDS].sort());
  });
});

describe("findBlocks near misses", () => {
  const kinds = (name: string): string[] => findBlocks(testCircuit(name)).map((b) => b.kind);

  it("sees no bridge in two diodes in series", () => {
    expect(kinds("two-diodes-in-series")).not.toContain("bridge-rectifier");
  });

  it("sees no dropper and no bleeder in a capacitor across the supply", () => {
    expect(kinds("capacitor-across-supply")).not.toContain("capacitive-dropper");
    expect(kinds("capacitor-across-supply")).not.toContain("bleeder");
  });

  it("sees no divider and no trigger where a divider feeds nothing and a gate has one resistor", () => {
    expect(kinds("divider-feeding-nothing")).not.toContain("voltage-divider");
    expect(kinds("divider-feeding-nothing")).not.toContain("thyristor-trigger");
  });

  it("sees no bleeder in a resistor across the supply with no capacitor beside it", () => {
    expect(kinds("resistor-across-supply")).not.toContain("bleeder");
  });

  it("sees no bridge when one of its diodes is reversed", () => {
    expect(kinds("bridge-with-reversed-diode")).not.toContain("bridge-rectifier");
  });

  it("sees no dropper in a series RC across the supply, whichever end the capacitor is on", () => {
    expect(findBlocks(testCircuit("rc-snubber-across-supply"))).toEqual([]);
    const flipped = record(
      [
        part("C1", "capacitor", ["L", "X"], 100e-9),
        part("R1", "resistor", ["X", "N"], 100),
        part("LOAD1", "load", ["L", "N"]),
      ],
      { L: { role: "line" }, N: { role: "neutral" } },
    );
    expect(findBlocks(flipped)).toEqual([]);
  });

  it("turns a bridge into a bridge again when the reversed diode is put right", () => {
    const rec = testCircuit("bridge-with-reversed-diode");
    const d4 = rec.parts.find((p) => p.ref === "D4")!;
    d4.pins = { anode: "M", cathode: "N" };
    expect(findBlocks(rec).map((b) => b.kind)).toEqual(["bridge-rectifier", "smoothing-capacitor"]);
  });
});

describe("findBlocks reads roles, not names", () => {
  it("finds the dropper on whichever net is declared line, whatever the nets are called", () => {
    const rec = record(
      [
        part("X7", "capacitor", ["MAINS_A", "Q"], 330e-9),
        part("Y3", "led", { anode: "Q", cathode: "MAINS_B" }),
        part("Y4", "diode", { anode: "MAINS_B", cathode: "Q" }),
      ],
      { MAINS_A: { role: "line" }, MAINS_B: { role: "neutral" } },
    );
    expect(findBlocks(rec)).toEqual([
      { kind: "capacitive-dropper", parts: ["X7"] },
      { kind: "reverse-protection", parts: ["Y3", "Y4"] },
    ]);
  });

  it("does not let a lamp across the fused mains hide the dropper behind it", () => {
    // A shunt on the mains side (here a lamp) is passed over; after the dropper it would be a load.
    const rec = record(
      [
        part("F1", "fuse", ["L", "L1"], 1),
        part("LAMP1", "load", ["L1", "N"]),
        part("C1", "capacitor", ["L1", "A"], 220e-9),
        part("LED1", "led", { anode: "A", cathode: "N" }),
        part("D1", "diode", { anode: "N", cathode: "A" }),
      ],
      { L: { role: "line" }, N: { role: "neutral" } },
    );
    expect(findBlocks(rec)).toEqual([
      { kind: "fuse", parts: ["F1"] },
      { kind: "capacitive-dropper", parts: ["C1"] },
      { kind: "reverse-protection", parts: ["D1", "LED1"] },
    ]);
  });

  it("finds no dropper when the same circuit declares no supply roles", () => {
    const rec = record([
      part("C1", "capacitor", ["A", "Q"], 330e-9),
      part("LED1", "led", { anode: "Q", cathode: "B" }),
      part("D1", "diode", { anode: "B", cathode: "Q" }),
    ]);
    // reverse protection needs no supply: it is read off the LED and the diode alone
    expect(findBlocks(rec)).toEqual([{ kind: "reverse-protection", parts: ["D1", "LED1"] }]);
  });

  it("counts a diode string's members once and a bridge's diodes never as half-wave rectifiers", () => {
    const all = ALL_TEST_CIRCUITS.flatMap((c) =>
      findBlocks(c.record).map((b) => ({ c: c.name, b })),
    );
    for (const { c, b } of all.filter((x) => x.b.kind === "bridge-rectifier")) {
      const halfWaveParts = findBlocks(testCircuit(c))
        .filter((x) => x.kind === "half-wave-rectifier")
        .flatMap((x) => x.parts);
      expect(halfWaveParts.filter((p) => b.parts.includes(p))).toEqual([]);
    }
  });
});
