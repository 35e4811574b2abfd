/**
 * Period statistics on uneven time points and uniform resampling, against closed forms.
 */
import { describe, expect, it } from "vitest";
import {
  peakMagnitude,
  periodMean,
  periodMeanProduct,
  periodRms,
  resampleUniform,
} from "@teardown/engine";

// Uneven points over one period of 20 ms.
const t = Array.from({ length: 2001 }, (_, k) => 0.02 * (k / 2000) ** 1.3);
const sine = t.map((x) => 10 * Math.sin(2 * Math.PI * 50 * x));

describe("period statistics", () => {
  it("gives a sine an RMS of peak/√2 and a mean of zero on uneven points", () => {
    // Source: closed form.
    expect(periodRms(t, sine)).toBeCloseTo(10 / Math.SQRT2, 3);
    expect(periodMean(t, sine)).toBeCloseTo(0, 3);
    expect(peakMagnitude(sine)).toBeCloseTo(10, 4);
  });

  it("gives the mean of v·i as ½·Vpk·Ipk·cos φ", () => {
    const i = t.map((x) => 2 * Math.sin(2 * Math.PI * 50 * x - Math.PI / 3));
    // Source: closed form, real power of sinusoids.
    expect(periodMeanProduct(t, sine, i)).toBeCloseTo(0.5 * 10 * 2 * Math.cos(Math.PI / 3), 3);
  });

  it("resamples uniformly by linear interpolation", () => {
    const u = resampleUniform([0, 1, 3], [0, 2, 0], 6);
    // Source: hand computation at t = 0, 0.5, 1, 1.5, 2, 2.5.
    expect(Array.from(u)).toEqual([0, 1, 2, 1.5, 1, 0.5]);
  });
});
