/**
 * Every hand-made test circuit reaches its periodic steady state well before the cycle cap,
 * and a run that cannot settle says so (converged: false) instead of passing off the last
 * cycles as a steady state.
 */
import { describe, expect, it } from "vitest";
import {
  PSS_MAX_CYCLES,
  TransientSolver,
  compileCircuit,
  periodicSteadyState,
  solveCircuit,
} from "@teardown/engine";
import { ALL_TEST_CIRCUITS, testCircuit } from "../../support/circuits/all-test-circuits.js";

/** "Well before the cap": a fifth of it. */
const WELL_BEFORE = PSS_MAX_CYCLES / 5;

describe("periodic steady state of every test circuit", () => {
  for (const c of ALL_TEST_CIRCUITS) {
    it(`settles ${c.name} within ${WELL_BEFORE} cycles`, { timeout: 60_000 }, () => {
      const r = solveCircuit(c.record);
      if (!r.ok) throw new Error(`${c.name}: ${r.error.message}`);
      const s = r.value.steady;
      expect(s.converged).toBe(true);
      expect(s.residual).toBeLessThanOrEqual(1);
      expect(s.cycles).toBeLessThanOrEqual(WELL_BEFORE);
      // Source: the definition of a periodic state, the window ends where it started; the
      // storage states agree to well within a part in a thousand of the supply peak.
      for (const d of r.value.circuit.devices) {
        if (d.type !== "capacitor") continue;
        const drift = Math.abs(s.run.endMem[d.mem]! - s.startMem[d.mem]!);
        expect(drift, `${c.name} ${d.ref}`).toBeLessThan(1e-3 * 230 * Math.SQRT2);
      }
    });
  }

  it("says it did not converge when the cycles run out before the state settles", () => {
    // Two plain cycles of a bridge charging a 470 µF reservoir cannot reach its steady state.
    const compiled = compileCircuit(testCircuit("fused-transformer-supply"), { vrms: 230, hz: 50 });
    if (!compiled.ok) throw new Error(compiled.error.message);
    const solver = new TransientSolver(compiled.value, { lu: "sparse", maxNewtonIterations: 60 });
    const budget = { now: null, deadlineMs: Infinity, stepsLeft: 1e6 };
    const r = periodicSteadyState(solver, budget, undefined, { shooting: false, maxCycles: 2 });
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.converged).toBe(false);
    expect(r.value.residual).toBeGreaterThan(1);
  });
});
