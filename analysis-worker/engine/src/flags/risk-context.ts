/**
 * What every risk check reads: the record, the solver's analysis at the analysed supply, the
 * variants solved before the checks (figures/risk-variants.ts: the steady cycle, unplugging,
 * plug-in, bands and hints), the conducting connections and the supply chains. Nothing here
 * runs a simulation.
 */
import type { Assumption } from "../record/gaps-and-assumptions.js";
import type { TeardownRecord } from "../record/types.js";
import type { CircuitAnalysis, SolvedCircuit } from "../figures/analyze-circuit.js";
import type { RiskVariants } from "../figures/risk-variants.js";
import { buildCircuitGraph } from "../graph/circuit-graph.js";
import type { SupplyPaths } from "../blocks/supply-path.js";
import { traceSupplyPaths } from "../blocks/supply-path.js";
import { findBlocks } from "../blocks/find-blocks.js";
import type { GalvanicEdge } from "./galvanic-paths.js";
import { galvanicEdges, galvanicReach } from "./galvanic-paths.js";

/** The shared inputs of the risk checks. */
export interface RiskContext {
  record: TeardownRecord;
  analysis: CircuitAnalysis;
  /** The steady cycle at the analysed supply, or null when it could not be solved (checks that need it are skipped). */
  solved: SolvedCircuit | null;
  /** The solved variants: unplugging, plug-in, bands and hints. */
  variants: RiskVariants;
  edges: GalvanicEdge[];
  supplyNets: Set<string>;
  /** Nets with a conducting path to line or neutral. */
  mainsConnected: Set<string>;
  /** Nets declared accessible, and every net with a conducting path to one. */
  touchable: Set<string>;
  paths: SupplyPaths;
  /**
   * Capacitors in series with the supply: on the first run from a supply net, or a capacitive
   * dropper's capacitors found on any branch (a dropper behind a surge resistor on a board with
   * several branches is still in series with the supply).
   */
  seriesCapacitors: Set<string>;
  /** Defaults the checks chose where the record was silent (one per part and field). */
  assumptions: Assumption[];
  /** Checks skipped or not applicable, and why. */
  notes: string[];
}

/** Builds the context from the analysis and the variants solved before it. */
export function riskContext(
  record: TeardownRecord,
  analysis: CircuitAnalysis,
  variants: RiskVariants,
): RiskContext {
  const edges = galvanicEdges(record);
  const names = Object.keys(record.nets);
  const supplyNets = new Set(
    names.filter((n) => record.nets[n]!.role === "line" || record.nets[n]!.role === "neutral"),
  );
  const accessible = names.filter((n) => record.nets[n]!.accessible);
  const paths = traceSupplyPaths(buildCircuitGraph(record));
  return {
    record,
    analysis,
    solved: variants.solved,
    variants,
    edges,
    supplyNets,
    mainsConnected: galvanicReach(edges, supplyNets),
    touchable: galvanicReach(edges, accessible),
    paths,
    seriesCapacitors: seriesCapacitorsOf(record, paths),
    assumptions: [],
    notes: [],
  };
}

/** Records a default once per part and field, however many checks use it. */
export function assume(ctx: RiskContext, a: Assumption | null): void {
  if (a === null) return;
  if (ctx.assumptions.some((x) => x.part === a.part && x.field === a.field)) return;
  ctx.assumptions.push(a);
}

/** One steady cycle of a net's voltage against the analysis reference (uniform samples), or null for a net the solver left out. */
export function netWave(ctx: RiskContext, net: string): number[] | null {
  const series = ctx.analysis.waveforms.series[`net.${net}`];
  if (series !== undefined) return series;
  const ref = ctx.analysis.nets[net];
  if (ref !== undefined && ref.peak === 0 && ref.rms === 0)
    return ctx.analysis.waveforms.t.map(() => 0);
  return null;
}

/** RMS and peak of V(a) - V(b) over the steady cycle, or null when a net is not solved. */
export function voltageBetween(
  ctx: RiskContext,
  a: string,
  b: string,
): { rms_v: number; peak_v: number } | null {
  const va = netWave(ctx, a);
  const vb = netWave(ctx, b);
  if (va === null || vb === null || va.length === 0) return null;
  let sq = 0;
  let peak = 0;
  for (let k = 0; k < va.length; k++) {
    const d = va[k]! - vb[k]!;
    sq += d * d;
    peak = Math.max(peak, Math.abs(d));
  }
  return { rms_v: Math.sqrt(sq / va.length), peak_v: peak };
}

/** Rounds a number for messages (3 significant figures). */
export function sig3(x: number): string {
  return Number(x.toPrecision(3)).toString();
}

function seriesCapacitorsOf(record: TeardownRecord, paths: SupplyPaths): Set<string> {
  const kindOf = new Map(record.parts.map((p) => [p.ref, p.kind]));
  const onChains = paths.chains.flatMap((c) =>
    c.steps.flatMap((s) => s.parts.filter((p) => p.kind === "capacitor").map((p) => p.ref)),
  );
  const inDroppers = findBlocks(record)
    .filter((b) => b.kind === "capacitive-dropper")
    .flatMap((b) => b.parts.filter((ref) => kindOf.get(ref) === "capacitor"));
  return new Set([...onChains, ...inDroppers]);
}
