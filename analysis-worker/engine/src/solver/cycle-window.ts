/**
 * Windows of recorded cycles for the periodic steady state: consecutive one-cycle runs joined
 * into the run of a k-cycle orbit, the end states of its cycles, and its first p cycles when
 * the orbit turns out to repeat sooner.
 */
import type { CycleRun } from "./transient.js";

/** Consecutive cycle runs as one run over [0, k·period]: times shifted, samples and events in order. */
export function joinCycles(parts: CycleRun[], period: number): CycleRun {
  if (parts.length === 1) return { ...parts[0]!, cycleEnds: [parts[0]!.endMem] };
  const samples: CycleRun["samples"] = [];
  const events: CycleRun["events"] = [];
  let steps = 0;
  parts.forEach((p, j) => {
    for (const s of p.samples) samples.push(j === 0 ? s : { ...s, t: s.t + j * period });
    for (const e of p.events) events.push({ ...e, t: e.t + j * period });
    steps += p.steps;
  });
  const last = parts[parts.length - 1]!;
  return {
    endMem: last.endMem,
    endX: last.endX,
    samples,
    events,
    steps,
    cycleEnds: parts.map((p) => p.endMem),
  };
}

/** The end state of each cycle of a joined run. */
export function splitEnds(run: CycleRun, period: number): Float64Array[] {
  return run.cycleEnds ?? Array.from({ length: period }, () => run.endMem);
}

/** The first p cycles of a joined run. */
export function firstCycles(
  run: CycleRun,
  p: number,
  period: number,
  endMem: Float64Array,
): CycleRun {
  const tEnd = p * period * (1 + 1e-12);
  const samples = run.samples.filter((s) => s.t <= tEnd);
  const last = samples[samples.length - 1]!;
  return {
    endMem,
    endX: last.x,
    samples,
    events: run.events.filter((e) => e.t <= tEnd),
    steps: samples.length,
    cycleEnds: run.cycleEnds?.slice(0, p),
  };
}
