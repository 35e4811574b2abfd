"use client";
/**
 * The analysis's state above everything it found: queued, running, done (with complete, partial
 * or not solved beside it) or failed with its reason and stage, and a note when the figures shown
 * come from an older engine's finished analysis while this engine's is pending.
 */
import { when } from "../si-units";
import type { AnalysisView, EntryState } from "../../../client/api-types";
import css from "../entry.module.css";

/**
 * The analysis the page shows: this engine's when done, or running with its nominal part stored
 * (the variants still to come), else an older finished one, else null.
 */
export function shownAnalysis(state: EntryState): AnalysisView | null {
  const { analysis, olderAnalysis } = state;
  return analysis?.state === "done" || (analysis?.state === "running" && analysis.result)
    ? analysis
    : olderAnalysis?.state === "done"
      ? olderAnalysis
      : null;
}

/** The state line, with data-testid="analysis-state" holding queued, running, done or failed. */
export function AnalysisStateLine({ analysis }: { analysis: AnalysisView | null }) {
  const state = analysis?.state ?? "queued";
  const cls =
    state === "done" ? css.stateDone : state === "failed" ? css.stateFailed : css.stateWaiting;
  const detail =
    analysis === null
      ? "waiting for the analysis job"
      : state === "queued"
        ? `since ${when(analysis.queuedAt)}`
        : state === "running"
          ? `started ${when(analysis.startedAt)}`
          : `finished ${when(analysis.finishedAt)}`;
  // A finished analysis that left something out, or found no solution, is never a clean "done".
  const status = state === "done" ? (analysis?.result?.status ?? null) : null;
  // The nominal part is shown while the worker still runs the variants (bands, hints, unplug,
  // plug-in), and kept when the hard stop ended them.
  const variants =
    (state === "done" || state === "running") && analysis?.result?.status === "partial"
      ? (analysis.result.variants ?? null)
      : null;
  const outcomeCls =
    status === "not-solved" ? css.stateFailed : status === "partial" ? css.statePartial : cls;
  return (
    <div className={css.row}>
      <span className={`${css.state} ${status !== null ? outcomeCls : cls}`}>
        Analysis: <span data-testid="analysis-state">{state}</span>
        {status !== null ? (
          <span data-testid="analysis-outcome">
            {" "}
            · {status === "not-solved" ? "not solved" : status}
          </span>
        ) : null}
        {variants !== null ? (
          <span data-testid="analysis-variants" title={variants.reason}>
            {" "}
            · {variants.state === "pending" ? "variants pending" : "variants stopped"}
          </span>
        ) : null}
      </span>
      <span className={css.meta}>
        {detail}
        {analysis ? ` · engine ${analysis.engineVersion}` : ""}
        {state === "queued" || state === "running" ? " · this page updates by itself" : ""}
      </span>
    </div>
  );
}

/** The state line, a failure's reason, and the older-engine note. */
export function AnalysisPanel({ state }: { state: EntryState }) {
  const { analysis } = state;
  const shown = shownAnalysis(state);
  return (
    <>
      <AnalysisStateLine analysis={analysis} />
      {analysis?.state === "failed" ? (
        <div className={css.failure} role="alert" data-testid="analysis-failure">
          <strong>The analysis failed</strong>
          {analysis.stage ? (
            <>
              {" "}
              at the <code className={css.code}>{analysis.stage}</code> stage
            </>
          ) : null}
          : {analysis.error ?? "no reason was recorded"}
        </div>
      ) : null}
      {shown !== null && shown !== analysis ? (
        <p className={css.notice} data-testid="older-analysis">
          Analysed by an older engine ({shown.engineVersion}),{" "}
          {analysis === null
            ? "re-analysis not queued yet (npm run reanalyze queues it)"
            : analysis.state === "failed"
              ? "and the re-analysis failed (above)"
              : "re-analysis queued"}
          ; shown until this engine&apos;s analysis is done.
        </p>
      ) : null}
      {shown !== null && shown.result === null ? (
        <div className={css.failure} role="alert" data-testid="analysis-unreadable">
          <strong>This analysis cannot be shown</strong>: it was stored by an older engine (
          {shown.engineVersion}) in a shape this version does not read (
          {shown.resultProblem ?? "unknown shape"}). It is shown again once it is re-analysed.
        </div>
      ) : null}
    </>
  );
}
