/**
 * A what-if analysis: the entry's record with some part values changed, at another supply or its
 * own, analysed in full (the result has the stored result's shape). When a thyristor or triac
 * that fires at the rated supply does not fire at the what-if supply, or fires later, its
 * trigger says how it fires at the rated supply (`rated`) and suggests the gate-feed resistor
 * value that restores it (`suggestion`), or says why there is none (`suggestion_note`).
 *
 * "At the rated supply" means the record as traced, without the what-if's changes: the figure a
 * practitioner compares against is what the gadget does on the supply it was built for.
 */
import { analyzeRecord, type AnalysisOutcome } from "../analyze.js";
import type { AnalysisResult, SolvedResult } from "../analysis-result.js";
import { firingFigures } from "../figures/circuit-figures.js";
import type { InputError, Supply, TeardownRecord } from "../record/types.js";
import { solveCircuit } from "../solver/analyze-circuit.js";
import { formatValue } from "../values/format-value.js";
import { firesAsWell, firingOf, suggestGateFeed, type FiringAt } from "./gate-feed-suggestion.js";
import { checkWhatIf, type WhatIfRequest } from "./what-if-input.js";

export interface WhatIfOptions {
  /** A clock; without one only the solver's step cap bounds the run. */
  now?: () => number;
  /** The most the whole what-if (analysis and suggestion search) may take, in ms of `now`. */
  budgetMs?: number;
}

export type WhatIfOutcome =
  | { ok: false; kind: "input"; errors: InputError[] }
  | { ok: false; kind: "analysis"; stage: string; code: string; message: string }
  | { ok: true; result: AnalysisResult };

const supplyText = (s: Supply) => `${s.vrms} V ${s.hz} Hz`;
const degText = (a: number | null) => (a === null ? "an unknown angle" : `${a.toFixed(1)}°`);

/** The whole what-if: check the request, analyse the variant, add the trigger suggestions. */
export async function analyzeWhatIf(
  record: TeardownRecord,
  req: WhatIfRequest,
  opts: WhatIfOptions = {},
): Promise<WhatIfOutcome> {
  const checked = checkWhatIf(record, req);
  if (!checked.ok) return { ok: false, kind: "input", errors: checked.errors };
  const { supply } = checked.value;
  const now = opts.now;
  const deadline = now && opts.budgetMs !== undefined ? now() + opts.budgetMs : Infinity;
  const left = () => (now ? Math.max(0, deadline - now()) : undefined);
  const outcome: AnalysisOutcome = await analyzeRecord(checked.value.record, {
    now: now ?? (() => 0),
    supply,
    ...(left() !== undefined && Number.isFinite(left()!) ? { budgetMs: left() } : {}),
  });
  if (!outcome.ok)
    return {
      ok: false,
      kind: "analysis",
      stage: outcome.stage,
      code: outcome.code,
      message: outcome.message,
    };
  const result = outcome.output.result;
  if (result.status === "not-solved") return { ok: true, result };
  return {
    ok: true,
    result: withSuggestions(record, checked.value.record, result, supply, { now, deadline }),
  };
}

/** Adds `rated` and a suggestion to each trigger that fires at the rated supply but not as well here. */
function withSuggestions(
  record: TeardownRecord,
  variant: TeardownRecord,
  result: SolvedResult,
  supply: Supply,
  clock: { now: (() => number) | undefined; deadline: number },
): SolvedResult {
  const rated = record.device.rated_supply;
  const atRated = rated.vrms === supply.vrms && rated.hz === supply.hz;
  if (result.triggers.length === 0 || atRated) return result;
  const budgetLeft = () =>
    clock.now && Number.isFinite(clock.deadline)
      ? { now: clock.now, budgetMs: Math.max(0, clock.deadline - clock.now()) }
      : clock.now
        ? { now: clock.now }
        : {};
  // How each device fires on the traced record at its rated supply: one steady state.
  const ratedSolve = solveCircuit(record, { supply: rated, minSupply: false, ...budgetLeft() });
  if (!ratedSolve.ok) return result;
  const ratedFigures = firingFigures(ratedSolve.value.circuit, ratedSolve.value.steady);
  const notes: string[] = [];
  const triggers: SolvedResult["triggers"] = [];
  for (const t of result.triggers) {
    const ratedF: FiringAt = firingOf(ratedFigures.find((f) => f.part === t.part));
    const here: FiringAt = firingOf({
      part: t.part,
      fires: t.fires,
      angle_deg: t.angle_deg,
      angle_negative_deg: t.angle_negative_deg,
      halves: { positive: t.angle_deg !== null, negative: t.angle_negative_deg !== null },
    });
    const withRated = { ...t, rated: { fires: ratedF.fires, angle_deg: ratedF.latest_deg } };
    if (!ratedF.fires || firesAsWell(here, ratedF)) {
      triggers.push(withRated);
      continue;
    }
    const lead = t.fires
      ? `${t.part} fires later at ${supplyText(supply)} (${degText(here.latest_deg)}) than at the rated ${supplyText(rated)} (${degText(ratedF.latest_deg)})`
      : `${t.part} fires at the rated ${supplyText(rated)} (at ${degText(ratedF.latest_deg)}) but does not fire at ${supplyText(supply)}`;
    const found = suggestGateFeed(variant, t.part, supply, ratedF, budgetLeft());
    if (found.ok) {
      const s = found.suggestion;
      notes.push(
        `${lead}; with ${s.part} at ${formatValue(s.value, "Ω")} (${s.series}) it fires at ${degText(s.angle_deg)}.`,
      );
      triggers.push({ ...withRated, suggestion: s });
    } else {
      notes.push(`${lead}; ${found.note}.`);
      triggers.push({ ...withRated, suggestion_note: found.note });
    }
  }
  return { ...result, triggers, risk_notes: [...result.risk_notes, ...notes] };
}
