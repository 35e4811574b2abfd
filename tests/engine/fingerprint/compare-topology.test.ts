import { describe, expect, it } from "vitest";
import { compareTopology } from "@teardown/engine";
import { part, record } from "../../support/record-factory.js";
import { testCircuit } from "../../support/circuits/all-test-circuits.js";
import { namesOf, renameRecord } from "../../support/circuits/rename-record.js";

describe("compareTopology", () => {
  it("pairs a record with its renamed copy by structure, finds the changed value and the added part", () => {
    const a = testCircuit("night-light-dropper");
    const { refs, nets } = namesOf(a);
    const refOf = (r: string): string => `X${refs.length - refs.indexOf(r)}`;
    const netOf = (n: string): string => `net${nets.indexOf(n)}`;
    const b = renameRecord(a, refOf, netOf, [...a.parts.keys()].reverse());
    b.parts.find((p) => p.ref === refOf("R1"))!.value = 220;
    b.parts.push(part("EXTRA", "resistor", [netOf("P"), netOf("M")], 10e3));

    const result = compareTopology(a, b);
    expect(result.pairs).toEqual(refs.map((r) => ({ a: r, b: refOf(r), by: "structure" })));
    expect(result.valueDiffs).toEqual([
      { a: "R1", b: refOf("R1"), kind: "resistor", valueA: 100, valueB: 220 },
    ]);
    expect(result.onlyInA).toEqual([]);
    expect(result.onlyInB).toEqual(["EXTRA"]);
  });

  it("pairs what is left by equal value, then by kind, and lists the rest", () => {
    const a = record(
      [
        part("R1", "resistor", ["L", "N"], 1e3),
        part("C1", "capacitor", ["L", "N"], 1e-6),
        part("F1", "fuse", ["L", "N"], 1),
      ],
      { L: { role: "line" }, N: { role: "neutral" } },
    );
    // Same kinds, but on plain nets: no structure agrees, so only values and kinds can pair them.
    const b = record(
      [
        part("RA", "resistor", ["X", "Y"], 1e3),
        part("CA", "capacitor", ["X", "Y"], 2.2e-6),
        part("D1", "diode", { anode: "X", cathode: "Y" }),
      ],
      {
        X: { role: null },
        Y: { role: null },
      },
    );
    const result = compareTopology(a, b);
    expect(result.pairs).toEqual([
      { a: "C1", b: "CA", by: "kind" },
      { a: "R1", b: "RA", by: "value" },
    ]);
    expect(result.valueDiffs).toEqual([
      { a: "C1", b: "CA", kind: "capacitor", valueA: 1e-6, valueB: 2.2e-6 },
    ]);
    expect(result.onlyInA).toEqual(["F1"]);
    expect(result.onlyInB).toEqual(["D1"]);
  });

  it("pairs alike parts by the closest value once structure cannot tell them apart", () => {
    // Two resistors in parallel on each side: structure sees two alike parts; values decide.
    const mains = { L: { role: "line" as const }, N: { role: "neutral" as const } };
    const a = record(
      [part("R1", "resistor", ["L", "N"], 100), part("R2", "resistor", ["L", "N"], 1e6)],
      mains,
    );
    const b = record(
      [part("RA", "resistor", ["L", "N"], 1.1e6), part("RB", "resistor", ["L", "N"], 120)],
      mains,
    );
    const result = compareTopology(a, b);
    expect(result.pairs).toEqual([
      { a: "R1", b: "RB", by: "structure" },
      { a: "R2", b: "RA", by: "structure" },
    ]);
  });

  it("pairs the common core of two dropper supplies even when the dropper moves to the other leg", () => {
    const a = testCircuit("night-light-dropper");
    const b = testCircuit("neutral-side-dropper");
    const result = compareTopology(a, b);
    expect(compareTopology(a, b)).toEqual(result);
    // By hand: the dropper C1 and its bleeder feed net B in both; the diodes on B (night light
    // D1, D3) answer to the neutral-side supply's D2, D4, and those on the bare mains leg
    // (D2, D4) to D1, D3. The reservoirs sit on the bridge outputs.
    expect(result.pairs).toEqual([
      { a: "C1", b: "C1", by: "structure" },
      { a: "C2", b: "C2", by: "structure" },
      { a: "D1", b: "D2", by: "structure" },
      { a: "D2", b: "D1", by: "structure" },
      { a: "D3", b: "D4", by: "structure" },
      { a: "D4", b: "D3", by: "structure" },
      { a: "R2", b: "R1", by: "structure" },
    ]);
    expect(result.valueDiffs.map((d) => [d.a, d.b])).toEqual([
      ["C1", "C1"],
      ["C2", "C2"],
    ]);
    expect(result.onlyInA).toEqual(["F1", "LED1", "R1", "R3", "Z1"]);
    expect(result.onlyInB).toEqual(["LOAD1"]);
  });

  it("gives the same pairing, through the renaming, when the second record is renamed and shuffled", () => {
    const a = testCircuit("half-wave-dropper");
    const b = testCircuit("half-wave-resistive");
    const { refs, nets } = namesOf(b);
    const refOf = (r: string): string => `Q${refs.indexOf(r) * 3 + 1}`;
    const netOf = (n: string): string => `w${nets.length - nets.indexOf(n)}`;
    const renamed = renameRecord(b, refOf, netOf, [...b.parts.keys()].reverse());
    const plain = compareTopology(a, b);
    const moved = compareTopology(a, renamed);
    expect(moved.pairs).toEqual(plain.pairs.map((p) => ({ ...p, b: refOf(p.b) })));
    expect(moved.onlyInA).toEqual(plain.onlyInA);
    // The resistive supply has no dropper capacitor: the dropper's C1 is the one part left over.
    expect(plain.onlyInA).toEqual(["C1"]);
    expect(plain.pairs.every((p) => p.by === "structure")).toBe(true);
  });
});
