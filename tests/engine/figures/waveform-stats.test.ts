/**
 * Period statistics on uneven time points and uniform resampling, against closed forms.
 */
import { describe, expect, it } from "vitest";
import {
  peakMagnitude,
  periodMean,
  periodMeanPower,
  resampleForPlot,
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
    expect(periodMeanPower(t, sine, i)).toBeCloseTo(0.5 * 10 * 2 * Math.cos(Math.PI / 3), 3);
  });

  it("weighs a damped step by its end value only", () => {
    // A step from a point of another state: y jumps from 100 to 1 at t = 1 and holds to t = 2.
    const tt = [0, 1, 2];
    const y = [100, 100, 1];
    // Source: hand computation, ∫y = 100·1 + 1·1 over 2 s (right-endpoint rule on the damped
    // step), against (100 + 50.5)/2 by the trapezoid.
    expect(periodMean(tt, y, [false, false, true])).toBeCloseTo(50.5, 12);
    expect(periodMean(tt, y)).toBeCloseTo(75.25, 12);
    expect(periodRms(tt, y, [false, false, true])).toBeCloseTo(Math.sqrt((1e4 + 1) / 2), 9);
  });

  it("gives a capacitor on a trapezoidal grid exactly its energy change as mean power", () => {
    // v and the trapezoidal companion current of a 1 F capacitor: (i0 + i1)/2 = (v1 - v0)/h.
    const tt = [0, 0.1, 0.3, 0.6];
    const v = [0, 2, 1, 3];
    const i = [0];
    for (let k = 1; k < tt.length; k++)
      i.push((2 * (v[k]! - v[k - 1]!)) / (tt[k]! - tt[k - 1]!) - i[k - 1]!);
    // Source: closed form, C/2·(v_end² − v_start²)/T = 0.5·9/0.6.
    expect(periodMeanPower(tt, v, i, 1, undefined, true)).toBeCloseTo(7.5, 12);
  });

  it("keeps a short pulse at its height when resampling for a plot", () => {
    const tt = [0, 0.4, 0.401, 0.402, 1];
    const y = [0, 0, 5, 0, 0];
    const ramp = tt.map((x) => 10 * x);
    // Source: hand computation; linear interpolation at 0, 0.25, 0.5, 0.75 misses the pulse.
    expect(Array.from(resampleUniform(tt, y, 4))).toEqual([0, 0, 0, 0]);
    const [pulse, line] = resampleForPlot(tt, [y, ramp], 4);
    expect(Array.from(pulse!)).toEqual([0, 5, 0, 0]);
    // The ramp's plot point in that bin is taken at the pulse's time too (4.01, not 2.5).
    expect(Array.from(line!)).toEqual([0, 4.01, 5, 7.5]);
  });

  it("resamples uniformly by linear interpolation", () => {
    const u = resampleUniform([0, 1, 3], [0, 2, 0], 6);
    // Source: hand computation at t = 0, 0.5, 1, 1.5, 2, 2.5.
    expect(Array.from(u)).toEqual([0, 1, 2, 1.5, 1, 0.5]);
  });
});
