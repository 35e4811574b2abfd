/**
 * implausible-input: a solved input current or power no part of the record could carry. Each
 * case's figure is checked against Ohm's law on the supply (230 V RMS across the resistance the
 * record gives), and each test's opposite case stays silent.
 */
import { describe, expect, it } from "vitest";
import { part, record } from "../../support/record-factory.js";
import { testCircuit } from "../../support/circuits/all-test-circuits.js";
import { assess, codes, evNum } from "./flag-circuits.js";

const flagOf = (r: ReturnType<typeof assess>) =>
  r.flags.find((f) => f.code === "implausible-input");

/** A fused resistive load straight on the mains. */
const fusedLoad = (fuseAmps: number, ohms: number, extra = {}) =>
  record([
    part("F1", "fuse", ["L", "L1"], fuseAmps),
    part("HT1", "load", ["L1", "N"], null, { model: { r: ohms }, ...extra }),
  ]);

describe("implausible-input", () => {
  it("names a milli value meant as mega: 1 mΩ in series with 72 mΩ draws about 3.2 kA", () => {
    const r = assess(
      record([
        part("R1", "resistor", ["L", "A"], 1e-3),
        part("HT1", "load", ["A", "N"], null, { model: { r: 0.072 } }),
      ]),
      2,
    );
    const f = flagOf(r)!;
    expect(f.severity).toBe("warning");
    const amps = evNum(f, "input current (RMS)");
    // Ohm's law: 230 V / 73 mΩ = 3151 A (the solver adds only its tiny conductances).
    expect(amps / (230 / 0.073)).toBeCloseTo(1, 2);
    expect(evNum(f, "input power") / ((230 * 230) / 0.073)).toBeCloseTo(1, 2);
    expect(f.message).toContain(`${Number(amps.toPrecision(3))} A`);
    expect(f.message).toContain("32 A");
  });

  it("flags a steady current above twice a fuse's rating (4.6 A through 1 A) and not within it (5 A)", () => {
    const f = flagOf(assess(fusedLoad(1, 50), 2))!;
    expect(evNum(f, "input current (RMS)")).toBeCloseTo(230 / 50, 1);
    expect(evNum(f, "rating of fuse F1")).toBe(1);
    expect(f.parts).toContain("F1");
    expect(codes(assess(fusedLoad(5, 50), 2))).not.toContain("implausible-input");
  });

  it("flags 529 W into parts rated 0.25 W together, and not an unrated 2 kW heater", () => {
    const f = flagOf(
      assess(record([part("R1", "resistor", ["L", "N"], 100, { rating: { watts: 0.25 } })]), 2),
    )!;
    expect(evNum(f, "input power")).toBeCloseTo((230 * 230) / 100, 0);
    expect(evNum(f, "summed power ratings of the parts")).toBe(0.25);
    // 230²/26.45 Ω = 2000 W through a 10 A fuse: a heater, plausible.
    expect(codes(assess(fusedLoad(10, 26.45), 2))).not.toContain("implausible-input");
  });

  it("stays silent on an ordinary dropper night light", () => {
    expect(codes(assess(testCircuit("night-light-dropper"), 2))).not.toContain("implausible-input");
  });
});
