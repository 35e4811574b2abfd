"use client";
/**
 * What a finished analysis says about itself, above its figures: the state line ("partial: 2
 * parts left out (…)"), each part or net left out and why, the defaults it assumed (collapsed),
 * and whether it was written by an older engine. A reader sees what the figures stand on before
 * reading them.
 */
import { analysisStateLine, type AnalysisResult } from "@teardown/engine";
import type { EntryResult } from "../../../client/api-types";
import css from "../entry.module.css";

const STATUS_CLASS = {
  complete: css.statusComplete,
  partial: css.statusPartial,
  "not-solved": css.statusNotSolved,
} as const;

/** Parts and nets left out, by name, with why (for the tables' "left out" cells). */
export function leftOutOf(result: EntryResult | null): {
  parts: Map<string, string>;
  nets: Map<string, string>;
} {
  const parts = new Map<string, string>();
  const nets = new Map<string, string>();
  for (const g of result?.gaps ?? [])
    if (g.part !== undefined) parts.set(g.part, g.reason);
    else nets.set(g.net, g.reason);
  return { parts, nets };
}

/** The state line with its gaps and assumptions; data-status holds the status. */
export function AnalysisStatus({
  result,
  upgradedFrom,
}: {
  result: EntryResult;
  upgradedFrom: string | null;
}) {
  return (
    <div
      className={`${css.status} ${STATUS_CLASS[result.status]}`}
      data-testid="analysis-status"
      data-status={result.status}
      role={result.status === "complete" ? undefined : "status"}
    >
      <p className={css.statusLine} data-testid="analysis-status-line">
        {/* The state line reads the status, gaps and assumptions, never the waveforms the entry read leaves out. */}
        {analysisStateLine(result as AnalysisResult)}
      </p>
      {result.status === "not-solved" ? (
        <p className={css.meta}>
          The schematic, blocks and checks below are from the traced netlist; no voltage, current or
          dissipation was computed, and no risk flag that needs them was raised.
        </p>
      ) : result.status === "partial" ? (
        <p className={css.meta}>
          The figures below leave these out: the parts are not in the simulation, so the line
          current and every figure near them may differ from the real board. Give the missing values
          in a new revision to complete the analysis.
        </p>
      ) : null}
      {upgradedFrom !== null ? (
        <p className={css.meta} data-testid="older-engine">
          Analysed by an older engine ({upgradedFrom}), which did not record what it left out or
          assumed; the figures are shown as it stored them.
        </p>
      ) : null}
      {result.assumptions.length > 0 ? (
        <details data-testid="assumptions">
          <summary>
            {result.assumptions.length} default{result.assumptions.length === 1 ? "" : "s"} assumed
            where the record is silent
          </summary>
          <table className={css.table}>
            <thead>
              <tr>
                <th>Part</th>
                <th>Field</th>
                <th>Value used</th>
                <th>Why</th>
              </tr>
            </thead>
            <tbody>
              {result.assumptions.map((a, i) => (
                <tr key={i}>
                  <td>
                    <strong>{a.part}</strong>
                  </td>
                  <td className={css.code}>{a.field}</td>
                  <td>
                    {typeof a.value === "number" ? String(Number(a.value.toPrecision(4))) : a.value}
                  </td>
                  <td>{a.why}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </details>
      ) : null}
    </div>
  );
}
