/**
 * The computed figures of two analyses side by side: the input figures, each paired part's
 * dissipation and stress (and those of parts on one board only), and the firing angles of
 * thyristors and triacs. Difference is B − A and ratio B / A, each null when a side is missing
 * (or A is zero, for the ratio).
 */
import type { AnalysisResult, SolvedResult } from "../analysis-result.js";
import type { PartPairing } from "./part-pairs.js";

/** One figure of both boards. `refs` says which parts a part or firing figure belongs to. */
export interface FigureRow {
  what: string;
  unit: string;
  refs: { a: string | null; b: string | null } | null;
  a: number | null;
  b: number | null;
  difference: number | null;
  ratio: number | null;
}

/** Input figures compared, in this order; `thd` and `power_factor` are plain fractions. */
const INPUT_FIGURES = [
  ["current_rms", "A"],
  ["power", "W"],
  ["apparent_power", "VA"],
  ["power_factor", "1"],
  ["thd", "1"],
] as const;

/** Per-part figures compared: dissipation, then the stress (peak voltage, RMS current). */
const PART_FIGURES = [
  ["power", "W"],
  ["voltage_peak", "V"],
  ["current_rms", "A"],
] as const;

/** Firing figures of a thyristor or triac. */
const TRIGGER_FIGURES = [
  ["angle_deg", "°"],
  ["angle_negative_deg", "°"],
  ["min_supply_vrms", "V"],
] as const;

/** A row with its difference and ratio. */
export function figureRow(
  what: string,
  unit: string,
  refs: FigureRow["refs"],
  a: number | null,
  b: number | null,
): FigureRow {
  const both = a !== null && b !== null;
  return {
    what,
    unit,
    refs,
    a,
    b,
    difference: both ? b - a : null,
    ratio: both && a !== 0 ? b / a : null,
  };
}

function solved(r: AnalysisResult | null): SolvedResult | null {
  return r !== null && r.status !== "not-solved" ? r : null;
}

/** Every figure row of the comparison (rows where both sides are unknown are left out). */
export function figureRows(
  ra: AnalysisResult | null,
  rb: AnalysisResult | null,
  pairing: PartPairing,
): FigureRow[] {
  const a = solved(ra);
  const b = solved(rb);
  const rows: FigureRow[] = [];
  const push = (row: FigureRow): void => {
    if (row.a !== null || row.b !== null) rows.push(row);
  };
  for (const [key, unit] of INPUT_FIGURES)
    push(figureRow(`input.${key}`, unit, null, a?.input[key] ?? null, b?.input[key] ?? null));

  const partRows = (refA: string | null, refB: string | null): void => {
    const fa = refA === null ? undefined : a?.parts[refA];
    const fb = refB === null ? undefined : b?.parts[refB];
    for (const [key, unit] of PART_FIGURES)
      push(
        figureRow(`part.${key}`, unit, { a: refA, b: refB }, fa?.[key] ?? null, fb?.[key] ?? null),
      );
  };
  for (const p of pairing.pairs) partRows(p.a, p.b);
  for (const ref of pairing.onlyA) partRows(ref, null);
  for (const ref of pairing.onlyB) partRows(null, ref);

  const partnerOfA = new Map(pairing.pairs.map((p) => [p.a, p.b]));
  const triggersB = new Map((b?.triggers ?? []).map((t) => [t.part, t]));
  const seenB = new Set<string>();
  for (const ta of a?.triggers ?? []) {
    const refB = partnerOfA.get(ta.part) ?? null;
    const tb = refB === null ? undefined : triggersB.get(refB);
    if (tb !== undefined) seenB.add(tb.part);
    for (const [key, unit] of TRIGGER_FIGURES)
      push(
        figureRow(
          `firing.${key}`,
          unit,
          { a: ta.part, b: tb?.part ?? null },
          ta[key],
          tb?.[key] ?? null,
        ),
      );
  }
  for (const tb of b?.triggers ?? []) {
    if (seenB.has(tb.part)) continue;
    const refA = pairing.pairs.find((p) => p.b === tb.part)?.a ?? null;
    for (const [key, unit] of TRIGGER_FIGURES)
      push(figureRow(`firing.${key}`, unit, { a: refA, b: tb.part }, null, tb[key]));
  }
  return rows;
}

/** Flag codes raised on one board only or on both (each code once, sorted). */
export function flagSets(
  ra: AnalysisResult | null,
  rb: AnalysisResult | null,
): { onlyA: string[]; onlyB: string[]; both: string[] } {
  const codes = (r: AnalysisResult | null): Set<string> =>
    new Set((r?.flags ?? []).map((f) => f.code));
  const a = codes(ra);
  const b = codes(rb);
  const sorted = (xs: Iterable<string>): string[] => [...xs].sort();
  return {
    onlyA: sorted([...a].filter((c) => !b.has(c))),
    onlyB: sorted([...b].filter((c) => !a.has(c))),
    both: sorted([...a].filter((c) => b.has(c))),
  };
}
