/**
 * The whole stored analysis result as one zod schema and its TypeScript type. The engine builds
 * it (analyze.ts), the worker checks it before writing, and the web app and the worker parse it
 * when they read it back (`parseStoredResult`), instead of reading fields one by one.
 *
 * The result is split by status: `complete` and `partial` carry the solved figures; `not-solved`
 * carries no input figures at all, only why, plus what every analysis keeps (blocks, checks,
 * series and the gaps).
 */
import { z } from "zod";
import { BLOCK_KINDS } from "./blocks/block-types.js";
import { FLAG_CODES } from "./flags/flag-types.js";
import type { Gap } from "./record/gaps-and-assumptions.js";

// JSON has no NaN or Infinity (JSON.stringify writes null), so a figure the solver could not
// compute reads back as null; the page says "not computed" for it rather than blank or zero.
const Figure = z.number().nullable();

// Typed as the shared `Gap`, so `gap.part ?? gap.net` reads the same on both sides.
export const GapSchema: z.ZodType<Gap> = z.union([
  z.object({ part: z.string().min(1), reason: z.string().min(1) }),
  z.object({ net: z.string().min(1), reason: z.string().min(1) }),
]) as z.ZodType<Gap>;

export const AssumptionSchema = z.object({
  part: z.string(),
  field: z.string(),
  value: z.union([z.number(), z.string()]),
  why: z.string(),
});

export const EvidenceSchema = z.object({
  label: z.string(),
  value: z.union([z.number(), z.string(), z.null()]),
  unit: z.string(),
});

const SupplySchema = z.object({ vrms: z.number(), hz: z.number() });

const InputFiguresSchema = z.object({
  current_rms: Figure,
  power: Figure,
  apparent_power: Figure,
  power_factor: Figure,
  thd: Figure,
  /** RMS magnitude of each line-current harmonic, order 1 up (absent in older results). */
  harmonics: z.array(z.object({ order: z.number().int().positive(), rms: Figure })).optional(),
});

const PartFiguresSchema = z.object({
  voltage_peak: Figure,
  current_rms: Figure,
  current_dc: Figure,
  power: Figure,
});

const NetFiguresSchema = z.object({ dc: Figure, rms: Figure, peak: Figure });

/** A what-if's proposed gate-feed resistor (see what-if/gate-feed-suggestion.ts). */
const GateFeedSuggestionSchema = z.object({
  part: z.string(),
  value: z.number().positive(),
  series: z.string(),
  angle_deg: Figure,
});

/** A trigger in one steady state: whether, where and how often it fires. */
const StateTriggerSchema = z.object({
  part: z.string(),
  fires: z.boolean(),
  angle_deg: Figure,
  angle_negative_deg: Figure,
  /** Firings per mains cycle over the repeating window (1/3: once every three cycles). */
  firings_per_cycle: Figure,
});

const TriggerSchema = z.object({
  part: z.string(),
  fires: z.boolean(),
  angle_deg: Figure,
  angle_negative_deg: Figure,
  /** Lowest supply at which it keeps firing while running, as the supply sags. */
  min_supply_vrms: Figure,
  /** Lowest supply at which it starts firing from cold (absent in results before engine 1.4.0). */
  min_supply_cold_vrms: Figure.optional(),
  /** The trigger in the state kept while running, present only when that state differs from the cold start's. */
  running: StateTriggerSchema.optional(),
  /** What-if runs only: whether it fires at the rated supply, and at what angle. */
  rated: z.object({ fires: z.boolean(), angle_deg: Figure }).optional(),
  /** What-if runs only, when it fires at the rated supply but not here: what to change, or why nothing found. */
  suggestion: GateFeedSuggestionSchema.optional(),
  suggestion_note: z.string().optional(),
});

/** One steady state named by where it started: from rest (`cold`) or kept while running. */
const StartStateSchema = z.object({
  start: z.enum(["cold", "running"]),
  /** The supply the running state came down from; null for the cold start. */
  from_vrms: Figure,
  period_cycles: z.number().int().positive(),
  input: InputFiguresSchema,
  triggers: z.array(StateTriggerSchema),
});

const PhasorSchema = z.object({ re: Figure, im: Figure, rms: Figure, phase_deg: Figure });

const LinearSchema = z.object({
  supply: SupplySchema,
  input_current: PhasorSchema,
  nets: z.record(z.string(), PhasorSchema),
  parts: z.record(z.string(), PhasorSchema),
  linearised: z.array(z.string()),
});

// Loose: a flag may carry more than this (a rating basis, say) and a reader must not drop it.
export const StoredFlagSchema = z.looseObject({
  code: z.enum(FLAG_CODES),
  severity: z.enum(["danger", "warning", "info"]),
  parts: z.array(z.string()),
  nets: z.array(z.string()),
  message: z.string(),
  evidence: z.array(EvidenceSchema),
  source: z.string(),
  source_id: z.string(),
  caution: z.string(),
});

const ComparisonSchema = z.object({
  measurement: z.number().int(),
  what: z.string(),
  measured: z.number(),
  predicted: Figure,
  low: Figure,
  high: Figure,
  verdict: z.enum(["agrees", "disagrees"]),
});

const BlockSchema = z.object({ kind: z.enum(BLOCK_KINDS), parts: z.array(z.string()) });

const CheckSchema = z.object({
  code: z.string(),
  severity: z.enum(["error", "warning", "info"]),
  message: z.string(),
  parts: z.array(z.string()),
  nets: z.array(z.string()),
});

const WaveformsSchema = z.object({
  t: z.array(Figure),
  series: z.record(z.string(), z.array(Figure)),
});

const SolverInfoSchema = z.object({
  method: z.enum(["cycles", "shooting"]),
  cycles: z.number(),
  steps: z.number(),
  assumptions: z.array(z.string()),
  notes: z.array(z.string()),
  kcl_residual_amps: Figure,
  periodic_residual: Figure,
  gmin_siemens: z.number(),
  /** False when the periodic steady state was not reached (absent in older results: unknown). */
  converged: z.boolean().optional(),
});

/** What every analysis keeps, solved or not. */
const CommonFields = {
  engine: z.string(),
  supply: SupplySchema,
  gaps: z.array(GapSchema),
  assumptions: z.array(AssumptionSchema),
  flags: z.array(StoredFlagSchema),
  blocks: z.array(BlockSchema),
  checks: z.array(CheckSchema),
  /** Each valued part's smallest IEC 60063 series, or null when its value is on none. */
  series: z.record(z.string(), z.string().nullable()),
};

/** The solved figures (complete and partial results). */
const SolvedFields = {
  input: InputFiguresSchema,
  parts: z.record(z.string(), PartFiguresSchema),
  nets: z.record(z.string(), NetFiguresSchema),
  triggers: z.array(TriggerSchema),
  /**
   * The cold-start and the running steady state, present only when they differ (a pulse stage
   * that settles into another firing pattern); the other figures are the cold start's.
   */
  steady_states: z.array(StartStateSchema).optional(),
  waveforms: WaveformsSchema,
  linear: LinearSchema,
  solver: SolverInfoSchema,
  comparisons: z.array(ComparisonSchema),
  /** Free-text notes of the risk assessment that are not defaults (those are assumptions). */
  risk_notes: z.array(z.string()),
  /**
   * Present only while the variants (lowest firing supply, bands, hints, unplug, plug-in) have
   * not all run: `pending` while the worker still runs them, `stopped` when the worker's hard
   * stop ended them; the reason says what is missing. Absent once they ran (what their own
   * budget cut short is in `gaps`).
   */
  variants: z
    .object({ state: z.enum(["pending", "stopped"]), reason: z.string().min(1) })
    .optional(),
};

export const SolvedResultSchema = z.object({
  status: z.enum(["complete", "partial"]),
  ...CommonFields,
  ...SolvedFields,
});

export const NotSolvedResultSchema = z.object({
  status: z.literal("not-solved"),
  ...CommonFields,
  /** Why there is no solution, in plain words (no supply, or the solver's own failure). */
  reason: z.string().min(1),
  /** The solver's failure code when it ran and failed; null when it was not run. */
  solver_code: z.string().nullable(),
});

/** The stored analysis result, by status. */
export const AnalysisResultSchema = z
  .discriminatedUnion("status", [SolvedResultSchema, NotSolvedResultSchema])
  .superRefine((r, ctx) => {
    // The status is a statement about the gaps and the steady state: partial iff something was
    // left out or the cycle search did not settle.
    if (r.status === "not-solved") return;
    const unsettled = r.solver.converged === false;
    const unfinished = r.variants !== undefined;
    if (r.status === "complete" && (r.gaps.length > 0 || unsettled || unfinished))
      ctx.addIssue({
        code: "custom",
        path: ["status"],
        message: "a complete analysis has no gaps, a settled steady state and every variant run",
      });
    if (r.status === "partial" && r.gaps.length === 0 && !unsettled && !unfinished)
      ctx.addIssue({
        code: "custom",
        path: ["status"],
        message:
          "a partial analysis names at least one gap, an unsettled steady state or variants not run",
      });
  });

export type AnalysisResult = z.infer<typeof AnalysisResultSchema>;
export type SolvedResult = z.infer<typeof SolvedResultSchema>;
export type NotSolvedResult = z.infer<typeof NotSolvedResultSchema>;
export type StoredFlag = z.infer<typeof StoredFlagSchema>;

/** The JSON Schema (draft 2020-12) of the stored analysis result, for the docs and for scripts. */
export function analysisResultJsonSchema(): Record<string, unknown> {
  const schema = z.toJSONSchema(AnalysisResultSchema, {
    target: "draft-2020-12",
    io: "output",
    unrepresentable: "any",
  }) as Record<string, unknown>;
  return { ...schema, $id: "analysis-result-v1.schema.json" };
}
