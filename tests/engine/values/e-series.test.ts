import { describe, expect, it } from "vitest";
import { eSeriesOf, nearestInSeries } from "@teardown/engine";

describe("eSeriesOf", () => {
  it("reports the smallest series holding the value in any decade", () => {
    expect(eSeriesOf(4.7e-9)).toBe("E6");
    expect(eSeriesOf(1.2e6)).toBe("E12");
    expect(eSeriesOf(5100)).toBe("E24");
    expect(eSeriesOf(10)).toBe("E6");
    expect(eSeriesOf(0.001)).toBe("E6");
  });

  it("finds three-digit values in E48, E96 or E192", () => {
    expect(eSeriesOf(4.99e3)).toBe("E96");
    expect(eSeriesOf(1.01e3)).toBe("E192");
  });

  it("returns null for values on no series, zero and negatives", () => {
    expect(eSeriesOf(3.45e3)).toBeNull();
    expect(eSeriesOf(0)).toBeNull();
    expect(eSeriesOf(-4700)).toBeNull();
  });

  it("returns null for kinds whose values are not chosen from the series", () => {
    expect(eSeriesOf(1, "fuse")).toBeNull();
    expect(eSeriesOf(4700, "resistor")).toBe("E6");
  });
});

describe("nearestInSeries", () => {
  it("picks the nearest value on a logarithmic scale", () => {
    expect(nearestInSeries(5000, "E12")).toBe(4700);
    expect(nearestInSeries(4.6e-9, "E6")).toBe(4.7e-9);
    expect(nearestInSeries(3.3, "E24")).toBe(3.3);
  });

  it("crosses into the next decade when that is nearer", () => {
    expect(nearestInSeries(9.4, "E12")).toBe(10);
    expect(nearestInSeries(960, "E6")).toBe(1000);
  });

  it("returns null for values it cannot place", () => {
    expect(nearestInSeries(0, "E12")).toBeNull();
  });
});
