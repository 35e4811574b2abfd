/**
 * IEC 60063 preferred-number series against the published tables.
 * Published document: IEC 60063:2015 "Preferred number series for resistors and capacitors",
 * Table 1 (E3, E6, E12, E24, two significant figures) and Table 2 (E48, E96, E192, three
 * significant figures); table numbers from memory, the standard's abstract FOUND at
 * https://dinmedia.de/en/standard/din-en-60063/240741276.
 * The values themselves were read from a reproduction of those tables: FOUND
 * https://www.qsl.net/g4usp/Components/Component%20preferred%20values.htm (E3 to E48), and the
 * EIA-96 code table of a chip-resistor datasheet (E96).
 */
import { describe, expect, it } from "vitest";
import { E_SERIES, eSeriesOf, isInSeries } from "@teardown/engine";

const asHundredths = (values: readonly number[]): number[] =>
  values.map((v) => Math.round(v * 100));

describe("IEC 60063 series tables", () => {
  it("E6 is 1.0 1.5 2.2 3.3 4.7 6.8 (FOUND, qsl.net page)", () => {
    expect(E_SERIES.E6).toEqual([1.0, 1.5, 2.2, 3.3, 4.7, 6.8]);
  });

  it("E12 is the published twelve values (FOUND, qsl.net page)", () => {
    expect(E_SERIES.E12).toEqual([1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2]);
  });

  it("E24 is the published 24 values, with 4.3 and not 4.2 (FOUND, qsl.net page)", () => {
    expect(E_SERIES.E24).toEqual([
      1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6,
      6.2, 6.8, 7.5, 8.2, 9.1,
    ]);
  });

  it("E3 is 1.0 2.2 4.7 (FOUND, qsl.net page)", () => {
    expect(E_SERIES.E3).toEqual([1.0, 2.2, 4.7]);
  });

  it("E48 is the published 48 values (FOUND, qsl.net page)", () => {
    const published = `100 105 110 115 121 127 133 140 147 154 162 169 178 187 196 205 215 226 237 249 261 274 287 301
316 332 348 365 383 402 422 442 464 487 511 536 562 590 619 649 681 715 750 787 825 866 909 953`;
    expect(asHundredths(E_SERIES.E48)).toEqual(published.split(/\s+/).map(Number));
  });

  // E96: partial list FOUND on the qsl.net page; full 96-value EIA-96 table FOUND in
  // http://www.manualshelf.com/manual/unbranded/132998-uni/datasheet-english.html
  it("E96 is the 96 values of the table (FOUND, qsl.net and the EIA-96 datasheet table)", () => {
    const table = `100 102 105 107 110 113 115 118 121 124 127 130 133 137 140 143 147 150 154 158
162 165 169 174 178 182 187 191 196 200 205 210 215 221 226 232 237 243 249 255
261 267 274 280 287 294 301 309 316 324 332 340 348 357 365 374 383 392 402 412
422 432 442 453 464 475 487 499 511 523 536 549 562 576 590 604 619 634 649 665
681 698 715 732 750 768 787 806 825 845 866 887 909 931 953 976`;
    expect(asHundredths(E_SERIES.E96)).toEqual(table.split(/\s+/).map(Number));
  });

  it("E96 equals round(100·10^(i/96)) for i = 0..95 (DERIVED by computation against IEC 60063:2015 Table 2)", () => {
    expect(asHundredths(E_SERIES.E96)).toEqual(
      Array.from({ length: 96 }, (_, i) => Math.round(100 * 10 ** (i / 96))),
    );
  });

  it("E192 holds 920, not the computed 919 (IEC 60063:2015 Table 2, MEMORY), and every other E96 value", () => {
    expect(asHundredths(E_SERIES.E192)).toContain(920);
    expect(asHundredths(E_SERIES.E192)).not.toContain(919);
    expect(E_SERIES.E192.filter((_, i) => i % 2 === 0)).toEqual(E_SERIES.E96);
  });

  it("E24 differs from rounded 10^(i/24) at 2.7 3.0 3.3 3.6 3.9 4.3 4.7 8.2 (IEC 60063:2015 Table 1 against the formula, DERIVED)", () => {
    const computed = Array.from({ length: 24 }, (_, i) => Math.round(10 * 10 ** (i / 24)) / 10);
    const differing = E_SERIES.E24.filter((v, i) => v !== computed[i]);
    expect(differing).toEqual([2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2]);
  });
});

describe("series membership", () => {
  it("a traced 5k1 is an E24 value, not an E12 one (IEC 60063:2015 Table 1: 5.1 is in E24 only)", () => {
    expect(eSeriesOf(5100)).toBe("E24");
    expect(isInSeries(5100, "E12")).toBe(false);
  });

  it("4n7 is on E6 through floating point (4.7e-9 → 4.7; E6 FOUND)", () => {
    expect(eSeriesOf(4.7e-9)).toBe("E6");
  });

  it("1.02 kΩ is first found in E96 and 1.05 kΩ in E48 (tables FOUND)", () => {
    expect(eSeriesOf(1020)).toBe("E96");
    expect(eSeriesOf(1050)).toBe("E48");
  });

  it("3.3 kΩ is E6 and 333 Ω is on no series (E6 and E192 tables)", () => {
    expect(eSeriesOf(3300)).toBe("E6");
    expect(eSeriesOf(333)).toBeNull();
  });
});
