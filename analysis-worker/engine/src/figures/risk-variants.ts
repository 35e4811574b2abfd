/**
 * The variants the risk checks judge, solved before any check reads them: the nominal cycle at
 * the analysed supply (re-solved only when the caller has none), the unplugging at both supply
 * peaks, the crest plug-in, the measurements' tolerance bands and the hints for each measurement
 * that disagrees. They share one budget and run in that order, so a budget that ends early
 * leaves the later ones short (the bands' samples, the hints), never the nominal figures.
 * The flags stage only reads what this returns; it never runs a simulation itself.
 */
import type { Assumption, Gap } from "../record/gaps-and-assumptions.js";
import type { TeardownRecord } from "../record/types.js";
import { buildCircuitGraph } from "../graph/circuit-graph.js";
import { traceSupplyPaths } from "../blocks/supply-path.js";
import type { SolverOutcome } from "../solver/solver-error.js";
import type { Budget } from "../solver/transient.js";
import { budgetSpent } from "../solver/variants/budget.js";
import type { UnplugDischarge } from "../solver/variants/unplug.js";
import { simulateUnplug } from "../solver/variants/unplug.js";
import type { SurgeRun } from "../solver/variants/plug-in.js";
import { simulateCrestSwitchOn } from "../solver/variants/plug-in.js";
import type { CircuitAnalysis } from "./analyze-circuit.js";
import type { SolvedCircuit } from "./solved-variant.js";
import { solveVariant } from "./solved-variant.js";
import type { MeasurementCheck } from "./measurement-comparisons.js";
import { compareMeasurements } from "./measurement-comparisons.js";
import type { MismatchHint } from "./measurement-hints.js";
import { mismatchHint } from "./measurement-hints.js";

/** Kinds whose current the crest plug-in records: the parts a switch-on surge can harm. */
export const SURGE_KINDS: ReadonlySet<string> = new Set(["diode", "led", "zener", "capacitor"]);

/** What the variants are asked: the unplugging rule's numbers and the Monte Carlo's size. */
export interface RiskVariantRequest {
  budget: Budget;
  /** The nominal solve at the analysed supply, when the caller has it (spares a re-solve). */
  nominal?: SolvedCircuit;
  /** How long after unplugging the pin voltage is read (s). */
  unplugDelayS: number;
  /** Unplugging is simulated only when the pins present more than this capacitance (F). */
  unplugAboveF: number;
  seed: number;
  samples: number;
}

/** Every solved variant the risk checks read. */
export interface RiskVariants {
  /** The steady cycle at the analysed supply, or null when it could not be re-solved. */
  solved: SolvedCircuit | null;
  /** Why the steady cycle could not be re-solved (and the checks that need it were skipped), or null. */
  solveFailure: string | null;
  /** The capacitance the plug pins present at the supply frequency (F). */
  pinCapacitanceF: number;
  /** The unplugging runs; null when not run (no plug, too little pin capacitance, no cycle). */
  unplug: SolverOutcome<UnplugDischarge[]> | null;
  /** The crest plug-in, recording every part of `SURGE_KINDS`; null when not run. */
  plugIn: SolverOutcome<SurgeRun> | null;
  /** Each measurement against its band, in the record's order. */
  checks: MeasurementCheck[];
  /** The hint for each check that disagrees, by check index (absent for those that agree). */
  hints: Map<number, MismatchHint>;
  /** Defaults the bands chose where the record was silent. */
  assumptions: Assumption[];
  /** Measurements the bands could not compare, and why. */
  notes: string[];
  /** Measurements whose band the spent budget cut short, as gaps. */
  unfinished: Gap[];
}

/** The capacitance the plug pins present at the supply frequency (0 for a resistive or inductive input). */
export function pinCapacitance(analysis: CircuitAnalysis): number {
  const i = analysis.waveforms.series["input.current"];
  const n = i?.length ?? 0;
  if (i === undefined || n === 0) return 0;
  const w = 2 * Math.PI * analysis.supply.hz;
  const vpk = analysis.supply.vrms * Math.SQRT2;
  let quad = 0;
  // v = V̂ sin ωt, so a capacitor's current is ωCV̂ cos ωt: its cos-component over one cycle.
  for (let k = 0; k < n; k++) quad += i[k]! * Math.cos(w * analysis.waveforms.t[k]!);
  return Math.max(0, (2 * quad) / n / (w * vpk));
}

/**
 * The variants of a nominal analysis before any has run: the checks that need one find nothing
 * to judge. The pin capacitance is a figure of the nominal cycle, so it is read already (a
 * discharge check then waits for its run instead of calling the rule not applicable).
 */
export function unsolvedVariants(analysis: CircuitAnalysis, solved: SolvedCircuit): RiskVariants {
  return {
    solved,
    solveFailure: null,
    pinCapacitanceF: pinCapacitance(analysis),
    unplug: null,
    plugIn: null,
    checks: [],
    hints: new Map(),
    assumptions: [],
    notes: [],
    unfinished: [],
  };
}

/** Measurements whose band the spent budget cut short (fewer samples than asked for), as gaps naming the measured part or net. */
function bandsCutShort(
  record: TeardownRecord,
  checks: readonly MeasurementCheck[],
  samples: number,
): Gap[] {
  const gaps: Gap[] = [];
  for (const c of checks) {
    if (c.band.samples >= samples) continue;
    const m = record.measurements[c.comparison.measurement]!;
    const reason = `measurements[${c.comparison.measurement}] (${m.what}): its band rests on ${c.band.samples} of ${samples} tolerance samples, the time budget ended the rest`;
    if (m.part !== null) gaps.push({ part: m.part, reason });
    else if (m.between !== null) gaps.push({ net: m.between[0], reason });
    else gaps.push({ net: Object.keys(record.nets)[0] ?? "supply", reason });
  }
  return gaps;
}

/** Solves every variant the risk checks judge, under the request's one budget. */
export function solveRiskVariants(
  record: TeardownRecord,
  analysis: CircuitAnalysis,
  req: RiskVariantRequest,
): RiskVariants {
  const { budget } = req;
  const outcome: SolverOutcome<SolvedCircuit> = req.nominal
    ? { ok: true, value: req.nominal }
    : solveVariant(record, analysis.supply, budget);
  const solved = outcome.ok ? outcome.value : null;
  const solveFailure = outcome.ok
    ? null
    : `the steady cycle could not be re-solved (${outcome.error.code}: ${outcome.error.message}); discharge, surge and measurement checks were skipped`;
  const paths = traceSupplyPaths(buildCircuitGraph(record));
  const plugged = paths.lineNets.length > 0;
  const pinCapacitanceF = pinCapacitance(analysis);
  const unplug =
    solved !== null && plugged && paths.neutralNets.length > 0 && pinCapacitanceF > req.unplugAboveF
      ? simulateUnplug(solved, req.unplugDelayS, budget)
      : null;
  const watch = new Set(record.parts.filter((p) => SURGE_KINDS.has(p.kind)).map((p) => p.ref));
  const plugIn =
    solved !== null && plugged && watch.size > 0
      ? simulateCrestSwitchOn(solved, watch, budget)
      : null;
  const compared = compareMeasurements(record, {
    seed: req.seed,
    samples: req.samples,
    budget,
    reuse: solved ? { supply: analysis.supply, solved } : null,
  });
  const hints = new Map<number, MismatchHint>();
  compared.checks.forEach((chk, k) => {
    if (chk.comparison.verdict === "agrees") return;
    hints.set(
      k,
      mismatchHint(record, chk.supply, chk.nominal, chk.figure, chk.comparison.measured, budget),
    );
  });
  return {
    solved,
    solveFailure,
    pinCapacitanceF,
    unplug,
    plugIn,
    checks: compared.checks,
    hints,
    assumptions: compared.assumptions,
    notes: compared.notes,
    unfinished: budgetSpent(budget) ? bandsCutShort(record, compared.checks, req.samples) : [],
  };
}
