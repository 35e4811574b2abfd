"use client";
/**
 * The entry page a practitioner works from. At the top: title, team, revision, and the summary
 * of the analysis (its state and gaps, input figures, worst findings, measured-versus-predicted
 * verdicts, the caution once). Then the schematic, with the selected part's figures beside it.
 * Then sections to jump between (findings, parts, nets and waveforms, measurements, what-if, the
 * record, photos, comments, history), one shown at a time. Data comes from the HTTP API through
 * TanStack Query; the first render carries the entry from the server.
 */
import { useMemo, useState, type ReactNode } from "react";
import { ApiFailure, failureText } from "../../../client/http";
import { useEntry, useTeam } from "../entry-queries";
import type { EntryResult, EntryState } from "../../../client/api-types";
import { SchematicViewer } from "../../schematic/schematic-viewer";
import { when } from "../si-units";
import { AnalysisPanel, shownAnalysis } from "./analysis-panel";
import { leftOutOf } from "./analysis-status";
import { CommentsSection } from "./comments-section";
import { EntryActions } from "./entry-actions";
import { EntrySummary } from "./entry-summary";
import { findingsOf, markedParts } from "./finding-text";
import { FindingsList } from "./findings-list";
import { HarmonicsChart } from "./harmonics-chart";
import { MeasurementsSection } from "./measurements-section";
import { PartPanel } from "./part-panel";
import { PhotosSection } from "./photos-section";
import { RecordSection } from "./record-section";
import { arr, obj, type Obj } from "./result-access";
import {
  BlocksList,
  ChecksList,
  NetFiguresTable,
  PartFiguresTable,
  TriggersTable,
} from "./result-tables";
import { RevisionsSection } from "./revisions-section";
import { SectionTabs, useTab, type TabId } from "./section-tabs";
import { StoredWaveforms } from "./stored-waveforms";
import { WhatIfPanel } from "./what-if-panel";
import css from "../entry.module.css";

const EXPORTS = ["record.yaml", "record.json", "analysis.json", "schematic.svg"] as const;

function Block({ title, hint, children }: { title: string; hint?: string; children: ReactNode }) {
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

/** The whole entry page for one entry id. */
export function EntryPage({ entryId, initial }: { entryId: string; initial?: EntryState | null }) {
  const query = useEntry(entryId, initial);
  const state = query.data;
  const isMember = state?.role !== null && state?.role !== undefined;
  const team = useTeam(state?.entry.teamId, isMember);
  const [commentPart, setCommentPart] = useState("");
  const [tab, setTab] = useTab();
  const [selection, setSelection] = useState<{ parts: string[]; nets: string[] }>({
    parts: [],
    nets: [],
  });
  const [focusKey, setFocusKey] = useState(0);
  const shown = state ? shownAnalysis(state) : null;
  const result: EntryResult | null = shown?.result ?? null;
  const findings = useMemo(() => (result ? findingsOf(result.flags) : null), [result]);
  const marks = useMemo(() => markedParts(findings ?? []), [findings]);

  if (query.isPending) return <p className="muted">Loading the entry…</p>;
  if (query.isError || state === undefined) {
    const signedOut =
      query.error instanceof ApiFailure &&
      (query.error.status === 401 || query.error.status === 404);
    return (
      <>
        <h1>Entry not available</h1>
        <p>{failureText(query.error)}</p>
        {signedOut ? (
          <p>
            If it belongs to your team, <a href={`/sign-in?next=/entries/${entryId}`}>sign in</a>{" "}
            first.
          </p>
        ) : null}
      </>
    );
  }
  const { entry, revision, role } = state;
  const canEdit = role === "editor" || role === "owner";
  const record = revision.record;
  const r = (result ?? {}) as unknown as Obj;
  const solved = result !== null && result.status !== "not-solved";
  const parts = arr(record.parts).map((p) => String(obj(p).ref));
  const leftOut = leftOutOf(result);
  const show = (ps: string[], ns: string[]) => {
    setSelection({ parts: ps, nets: ns });
    setFocusKey((k) => k + 1);
  };
  const commentOn = (ref: string) => {
    setCommentPart(ref);
    setTab("comments");
  };
  const waiting = (
    <p className="muted">
      {shown === null
        ? "Shown once the analysis is done."
        : "Not computed: the circuit was not solved."}
    </p>
  );
  const sections: Record<TabId, () => ReactNode> = {
    findings: () => (
      <>
        <FindingsList findings={findings} onShow={show} />
        {result ? (
          <Block title="Circuit checks and notes">
            <ChecksList result={r} />
          </Block>
        ) : null}
      </>
    ),
    parts: () =>
      result ? (
        <>
          <PartFiguresTable
            result={r}
            record={record}
            leftOut={leftOut.parts}
            {...(isMember ? { onComment: commentOn } : {})}
          />
          <Block title="Blocks recognised">
            <BlocksList result={r} />
          </Block>
        </>
      ) : (
        waiting
      ),
    nets: () =>
      solved ? (
        <>
          <NetFiguresTable result={r} record={record} leftOut={leftOut.nets} />
          <Block title="Thyristors and triacs">
            <TriggersTable result={r} />
          </Block>
          <Block title="Waveforms" hint="in the steady state the solver settled on">
            <StoredWaveforms
              entryId={entry.id}
              revision={revision.number}
              analysisKey={`${shown?.engineVersion}@${String(shown?.finishedAt)}`}
              result={r}
            />
          </Block>
          <Block title="Harmonics of the line current" hint="RMS magnitude by order">
            <HarmonicsChart result={r} />
          </Block>
        </>
      ) : (
        waiting
      ),
    measurements: () => <MeasurementsSection result={r} record={record} />,
    "what-if": () =>
      solved ? (
        <WhatIfPanel entryId={entry.id} revision={revision.number} record={record} stored={r} />
      ) : (
        waiting
      ),
    record: () => (
      <RecordSection record={record} result={result ? r : null} findings={findings ?? []} />
    ),
    photos: () => <PhotosSection entryId={entry.id} canEdit={canEdit} />,
    comments: () => (
      <div id="comments">
        <p className={css.hint}>on the entry or on one part; @name mentions a team member</p>
        <CommentsSection
          entryId={entry.id}
          parts={parts}
          members={team.data?.members ?? []}
          partRef={commentPart}
          onPartRef={setCommentPart}
          enabled={isMember}
        />
      </div>
    ),
    history: () => (
      <>
        <RevisionsSection entryId={entry.id} />
        <Block title="Export" hint={`of revision ${revision.number}`}>
          <p className={css.row}>
            {EXPORTS.map((file) => (
              <a
                key={file}
                href={`/api/entries/${entry.id}/export/${file}?revision=${revision.number}`}
                download
              >
                {file}
              </a>
            ))}
          </p>
        </Block>
      </>
    ),
  };
  const selectedPart = selection.parts.length === 1 ? selection.parts[0]! : null;
  return (
    <article data-entry-id={entry.id}>
      <div className={css.spread}>
        <div>
          <h1>{entry.title}</h1>
          <p className={css.meta}>
            {isMember ? (
              <>
                Team <a href={`/teams/${entry.teamId}`}>{team.data?.name ?? "…"}</a>
              </>
            ) : (
              <span>Shared publicly by its team</span>
            )}
            {" · "}
            <span data-testid="revision-number">revision {revision.number}</span>
            {revision.message ? ` (“${revision.message}”)` : ""} · {when(revision.createdAt)}
            {entry.category ? ` · ${entry.category}` : ""} ·{" "}
            {entry.visibility === "public" ? "public" : "team only"}
            {entry.archived ? (
              <>
                {" · "}
                <strong className={css.danger}>archived</strong>
              </>
            ) : null}
          </p>
        </div>
        <div className={css.row}>
          <a href={`/compare?a=${entry.id}`}>Compare with…</a>
          <a href={`/search?similar=${entry.id}`}>Similar circuits</a>
          {canEdit ? (
            <a href={`/entries/${entry.id}/edit`} className={css.button}>
              Edit
            </a>
          ) : null}
          {canEdit ? <EntryActions state={state} /> : null}
        </div>
      </div>

      <AnalysisPanel state={state} />
      {result !== null ? (
        <EntrySummary
          result={result}
          record={record}
          upgradedFrom={shown?.upgradedFrom ?? null}
          findings={findings ?? []}
          onShow={show}
          onOpen={(t) => setTab(t as TabId)}
        />
      ) : null}

      {shown !== null ? (
        <section className={css.section} aria-label="Schematic">
          <div className={css.sectionHead}>
            <h2>Schematic</h2>
            <span className={css.hint}>laid out from the traced netlist</span>
          </div>
          <div className={css.schematicGrid}>
            <SchematicViewer
              layout={shown.layout}
              marks={marks}
              selectedParts={selection.parts}
              selectedNets={selection.nets}
              onSelectPart={(ref) => setSelection({ parts: ref ? [ref] : [], nets: [] })}
              focusKey={focusKey}
            />
            <PartPanel
              entryId={entry.id}
              partRef={selectedPart}
              record={record}
              result={r}
              findings={findings ?? []}
              canComment={isMember}
              onComment={commentOn}
              onClear={() => setSelection({ parts: [], nets: [] })}
            />
          </div>
        </section>
      ) : null}

      <SectionTabs
        tab={tab}
        onTab={setTab}
        counts={{
          ...(findings ? { findings: findings.length } : {}),
          measurements: arr(record.measurements).length,
        }}
      />
      <div id="entry-section" role="tabpanel" aria-labelledby={`tab-${tab}`} data-section={tab}>
        {sections[tab]()}
      </div>
    </article>
  );
}
