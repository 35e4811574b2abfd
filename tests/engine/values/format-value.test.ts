import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { exactValueText, formatValue, parseValue } from "@teardown/engine";

describe("formatValue", () => {
  it("writes engineering notation with the unit", () => {
    expect(formatValue(3.3e-7, "F")).toBe("330nF");
    expect(formatValue(4700)).toBe("4.7k");
    expect(formatValue(2.2e6, "Ω")).toBe("2.2MΩ");
    expect(formatValue(0.0241, "A")).toBe("24.1mA");
    expect(formatValue(310, "V")).toBe("310V");
  });

  it("rounds to four significant digits and carries into the next prefix", () => {
    expect(formatValue(1 / 3)).toBe("333.3m");
    expect(formatValue(999.96)).toBe("1k");
  });
});

describe("exactValueText", () => {
  it("writes short text when one exists", () => {
    expect(exactValueText(2.2e6)).toBe("2.2M");
    expect(exactValueText(2.2e6, "deck")).toBe("2.2meg");
    expect(exactValueText(4.7e-9)).toBe("4.7n");
  });

  it("always reads back to the same number in both notations", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e15, max: 1e15, noNaN: true }),
        fc.constantFrom("record" as const, "deck" as const),
        (v, notation) => {
          const r = parseValue(exactValueText(v, notation), { notation });
          return r.ok && (r.value === v || (v === 0 && r.value === 0));
        },
      ),
      { numRuns: 2000 },
    );
  });
});
