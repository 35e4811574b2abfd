import { describe, expect, it } from "vitest";
import { parseValue, parseTolerance, parseUncertainty, percentText } from "@teardown/engine";

const valueOf = (
  text: string | number,
  unit = "any",
  notation: "record" | "deck" = "record",
): number | string => {
  const r = parseValue(text, { unit, notation });
  return r.ok ? r.value : r.code;
};

describe("parseValue", () => {
  it("reads SI prefixes p n u µ m k M G as powers of ten", () => {
    expect(["2p", "3n", "4u", "4µ", "5m", "6k", "7M", "8G"].map((t) => valueOf(t))).toEqual([
      2e-12, 3e-9, 4e-6, 4e-6, 5e-3, 6e3, 7e6, 8e9,
    ]);
  });

  it("reads plain numbers, decimals, signs and exponent form", () => {
    expect([
      valueOf("310"),
      valueOf("0.25"),
      valueOf(".5"),
      valueOf("-12"),
      valueOf("2.2e-7"),
      valueOf("1E3"),
    ]).toEqual([310, 0.25, 0.5, -12, 2.2e-7, 1000]);
  });

  it("gives the same number as the literal, so 4n7 equals 4.7e-9 exactly", () => {
    expect(valueOf("4n7")).toBe(4.7e-9);
    expect(valueOf("330n")).toBe(3.3e-7);
    expect(valueOf("24.1m")).toBe(0.0241);
  });

  it("accepts a trailing unit symbol that matches the field", () => {
    expect(valueOf("330nF", "F")).toBe(3.3e-7);
    expect(valueOf("560kΩ", "Ω")).toBe(560e3);
    expect(valueOf("560kohm", "Ω")).toBe(560e3);
    expect(valueOf("310V", "V")).toBe(310);
    expect(valueOf("24.1mA", "A")).toBe(0.0241);
    expect(valueOf("330 nF", "F")).toBe(3.3e-7);
  });

  it("rejects a unit of the wrong kind with a message naming the expected unit", () => {
    const r = parseValue("330nF", { unit: "Ω" });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe("wrong-unit");
      expect(r.message).toContain("ohms (Ω)");
    }
    expect(valueOf("5V", "1")).toBe("wrong-unit");
  });

  it("keeps M as mega and m as milli in record notation", () => {
    expect(valueOf("1M")).toBe(1e6);
    expect(valueOf("1m")).toBe(1e-3);
  });

  it("reads the deck convention: meg is mega, m and M are milli, case does not matter", () => {
    expect(valueOf("1meg", "Ω", "deck")).toBe(1e6);
    expect(valueOf("1MEG", "Ω", "deck")).toBe(1e6);
    expect(valueOf("1M", "Ω", "deck")).toBe(1e-3);
    expect(valueOf("10UF", "F", "deck")).toBe(1e-5);
    expect(valueOf("4K7", "Ω", "deck")).toBe(4700);
  });

  it("reports bad notation, empty text and numbers too large to be finite", () => {
    expect(valueOf("4x7")).toBe("bad-notation");
    expect(valueOf("k")).toBe("bad-notation");
    expect(valueOf("1.2.3")).toBe("bad-notation");
    expect(valueOf("4.7k7")).toBe("bad-notation");
    expect(valueOf("  ")).toBe("empty-value");
    expect(valueOf("1e400")).toBe("not-finite");
    expect(valueOf(Number.NaN)).toBe("not-finite");
  });

  it("points a deck-style meg in a record to M", () => {
    const r = parseValue("1meg", { unit: "Ω" });
    expect(!r.ok && r.message).toContain("write 1M");
  });

  it("takes numbers as they are", () => {
    expect(valueOf(1e6)).toBe(1e6);
  });
});

describe("parseTolerance", () => {
  it("reads percentages, plus-minus percentages and fractions below one", () => {
    expect(
      [
        parseTolerance("5%"),
        parseTolerance("±10 %"),
        parseTolerance(0.2),
        parseTolerance("0.01"),
      ].map((r) => r.ok && r.value),
    ).toEqual([0.05, 0.1, 0.2, 0.01]);
  });

  it("rejects tolerances of 100% or more and unknown letters", () => {
    expect(parseTolerance("150%").ok).toBe(false);
    expect(parseTolerance(5).ok).toBe(false);
    expect(parseTolerance("Q").ok).toBe(false);
  });
});

describe("parseUncertainty", () => {
  it("reads a percentage as relative and a value as absolute in the measurement's unit", () => {
    expect(parseUncertainty("2%", "A")).toEqual({ ok: true, value: { relative: 0.02 } });
    expect(parseUncertainty("0.5m", "A")).toEqual({ ok: true, value: { absolute: 0.0005 } });
    expect(parseUncertainty("0.5mV", "A").ok).toBe(false);
  });
});

describe("percentText", () => {
  it("writes a fraction as a percentage that reads back to the same fraction", () => {
    expect([0.1, 0.07, 0.05, 0.001].map(percentText)).toEqual(["10%", "7%", "5%", "0.1%"]);
    for (const f of [0.1, 0.07, 0.05, 0.001, 0.123456789]) {
      const back = parseTolerance(percentText(f)!);
      expect(back.ok && back.value).toBe(f);
    }
  });

  it("gives null when no percentage reads back exactly (1/3), so writers fall back to the fraction", () => {
    expect(percentText(1 / 3)).toBeNull();
  });
});
