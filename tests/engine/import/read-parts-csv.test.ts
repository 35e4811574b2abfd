import { describe, expect, it } from "vitest";
import {
  readPartsCsv,
  type InputError,
  type ParseResult,
  type TeardownRecord,
} from "@teardown/engine";

function ok(result: ParseResult): TeardownRecord {
  if (!result.ok) throw new Error(JSON.stringify(result.errors, null, 1));
  return result.record;
}
function errors(result: ParseResult): InputError[] {
  if (result.ok) throw new Error("expected errors");
  return result.errors;
}

const csv = `# title: Night light, batch 3
# supply: 120 60
# line: L
# neutral: N
ref,kind,value,pins,rating,marking,model
C1,capacitor,330n,"a=L; b=A","310V X2","334K, 310V~",
R1,resistor,4k7,L A,0.25W,,
D1,diode,,anode=A cathode=N,volts=1000 amps=1,1N4007,
Q1,thyristor,,anode=A gate=G cathode=N,,,vgt=0.7 igt=50u
`;

describe("readPartsCsv", () => {
  const r = ok(readPartsCsv(csv, { filename: "night-light.csv" }));

  it("reads the title, supply and net roles from the # lines", () => {
    expect(r.title).toBe("Night light, batch 3");
    expect(r.device.rated_supply).toEqual({ vrms: 120, hz: 60 });
    expect([r.nets.L!.role, r.nets.N!.role]).toEqual(["line", "neutral"]);
  });

  it("reads pins as role=net or as nets in the kind's order, and quoted fields with commas", () => {
    expect(r.parts[0]).toMatchObject({
      ref: "C1",
      value: 3.3e-7,
      pins: { a: "L", b: "A" },
      marking: "334K, 310V~",
    });
    expect(r.parts[1]).toMatchObject({ ref: "R1", value: 4700, pins: { a: "L", b: "A" } });
  });

  it("reads ratings by unit or by key, and model parameters", () => {
    expect(r.parts[0]!.rating).toEqual({ volts: 310, class: "X2" });
    expect(r.parts[1]!.rating).toEqual({ watts: 0.25 });
    expect(r.parts[2]!.rating).toEqual({ volts: 1000, amps: 1 });
    expect(r.parts[3]!.model).toEqual({ vgt: 0.7, igt: 50e-6 });
  });

  it("takes the title from the file name when there is no # title line", () => {
    const plain = ok(
      readPartsCsv("ref,kind,value,pins\nR1,resistor,1k,A B\n", {
        filename: "dir/kettle-base.csv",
      }),
    );
    expect(plain.title).toBe("kettle-base");
  });
});

describe("readPartsCsv errors", () => {
  it("names the source line of each bad row", () => {
    const bad = [
      /* 1 */ "ref,kind,value,pins,rating",
      /* 2 */ "R1,resistor,4x7,A B,",
      /* 3 */ "R2,resistor,1k,A,",
      /* 4 */ "C1,capacitor,1u,a=A B,",
      /* 5 */ "C2,capacitor,1u,A B,12",
      /* 6 */ "R1,resistor,1k,A B,",
      /* 7 */ "only,three,fields",
    ].join("\n");
    expect(errors(readPartsCsv(bad)).map((e) => [e.code, e.line])).toEqual([
      ["bad-notation", 2],
      ["pin-count", 3],
      ["bad-pins", 4],
      ["bad-rating", 5],
      ["duplicate-ref", 6],
      ["csv-field-count", 7],
    ]);
  });

  it("needs the ref, kind and pins columns", () => {
    expect(errors(readPartsCsv("ref,value\nR1,1k\n")).map((e) => [e.code, e.line])).toEqual([
      ["csv-missing-column", 1],
    ]);
  });

  it("reports an unclosed quote at its line", () => {
    expect(
      errors(readPartsCsv('ref,kind,pins\nR1,resistor,"A B\n')).map((e) => [e.code, e.line]),
    ).toEqual([["csv-syntax", 2]]);
  });
});
