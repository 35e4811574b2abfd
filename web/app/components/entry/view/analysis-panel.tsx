"use client";
/**
 * The analysis of the shown revision: its state (queued, running, done, failed with reason and
 * stage), then, once done, what the analysis says about itself (complete, partial, not solved)
 * beside the input figures, the schematic, flags, per-part and per-net tables, triggers,
 * waveforms, measured against predicted, blocks and checks.
 */
import type { ReactNode } from "react";
import { SafetyCaution } from "../../safety-caution";
import { when } from "../si-units";
import type { AnalysisView, EntryState } from "../../../client/api-types";
import { AnalysisStatus, leftOutOf } from "./analysis-status";
import { FlagsList } from "./flags-list";
import { obj } from "./result-access";
import {
  BlocksList,
  ChecksList,
  ComparisonsTable,
  InputFigures,
  NetFiguresTable,
  PartFiguresTable,
  TriggersTable,
} from "./result-tables";
import { SchematicView } from "./schematic-view";
import { WaveformPlots } from "./waveform-plot";
import css from "../entry.module.css";

function Section({ title, children, hint }: { title: string; children: ReactNode; hint?: string }) {
  return (
    <section className={css.section}>
      <div className={css.sectionHead}>
        <h2>{title}</h2>
        {hint ? <span className={css.hint}>{hint}</span> : null}
      </div>
      {children}
    </section>
  );
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
      </span>
      <span className={css.meta}>
        {detail}
        {analysis ? ` · engine ${analysis.engineVersion}` : ""}
        {state === "queued" || state === "running" ? " · this page updates by itself" : ""}
      </span>
    </div>
  );
}

/** Everything a finished analysis shows. */
export function AnalysisResults({
  analysis,
  record,
  onComment,
}: {
  analysis: AnalysisView;
  record: Record<string, unknown>;
  onComment?: (ref: string) => void;
}) {
  const typed = analysis.result ?? null;
  if (typed === null)
    return (
      <div className={css.failure} role="alert" data-testid="analysis-unreadable">
        <strong>This analysis cannot be shown</strong>: it was stored by an older engine (
        {analysis.engineVersion}) in a shape this version does not read (
        {analysis.resultProblem ?? "unknown shape"}). It is shown again once it is re-analysed.
      </div>
    );
  const result = obj(typed);
  const leftOut = leftOutOf(typed);
  const notSolved = typed.status === "not-solved" ? typed.reason : null;
  const figures = (body: ReactNode) =>
    notSolved === null ? body : <p className={css.missing}>Not computed: {notSolved}.</p>;
  return (
    <>
      <AnalysisStatus result={typed} upgradedFrom={analysis.upgradedFrom ?? null} />
      <Section title="Input figures">
        <SafetyCaution />
        {figures(<InputFigures result={result} />)}
      </Section>
      <Section
        title="Schematic"
        hint="laid out from the traced netlist; line and neutral drawn in their own colours"
      >
        <SchematicView layout={analysis.layout} />
      </Section>
      <Section title="Flags">
        {notSolved === null ? (
          <FlagsList flags={typed.flags} {...(onComment ? { onPart: onComment } : {})} />
        ) : (
          <p className={css.missing}>
            No figure-based flag could be checked: the circuit was not solved.
          </p>
        )}
      </Section>
      <Section
        title="Parts"
        hint="peak voltage across each part, RMS and mean current through it and mean dissipation, in the steady cycle"
      >
        <PartFiguresTable
          result={result}
          record={record}
          leftOut={leftOut.parts}
          {...(onComment ? { onComment } : {})}
        />
      </Section>
      <Section title="Nets" hint="voltages against the neutral">
        <NetFiguresTable result={result} record={record} leftOut={leftOut.nets} />
      </Section>
      <Section title="Triggers">{figures(<TriggersTable result={result} />)}</Section>
      <Section title="Waveforms" hint="one steady mains cycle">
        {figures(<WaveformPlots waveforms={result.waveforms} />)}
      </Section>
      <Section
        title="Measured against predicted"
        hint="the band covers the parts' tolerances and the stated uncertainty"
      >
        {figures(<ComparisonsTable result={result} record={record} />)}
      </Section>
      <Section title="Blocks">
        <BlocksList result={result} />
      </Section>
      <Section title="Checks and warnings">
        <ChecksList result={result} />
      </Section>
    </>
  );
}

/** The state, a failure's reason, and the results of the current (or an older finished) analysis. */
export function AnalysisPanel({
  state,
  onComment,
}: {
  state: EntryState;
  onComment?: (ref: string) => void;
}) {
  const { analysis, olderAnalysis } = state;
  const shown =
    analysis?.state === "done" ? analysis : olderAnalysis?.state === "done" ? olderAnalysis : null;
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
      {shown !== null ? (
        <AnalysisResults
          analysis={shown}
          record={state.revision.record}
          {...(onComment ? { onComment } : {})}
        />
      ) : null}
    </>
  );
}
