import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  fingerprint,
  fingerprintSimilarity,
  valueFeatures,
  type TeardownRecord,
} from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { ALL_TEST_CIRCUITS, testCircuit } from "../../support/circuits/all-test-circuits.js";
import { namesOf, renameRecord } from "../../support/circuits/rename-record.js";

const MAINS = { L: { role: "line" as const }, N: { role: "neutral" as const } };
const TWO_PIN_KINDS = [
  "resistor",
  "capacitor",
  "inductor",
  "diode",
  "zener",
  "led",
  "fuse",
  "varistor",
  "load",
  "switch",
];

function clone(rec: TeardownRecord): TeardownRecord {
  return structuredClone(rec);
}

describe("fingerprint", () => {
  it("is a sorted set of distinct signed 32-bit integers", () => {
    for (const c of ALL_TEST_CIRCUITS) {
      const f = fingerprint(c.record);
      expect([...f].sort((a, b) => a - b)).toEqual(f);
      expect(new Set(f).size).toBe(f.length);
      for (const x of f) expect(x === (x | 0)).toBe(true);
    }
  });

  it("has 4 labels per distinct node class and round: 12 for one resistor across line and neutral", () => {
    // Three nodes (part, line net, neutral net) that stay distinguishable through the initial
    // labelling and 3 rounds: 3 x 4 = 12 labels.
    expect(fingerprint(record([part("R1", "resistor", ["L", "N"], 100)], MAINS))).toHaveLength(12);
    // Two equal resistors in parallel add no new label.
    expect(
      fingerprint(
        record(
          [part("R1", "resistor", ["L", "N"], 100), part("R2", "resistor", ["L", "N"], 150)],
          MAINS,
        ),
      ),
    ).toHaveLength(12);
    // Between two plain nets, the two nets look alike: 2 classes x 4 = 8 labels.
    expect(fingerprint(record([part("R1", "resistor", ["A", "B"], 100)]))).toHaveLength(8);
  });

  it("does not change when a resistor's two ends are swapped", () => {
    const rec = testCircuit("night-light-dropper");
    const swapped = clone(rec);
    const r1 = swapped.parts.find((p) => p.ref === "R1")!;
    r1.pins = { a: r1.pins["b"]!, b: r1.pins["a"]! };
    expect(fingerprint(swapped)).toEqual(fingerprint(rec));
  });

  it("changes when a diode is turned round or the line role moves, but not when a value moves to another decade", () => {
    const rec = testCircuit("night-light-dropper");
    const base = fingerprint(rec);
    const turned = clone(rec);
    const d1 = turned.parts.find((p) => p.ref === "D1")!;
    d1.pins = { anode: d1.pins["cathode"]!, cathode: d1.pins["anode"]! };
    expect(fingerprint(turned)).not.toEqual(base);
    // Values are left out of the topology fingerprint; only the value features see a decade.
    const decade = clone(rec);
    decade.parts.find((p) => p.ref === "C1")!.value = 4.7e-6;
    expect(fingerprint(decade)).toEqual(base);
    expect(valueFeatures(decade)).not.toEqual(valueFeatures(rec));
    const sameDecade = clone(rec);
    sameDecade.parts.find((p) => p.ref === "C1")!.value = 680e-9;
    expect(valueFeatures(sameDecade)).toEqual(valueFeatures(rec));
    const roles = clone(rec);
    roles.nets["L"]!.role = null;
    roles.nets["L1"]!.role = "line";
    expect(fingerprint(roles)).not.toEqual(base);
  });

  it("does not depend on refs, net names or part order (property)", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...ALL_TEST_CIRCUITS),
        fc.integer({ min: 1, max: 10_000 }),
        (circuit, salt) => {
          const { refs, nets } = namesOf(circuit.record);
          const refMap = new Map(refs.map((r, i) => [r, `Z${salt}x${refs.length - i}`]));
          const netMap = new Map(nets.map((n, i) => [n, `n${(salt * 31 + i * 17) % 9973}_${i}`]));
          const order = circuit.record.parts
            .map((_, i) => i)
            .sort((a, b) => ((a * salt) % 13) - ((b * salt) % 13) || b - a);
          const renamed = renameRecord(
            circuit.record,
            (r) => refMap.get(r)!,
            (n) => netMap.get(n)!,
            order,
          );
          expect(fingerprint(renamed)).toEqual(fingerprint(circuit.record));
        },
      ),
      { seed: 77, numRuns: 150 },
    );
  });

  it("changes when one part's kind changes (property)", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...ALL_TEST_CIRCUITS),
        fc.nat(),
        fc.constantFrom(...TWO_PIN_KINDS),
        (circuit, pick, kind) => {
          const twoPin = circuit.record.parts.filter(
            (p) => Object.keys(p.pins).length === 2 && p.kind !== kind && p.kind !== "connector",
          );
          fc.pre(twoPin.length > 0);
          const target = twoPin[pick % twoPin.length]!;
          const changed = clone(circuit.record);
          changed.parts.find((p) => p.ref === target.ref)!.kind = kind;
          expect(fingerprint(changed)).not.toEqual(fingerprint(circuit.record));
        },
      ),
      { seed: 4242, numRuns: 200 },
    );
  });

  it("changes when one connection moves to another net (property)", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...ALL_TEST_CIRCUITS),
        fc.nat(),
        fc.nat(),
        fc.nat(),
        (circuit, partPick, pinPick, netPick) => {
          const rec = clone(circuit.record);
          const p = rec.parts[partPick % rec.parts.length]!;
          const roles = Object.keys(p.pins);
          const role = roles[pinPick % roles.length]!;
          const others = Object.keys(rec.nets).filter((n) => n !== p.pins[role]);
          const to = [...others, "FRESH"][netPick % (others.length + 1)]!;
          p.pins[role] = to;
          rec.nets[to] ??= { role: null, accessible: false, note: null };
          expect(fingerprint(rec)).not.toEqual(fingerprint(circuit.record));
        },
      ),
      { seed: 99, numRuns: 300 },
    );
  });
});

describe("fingerprintSimilarity", () => {
  it("is 1 for a circuit and its renamed copy and lower for a different circuit", () => {
    const a = fingerprint(testCircuit("night-light-dropper"));
    expect(fingerprintSimilarity(a, a)).toBe(1);
    const near = testCircuit("night-light-dropper");
    near.parts.push(part("R9", "resistor", ["P", "M"], 10e3));
    const far = fingerprint(testCircuit("triac-dimmer"));
    const sNear = fingerprintSimilarity(a, fingerprint(near));
    expect(sNear).toBeLessThan(1);
    expect(sNear).toBeGreaterThan(fingerprintSimilarity(a, far));
  });

  it("is the Jaccard index by hand for small sets", () => {
    expect(fingerprintSimilarity([1, 2, 3], [2, 3, 4])).toBeCloseTo(2 / 4, 12);
    expect(fingerprintSimilarity([], [])).toBe(1);
  });
});
