"use client";
/**
 * What changed between two revisions (the API's ref-keyed diff): record fields, parts added,
 * removed and changed (values, connections pin by pin), nets and measurements. Used by the
 * diff page and by the stale-save notice of the edit page.
 */
import { useQuery } from "@tanstack/react-query";
import { failureText, getJson } from "../../client/http";
import type { EntryComparison, FieldChange, RevisionDiff } from "../../client/api-types";
import { CompareFigures, CompareFlags } from "../compare/compare-figures";
import css from "./entry.module.css";

function shown(v: unknown): string {
  if (v === null || v === undefined) return "(none)";
  if (typeof v === "string") return v;
  return JSON.stringify(v);
}

function Change({ c }: { c: FieldChange }) {
  return (
    <li>
      {c.field}: <span className={css.removed}>{shown(c.from)}</span>
      <span className={css.arrow}>→</span>
      <span className={css.added}>{shown(c.to)}</span>
    </li>
  );
}

function pinsText(pins: Record<string, string>): string {
  return Object.entries(pins)
    .map(([pin, net]) => `${pin}→${net}`)
    .join(", ");
}

/** A revision diff as lists; data-testid="revision-diff" holds it all. */
export function DiffView({ diff }: { diff: RevisionDiff }) {
  const { parts, nets, measurements } = diff;
  return (
    <div data-testid="revision-diff">
      {diff.same ? <p>Nothing differs between these revisions.</p> : null}
      {diff.record.length > 0 ? (
        <>
          <h3>Entry</h3>
          <ul>
            {diff.record.map((c) => (
              <Change key={c.field} c={c} />
            ))}
          </ul>
        </>
      ) : null}
      {parts.added.length + parts.removed.length + parts.changed.length > 0 ? <h3>Parts</h3> : null}
      <ul>
        {parts.added.map((p) => (
          <li key={`a${p.ref}`} data-diff="part-added">
            <strong className={css.added}>added {p.ref}</strong> ({p.kind}
            {p.value ? ` ${p.value}` : ""}) on {pinsText(p.pins)}
          </li>
        ))}
        {parts.removed.map((p) => (
          <li key={`r${p.ref}`} data-diff="part-removed">
            <strong className={css.removed}>removed {p.ref}</strong> ({p.kind}
            {p.value ? ` ${p.value}` : ""}) from {pinsText(p.pins)}
          </li>
        ))}
        {parts.changed.map((p) => (
          <li key={`c${p.ref}`} data-diff="part-changed">
            <strong>changed {p.ref}</strong> ({p.kind})
            <ul>
              {p.changes.map((c) => (
                <Change key={c.field} c={c} />
              ))}
              {p.pins.map((pin) => (
                <li key={pin.pin}>
                  pin {pin.pin}: <span className={css.removed}>{pin.from ?? "(none)"}</span>
                  <span className={css.arrow}>→</span>
                  <span className={css.added}>{pin.to ?? "(none)"}</span>
                </li>
              ))}
            </ul>
          </li>
        ))}
      </ul>
      {nets.added.length + nets.removed.length + nets.changed.length > 0 ? (
        <>
          <h3>Nets</h3>
          <ul>
            {nets.added.map((n) => (
              <li key={`a${n}`} className={css.added}>
                added {n}
              </li>
            ))}
            {nets.removed.map((n) => (
              <li key={`r${n}`} className={css.removed}>
                removed {n}
              </li>
            ))}
            {nets.changed.map((n) => (
              <li key={`c${n.net}`}>
                <strong>{n.net}</strong>
                <ul>
                  {n.changes.map((c) => (
                    <Change key={c.field} c={c} />
                  ))}
                </ul>
              </li>
            ))}
          </ul>
        </>
      ) : null}
      {measurements.added.length + measurements.removed.length + measurements.changed.length > 0 ? (
        <>
          <h3>Measurements</h3>
          <ul>
            {measurements.added.map((m) => (
              <li key={`a${m.key}`} data-diff="measurement-added">
                <span className={css.added}>added</span> {m.key}: {m.value}
              </li>
            ))}
            {measurements.removed.map((m) => (
              <li key={`r${m.key}`} data-diff="measurement-removed">
                <span className={css.removed}>removed</span> {m.key}: {m.value}
              </li>
            ))}
            {measurements.changed.map((m) => (
              <li key={`c${m.key}`} data-diff="measurement-changed">
                <strong>{m.key}</strong>
                <ul>
                  {m.changes.map((c) => (
                    <Change key={c.field} c={c} />
                  ))}
                </ul>
              </li>
            ))}
          </ul>
        </>
      ) : null}
    </div>
  );
}

/** The diff page's content: revision `from` against revision `to` of one entry. */
export function DiffPage({
  entryId,
  from,
  to,
}: {
  entryId: string;
  from: string | null;
  to: string | null;
}) {
  const params = new URLSearchParams();
  if (from) params.set("from", from);
  if (to) params.set("to", to);
  const query = useQuery({
    queryKey: ["entry", entryId, "diff", from, to],
    queryFn: () =>
      getJson<{ from: number; to: number; diff: RevisionDiff }>(
        `/api/entries/${entryId}/diff?${params}`,
      ),
    retry: false,
  });
  return (
    <>
      <p>
        <a href={`/entries/${entryId}`}>← back to the entry</a>
      </p>
      <h1>
        {query.data
          ? `Changes from revision ${query.data.from} to revision ${query.data.to}`
          : "Changes between revisions"}
      </h1>
      {query.isPending ? <p className="muted">Loading…</p> : null}
      {query.isError ? <p className={css.errorBox}>{failureText(query.error)}</p> : null}
      {query.data ? <DiffView diff={query.data.diff} /> : null}
      {query.data ? (
        <AnalysisChange entryId={entryId} from={query.data.from} to={query.data.to} />
      ) : null}
    </>
  );
}

/**
 * What the change did to the analysis: the two revisions compared as two boards (figures side by
 * side, flags raised, cleared or kept), with a link to the full side-by-side comparison.
 */
function AnalysisChange({ entryId, from, to }: { entryId: string; from: number; to: number }) {
  const params = new URLSearchParams({
    a: entryId,
    b: entryId,
    aRevision: String(from),
    bRevision: String(to),
  });
  const query = useQuery({
    queryKey: ["compare", entryId, from, to],
    queryFn: () => getJson<EntryComparison>(`/api/compare?${params}`),
    retry: false,
  });
  return (
    <section data-testid="analysis-change">
      <h2>What the change did to the analysis</h2>
      <p>
        A is revision {from}, B is revision {to}.{" "}
        <a href={`/compare?${params}`}>Both schematics side by side</a>
      </p>
      {query.isPending ? <p className="muted">Loading…</p> : null}
      {query.isError ? <p className={css.errorBox}>{failureText(query.error)}</p> : null}
      {query.data ? (
        <>
          <CompareFigures comparison={query.data} />
          <CompareFlags comparison={query.data} />
        </>
      ) : null}
    </section>
  );
}
