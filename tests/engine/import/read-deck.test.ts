import { describe, expect, it } from "vitest";
import { readDeck, type InputError, type ParseResult, type TeardownRecord } from "@teardown/engine";

function ok(result: ParseResult): TeardownRecord {
  if (!result.ok) throw new Error(JSON.stringify(result.errors, null, 1));
  return result.record;
}
function errors(result: ParseResult): InputError[] {
  if (result.ok) throw new Error("expected errors");
  return result.errors;
}

const deck = `Plug-in fragrance warmer
* traced from both sides
.supply 230 50
.line L
.neutral N
.accessible CASE
R1 L A 1meg watts=0.25
C1 L A 330n tol=10% volts=310 class=X2
+ marking="334K 310V~"
D1 A P 1N4007 volts=1k
XQ1 P G M thyristor vgt=0.7 igt=50u ih=3m
XT1 P X HV M transformer lp=150u ratio=40
XZ1 M N zener value=5.1
C2 P M 10u polarised=true
XJ1 L N CASE connector
.end
this line is after the end
`;

describe("readDeck", () => {
  const r = ok(readDeck(deck));

  it("takes the first line as the title and reads the supply and net roles", () => {
    expect(r.title).toBe("Plug-in fragrance warmer");
    expect(r.device.rated_supply).toEqual({ vrms: 230, hz: 50 });
    expect(r.nets.L!.role).toBe("line");
    expect(r.nets.N!.role).toBe("neutral");
    expect(r.nets.CASE!.accessible).toBe(true);
  });

  it("reads R, C and D lines with their kind from the first letter", () => {
    expect(r.parts.map((p) => [p.ref, p.kind])).toEqual([
      ["R1", "resistor"],
      ["C1", "capacitor"],
      ["D1", "diode"],
      ["Q1", "thyristor"],
      ["T1", "transformer"],
      ["Z1", "zener"],
      ["C2", "capacitor"],
      ["J1", "connector"],
    ]);
    expect(r.parts[2]).toMatchObject({
      pins: { anode: "A", cathode: "P" },
      marking: "1N4007",
      rating: { volts: 1000 },
    });
  });

  it("reads deck values: meg is mega, and the value text is kept in record notation", () => {
    expect(r.parts[0]).toMatchObject({ value: 1e6, value_text: "1M", rating: { watts: 0.25 } });
    expect(r.parts[1]).toMatchObject({
      value: 3.3e-7,
      tolerance: 0.1,
      rating: { volts: 310, class: "X2" },
      marking: "334K 310V~",
    });
  });

  it("reads X lines: nets, the kind word, then parameters", () => {
    expect(r.parts[3]).toMatchObject({
      pins: { anode: "P", gate: "G", cathode: "M" },
      model: { vgt: 0.7, igt: 50e-6, ih: 3e-3 },
    });
    expect(r.parts[4]!.pins).toEqual({ p1: "P", p2: "X", s1: "HV", s2: "M" });
    expect(r.parts[5]).toMatchObject({ value: 5.1, pins: { anode: "M", cathode: "N" } });
    expect(r.parts[7]!.pins).toEqual({ p1: "L", p2: "N", p3: "CASE" });
  });

  it("puts a polarised capacitor's nets in plus, minus order", () => {
    expect(r.parts[6]).toMatchObject({
      polarised: true,
      pins: { plus: "P", minus: "M" },
      value: 1e-5,
    });
  });

  it("warns about lines after .end", () => {
    const result = readDeck(deck);
    expect(result.ok && result.warnings.map((w) => [w.code, w.line])).toContainEqual([
      "after-end",
      16,
    ]);
  });

  it("reads m and M alike as milli", () => {
    const small = ok(readDeck("t\nR1 A B 2M\nR2 A B 2m\n"));
    expect(small.parts.map((p) => p.value)).toEqual([0.002, 0.002]);
  });
});

describe("readDeck errors", () => {
  it("names the line and column of each bad line, all at once", () => {
    const bad = [
      /* 1 */ "Broken deck",
      /* 2 */ "R1 A B 4x7",
      /* 3 */ "Q1 A B",
      /* 4 */ "C1 A",
      /* 5 */ "XZ1 A B zener value=5uF",
      /* 6 */ "+ volts",
      /* 7 */ ".foo bar",
      /* 8 */ "R1 A B 1k",
      /* 9 */ "XQ1 A B thyristor",
      /* 10 */ ".end",
    ].join("\n");
    expect(errors(readDeck(bad)).map((e) => [e.code, e.line, e.column])).toEqual([
      ["bad-notation", 2, 8],
      ["unknown-element", 3, 1],
      ["bad-element", 4, 1],
      ["wrong-unit", 5, 15],
      ["bad-parameter", 6, 3],
      ["unknown-directive", 7, 1],
      ["duplicate-ref", 8, 1],
      ["pin-count", 9, 5],
    ]);
  });

  it("reports an empty title on line 1", () => {
    expect(errors(readDeck("\nR1 A B 1k\n")).map((e) => [e.path, e.line])).toEqual([["title", 1]]);
  });

  it("never throws on garbage", () => {
    for (const text of [
      "",
      "\u0000\u0001",
      "x\n+\n+\n",
      "t\nX\nR\n.supply\n.line\n",
      "t\n" + "R1 A B 1k\n".repeat(3),
    ]) {
      const result = readDeck(text);
      expect(typeof result.ok).toBe("boolean");
    }
  });
});
