"use client";
/**
 * The top of a finished analysis, what a person reads first: what the analysis says about itself
 * (complete, partial with each gap, not solved), the input figures, the worst findings one line
 * each (severity first), each measurement's verdict against the prediction, and the safety
 * caution once, beside those figures.
 */
import type { EntryResult } from "../../../client/api-types";
import { SafetyCaution } from "../../safety-caution";
import { ratio, si } from "../si-units";
import { AnalysisStatus } from "./analysis-status";
import { findingLine, SEVERITY_WORD, type Finding } from "./finding-text";
import { severityClasses } from "./findings-list";
import { measurementName } from "./measurement-words";
import { arr, measurementUnit, obj, str, type Obj } from "./result-access";
import { InputFigures } from "./result-tables";
import css from "../entry.module.css";

/** Findings shown in the summary; the findings section holds them all. */
export const SUMMARY_FINDINGS = 4;

/** The summary block of a finished analysis. */
export function EntrySummary({
  result,
  record,
  upgradedFrom,
  findings,
  onShow,
  onOpen,
}: {
  result: EntryResult;
  record: Obj;
  upgradedFrom: string | null;
  findings: readonly Finding[];
  onShow: (parts: string[], nets: string[]) => void;
  onOpen: (tab: string) => void;
}) {
  const r = result as unknown as Obj;
  const worst = findings.filter((f) => f.severity !== "info");
  const top = (worst.length > 0 ? worst : findings).slice(0, SUMMARY_FINDINGS);
  const comparisons = arr(r.comparisons).map(obj);
  const measurements = arr(record.measurements).map(obj);
  return (
    <section className={css.summary} data-testid="entry-summary" aria-label="Summary">
      <AnalysisStatus result={result} upgradedFrom={upgradedFrom} />
      {result.status === "not-solved" ? (
        <p className={css.missing}>Not computed: {result.reason}.</p>
      ) : (
        <InputFigures result={r} />
      )}
      <div className={css.summaryGrid}>
        <div>
          <h2 className={css.smallHead}>Worst findings</h2>
          {top.length === 0 ? (
            <p className="muted">None raised (not a verdict of safety).</p>
          ) : (
            <ul className={css.lines} data-testid="summary-findings">
              {top.map((f, i) => (
                <li key={i}>
                  <span className={`${css.badge} ${severityClasses(f.severity).badge}`}>
                    {SEVERITY_WORD[f.severity]}
                  </span>{" "}
                  {findingLine(f)}
                  {f.parts.length + f.nets.length > 0 ? (
                    <>
                      {" "}
                      <button
                        type="button"
                        className={css.linkButton}
                        onClick={() => onShow(f.parts, f.nets)}
                      >
                        ({[...f.parts, ...f.nets.map((n) => `net ${n}`)].join(", ")})
                      </button>
                    </>
                  ) : null}
                </li>
              ))}
            </ul>
          )}
          {findings.length > top.length ? (
            <button type="button" className={css.linkButton} onClick={() => onOpen("findings")}>
              all {findings.length} findings
            </button>
          ) : null}
        </div>
        <div>
          <h2 className={css.smallHead}>Measured against predicted</h2>
          {comparisons.length === 0 ? (
            <p className="muted">
              {measurements.length === 0 ? "No measurements recorded." : "None compared."}
            </p>
          ) : (
            <ul className={css.lines} data-testid="summary-verdicts">
              {comparisons.map((c, i) => {
                const what = str(c.what) ?? "";
                const unit = measurementUnit(what);
                const fmt = (v: unknown) => (unit === "" ? ratio(v) : si(v, unit));
                const m = typeof c.measurement === "number" ? obj(measurements[c.measurement]) : {};
                const agrees = c.verdict === "agrees";
                return (
                  <li key={i}>
                    <strong className={agrees ? css.agrees : css.disagrees}>
                      {agrees ? "agrees" : "disagrees"}
                    </strong>{" "}
                    {measurementName(what, m)}: measured {fmt(c.measured)}, predicted {fmt(c.low)}{" "}
                    to {fmt(c.high)}
                  </li>
                );
              })}
            </ul>
          )}
        </div>
      </div>
      <SafetyCaution />
    </section>
  );
}
