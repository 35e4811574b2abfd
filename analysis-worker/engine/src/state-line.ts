/**
 * The one-line account of an analysis that the entry page and the readable report both start
 * with: "partial: 2 parts left out (HT1: load without a resistance; U1: unknown kind)". One
 * wording in one place, so the page and the command line never disagree.
 */
import type { AnalysisResult } from "./analysis-result.js";
import type { Gap } from "./record/gaps-and-assumptions.js";

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** "HT1: load without a resistance; net X: …" */
export function gapsText(gaps: readonly Gap[]): string {
  return gaps
    .map((g) => (g.part !== undefined ? `${g.part}: ${g.reason}` : `net ${g.net}: ${g.reason}`))
    .join("; ");
}

/** The state line of a stored result. */
export function analysisStateLine(result: AnalysisResult): string {
  const assumed =
    result.assumptions.length > 0
      ? `; ${plural(result.assumptions.length, "default", "defaults")} assumed where the record is silent`
      : "";
  if (result.status === "not-solved") return `not solved: ${result.reason}`;
  if (result.status === "complete") return `complete: every part simulated${assumed}`;
  const parts = result.gaps.filter((g) => g.part !== undefined).length;
  const nets = result.gaps.length - parts;
  const counted = [
    parts > 0 ? plural(parts, "part", "parts") : "",
    nets > 0 ? plural(nets, "net", "nets") : "",
  ]
    .filter(Boolean)
    .join(" and ");
  const unsettled =
    result.solver.converged === false
      ? "the steady state was not reached within the time budget, so the figures are those of the last cycle computed"
      : "";
  const leftOut = counted ? `${counted} left out (${gapsText(result.gaps)})` : "";
  return `partial: ${[leftOut, unsettled].filter(Boolean).join("; ")}${assumed}`;
}
