/**
 * Spacing figures against IEC 60664-1:2007 (Ed. 2), Tables F.1, F.2 (case A) and F.4, read in
 * reproductions of the tables (each value's confidence mark beside it).
 */
import { describe, expect, it } from "vitest";
import {
  clearanceRequired,
  creepageRequired,
  nextImpulseStep,
  ratedImpulseOvcII,
} from "@teardown/engine";

describe("Table F.4 creepage (FOUND, Wago reproduction of DIN EN 60664-1)", () => {
  it("asks 1.0 mm at 250 V on printed wiring, pollution degree 2", () => {
    expect(creepageRequired(250, "IIIa", 2).mm).toBe(1.0);
  });

  it("rounds a working voltage up to the next row: 230 V uses the 250 V row", () => {
    const r = creepageRequired(230, "IIIa", 2);
    expect(r.row_vrms).toBe(250);
    expect(r.mm).toBe(1.0);
  });

  it("uses the general columns for group IIIb: 2.5 mm at 250 V (IIIb note: MEMORY)", () => {
    expect(creepageRequired(250, "IIIb", 2).mm).toBe(2.5);
  });

  it("gives pollution degree 3, group II at 400 V as 5.6 mm and printed wiring PD1 at 160 V as 0.25 mm", () => {
    expect(creepageRequired(400, "II", 3).mm).toBe(5.6);
    expect(creepageRequired(160, "I", 1).mm).toBe(0.25);
  });
});

describe("Table F.1 rated impulse, overvoltage category II (FOUND, Recom page)", () => {
  it("gives 2.5 kV for 230 V mains and 1.5 kV for 120 V mains", () => {
    expect(ratedImpulseOvcII(230)).toBe(2500);
    expect(ratedImpulseOvcII(120)).toBe(1500);
  });
});

describe("Table F.2 clearance, Case A (FOUND for 1.5-6 kV, rail-operator wiki)", () => {
  it("gives basic 1.5 mm and reinforced 3.0 mm at 230 V (reinforced step FOUND, TI AMC1411-Q1)", () => {
    expect(clearanceRequired(2500, 2).mm).toBe(1.5);
    expect(nextImpulseStep(2500)).toBe(4000);
    expect(clearanceRequired(nextImpulseStep(2500), 2).mm).toBe(3.0);
  });

  it("gives basic 0.5 mm and reinforced 1.5 mm at 120 V, and 0.8 mm in pollution degree 3 (FOUND)", () => {
    expect(clearanceRequired(1500, 2).mm).toBe(0.5);
    expect(clearanceRequired(nextImpulseStep(1500), 2).mm).toBe(1.5);
    expect(clearanceRequired(1500, 3).mm).toBe(0.8);
  });

  it("gives 8.0 mm for the reinforced step of 6 kV (FOUND, TI AMC1411-Q1)", () => {
    expect(clearanceRequired(nextImpulseStep(6000), 2).mm).toBe(8.0);
  });
});
