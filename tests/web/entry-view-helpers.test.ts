/**
 * The entry page's pure helpers, against closed forms: the firing instants of a thyristor or
 * triac at angle α sit α/360 of a mains period after the supply's rising zero crossing (and
 * half a period later for the negative half); a window of N samples spaced dt spans N·dt·f
 * cycles; findings sort danger first and mark a part by the worst finding naming it.
 */
import { describe, expect, it } from "vitest";
import {
  cyclesSpanned,
  firingInstants,
  seriesLabel,
  seriesUnit,
} from "@/app/components/entry/view/series-names";
import { findingSentence, findingsOf, markedParts } from "@/app/components/entry/view/finding-text";

function sineWindow(hz: number, samples: number, cycles: number, phaseRad = 0) {
  const dt = cycles / hz / samples;
  const t = Array.from({ length: samples }, (_, i) => i * dt);
  return { t, v: t.map((x) => 325 * Math.sin(2 * Math.PI * hz * x + phaseRad)) };
}

describe("waveform helpers", () => {
  it("counts one 50 Hz cycle over 1000 samples of 20 µs and three 60 Hz cycles", () => {
    expect(cyclesSpanned(sineWindow(50, 1000, 1).t, 50)).toBe(1);
    expect(cyclesSpanned(sineWindow(60, 900, 3).t, 60)).toBe(3);
  });

  it("puts firing at α/360·T after the rising zero crossing, and T/2 later for the negative half", () => {
    // A window that starts 90° into the cycle: the rising crossing is at 3T/4.
    const hz = 50;
    const T = 1 / hz;
    const { t, v } = sineWindow(hz, 4000, 2, Math.PI / 2);
    const at = firingInstants(t, v, hz, 60, 70);
    const rising = 0.75 * T;
    // Every period's instants, by brute force over whole periods either side.
    const expected: number[] = [];
    for (let k = -3; k <= 3; k++)
      expected.push(rising + (60 / 360) * T + k * T, rising + T / 2 + (70 / 360) * T + k * T);
    const inWindow = expected.filter((x) => x >= 0 && x <= t[t.length - 1]!).sort((a, b) => a - b);
    expect(inWindow.length).toBe(4);
    expect(at.length).toBe(inWindow.length);
    at.forEach((x, i) => expect(x).toBeCloseTo(inWindow[i]!, 5));
  });

  it("names traces in plain words with their units", () => {
    expect(seriesLabel("net.A")).toBe("voltage at net A");
    expect(seriesLabel("C1.current")).toBe("current in C1");
    expect(seriesLabel("input.current")).toBe("line current");
    expect(seriesUnit("C1.current")).toBe("A");
    expect(seriesUnit("net.A")).toBe("V");
  });
});

describe("findings", () => {
  const flags = [
    { code: "no-fuse", severity: "info", parts: [], nets: [], message: "No fuse.", evidence: [] },
    {
      code: "dropper-rating",
      severity: "warning",
      parts: ["R1"],
      nets: [],
      message: "R1 runs hot",
      evidence: [{ label: "dissipation", value: 0.512, unit: "W" }],
      source: "common practice",
    },
    {
      code: "touchable-mains",
      severity: "danger",
      parts: ["R1", "C1"],
      nets: ["A"],
      message: "Plate on mains.",
      evidence: [{ label: "peak voltage", value: 325.3, unit: "V" }],
    },
  ];

  it("sorts danger, warning, then notes, and marks a part by its worst finding", () => {
    const f = findingsOf(flags);
    expect(f.map((x) => x.severity)).toEqual(["danger", "warning", "info"]);
    expect([...markedParts(f)]).toEqual([
      ["R1", "danger"],
      ["C1", "danger"],
    ]);
  });

  it("writes a finding as a sentence with its quantities and units", () => {
    const f = findingsOf(flags);
    expect(findingSentence(f[1]!)).toBe("R1 runs hot. Figures: dissipation: 512 mW.");
    expect(findingSentence(f[0]!)).toBe("Plate on mains. Figures: peak voltage: 325 V.");
  });
});
