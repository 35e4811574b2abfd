/**
 * The crest plug-in: the circuit's supply starts at its crest (phase π/2), so a discharged
 * series RC takes Vpk/R at the first instant, and the supply the run drives is V̂·cos ωt.
 */
import { describe, expect, it } from "vitest";
import { compileCircuit, solveCircuit } from "@teardown/engine";
import {
  crestStartCircuit,
  simulateCrestSwitchOn,
} from "../../../analysis-worker/engine/src/solver/variants/plug-in.js";
import { makeBudget } from "../../../analysis-worker/engine/src/solver/variants/budget.js";
import { part, record } from "../../support/record-factory.js";

const R_OHMS = 1000;
const C_FARADS = 1e-6;
const seriesRc = () =>
  record([
    part("R1", "resistor", ["L", "A"], R_OHMS),
    part("C1", "capacitor", ["A", "N"], C_FARADS),
  ]);

describe("the crest plug-in", () => {
  it("starts the supply at its crest, leaving every other device as compiled", () => {
    const compiled = compileCircuit(seriesRc(), { vrms: 230, hz: 50 });
    if (!compiled.ok) throw new Error(compiled.error.message);
    const crest = crestStartCircuit(compiled.value);
    const supply = crest.devices.find((d) => d.type === "supply");
    expect(supply?.type === "supply" && supply.phase).toBeCloseTo(Math.PI / 2, 12);
    // sin(ωt + π/2) = cos ωt: the crest at t = 0.
    expect(compiled.value.devices.find((d) => d.type === "supply")).toMatchObject({ phase: 0 });
    expect(crest.devices.filter((d) => d.type !== "supply")).toEqual(
      compiled.value.devices.filter((d) => d.type !== "supply"),
    );
  });

  it("gives a discharged series RC its closed-form first peak, Vpk / R", () => {
    const solved = solveCircuit(seriesRc(), { minSupply: false });
    if (!solved.ok) throw new Error(solved.error.message);
    const run = simulateCrestSwitchOn(
      solved.value,
      new Set(["C1"]),
      makeBudget(null, Infinity, 1_000_000),
    );
    if (!run.ok) throw new Error(run.error.message);
    // Closed form: i(0+) = V̂/R for a discharged capacitor; the first backward-Euler step of
    // 0.1 µs against RC = 1 ms lowers it by about 1e-4 only.
    const vpk = 230 * Math.SQRT2;
    expect(run.value.peak_a.C1! / (vpk / R_OHMS)).toBeCloseTo(1, 3);
    expect(run.value.at_s.C1!).toBeLessThan(1e-6);
  });
});
