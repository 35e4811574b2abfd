/**
 * The discharge after unplugging: the steady cycle's state at a supply peak (the worst instant,
 * as IEC 60335-1 22.5 specifies), then the circuit with its supply removed and the plug pins
 * left open, simulated for the test's delay. Built from the solver's pieces: the compiled
 * circuit without its supply source (branch unknowns renumbered) runs one "cycle" whose period
 * is the test delay, so the solver's own adaptive trapezoidal stepping does the work.
 */
import type { Circuit, CircuitDevice } from "../circuit-model.js";
import type { SolverOutcome } from "../solver-error.js";
import { solverFailure } from "../solver-error.js";
import type { Budget } from "../transient.js";
import { MAX_NEWTON_ITERATIONS, TransientSolver } from "../transient.js";
import type { SteadyCircuit } from "./steady-variant.js";

/** The discharge from one unplugging instant. */
export interface UnplugDischarge {
  instant: "positive peak" | "negative peak";
  /** Pin voltage (line against the reference) at the instant of unplugging. */
  v0_v: number;
  /** Pin voltage after the delay. */
  v_after_v: number;
  delay_s: number;
}

/** The compiled circuit with its supply source removed: the pins (line and reference) are open. */
export function unpluggedCircuit(c: Circuit, delayS: number): Circuit {
  const supply = c.devices.find(
    (d): d is Extract<CircuitDevice, { type: "supply" }> => d.type === "supply",
  );
  if (supply === undefined) return c;
  const gone = supply.branch;
  const shift = (b: number) => (b > gone ? b - 1 : b);
  const devices: CircuitDevice[] = c.devices
    .filter((d) => d !== supply)
    .map((d) => {
      if (d.type === "short") return { ...d, branch: shift(d.branch) };
      if (d.type === "coupled") return { ...d, branches: d.branches.map(shift) };
      return d;
    });
  const unknownOwner = c.unknownOwner.filter((_, i) => i !== gone);
  // The period of the one simulated "cycle" is the delay; the voltage scale stays the supply's.
  return {
    ...c,
    devices,
    size: c.size - 1,
    unknownOwner,
    supply: { vrms: c.supply.vrms, hz: 1 / delayS },
  };
}

/** The recorded steady sample nearest to time t. */
function sampleAt(solved: SteadyCircuit, t: number) {
  let best = solved.steady.run.samples[0]!;
  for (const s of solved.steady.run.samples) if (Math.abs(s.t - t) < Math.abs(best.t - t)) best = s;
  return best;
}

/** Simulates unplugging at the positive and the negative supply peak. */
export function simulateUnplug(
  solved: SteadyCircuit,
  delayS: number,
  budget: Budget,
): SolverOutcome<UnplugDischarge[]> {
  const c = solved.circuit;
  const lineNode = c.nodeNames.indexOf(c.line);
  if (lineNode < 0) return solverFailure("no-supply", "the line net is not a node of the circuit");
  const supply = c.devices.find(
    (d): d is Extract<CircuitDevice, { type: "supply" }> => d.type === "supply",
  )!;
  const open = unpluggedCircuit(c, delayS);
  const solver = new TransientSolver(open, {
    lu: "sparse",
    maxNewtonIterations: MAX_NEWTON_ITERATIONS,
  });
  const period = 1 / c.supply.hz;
  const out: UnplugDischarge[] = [];
  for (const [instant, t] of [
    ["positive peak", period / 4],
    ["negative peak", (3 * period) / 4],
  ] as const) {
    const s = sampleAt(solved, t);
    const x0 = s.x.filter((_, i) => i !== supply.branch);
    const run = solver.runCycle(s.mem, x0, false, budget);
    if (!run.ok) return run;
    const v0 = s.x[lineNode]!;
    const vAfter = run.run.endX[lineNode]!;
    out.push({
      instant,
      v0_v: v0,
      v_after_v: vAfter,
      delay_s: delayS,
    });
  }
  return { ok: true, value: out };
}
