"use client";
/**
 * The selected part beside the schematic: what the record says of it, its figures (peak voltage,
 * RMS current, dissipation against its rating and where that rating comes from), the findings
 * that name it and the team's comments on it.
 */
import { NOT_COMPUTED, finite, si } from "../si-units";
import { useComments } from "../entry-queries";
import { findingLine, SEVERITY_WORD, type Finding } from "./finding-text";
import { severityClasses } from "./findings-list";
import { arr, obj, str, type Obj } from "./result-access";
import css from "../entry.module.css";

/** A part's power rating and the basis it stands on: the record, or a default the analysis assumed. */
export function ratingBasis(
  ref: string,
  part: Obj,
  result: Obj,
): { watts: number; basis: string } | null {
  const rated = finite(obj(part.rating).watts);
  if (rated !== null) return { watts: rated, basis: "rating in the record" };
  for (const a of arr(result.assumptions).map(obj))
    if (a.part === ref && /watt|power/.test(String(a.field)) && typeof a.value === "number")
      return { watts: a.value, basis: `assumed: ${str(a.why) ?? "the record gives none"}` };
  return null;
}

/** The panel for one part, or a hint when none is selected. */
export function PartPanel({
  entryId,
  partRef,
  record,
  result,
  findings,
  canComment,
  onComment,
  onClear,
}: {
  entryId: string;
  partRef: string | null;
  record: Obj;
  result: Obj;
  findings: readonly Finding[];
  canComment: boolean;
  onComment: (ref: string) => void;
  onClear: () => void;
}) {
  const comments = useComments(entryId, canComment);
  if (partRef === null)
    return (
      <aside className={css.partPanel} data-testid="part-panel">
        <p className="muted">
          Click a part on the schematic, or a finding&apos;s link, to see its figures here.
        </p>
      </aside>
    );
  const part = arr(record.parts)
    .map(obj)
    .find((p) => p.ref === partRef);
  const f = obj(obj(result.parts)[partRef]);
  const rating = ratingBasis(partRef, part ?? {}, result);
  const power = finite(f.power);
  const mine = findings.filter((x) => x.parts.includes(partRef));
  const notes = (comments.data ?? []).filter((c) => c.partRef === partRef);
  const row = (label: string, value: string) => (
    <tr>
      <th scope="row">{label}</th>
      <td className={value === NOT_COMPUTED ? css.missing : css.num}>{value}</td>
    </tr>
  );
  return (
    <aside className={css.partPanel} data-testid="part-panel" data-part={partRef}>
      <div className={css.spread}>
        <h3>
          {partRef}{" "}
          <span className={css.meta}>
            {String(part?.kind ?? "")}
            {part?.value !== undefined && part?.value !== null ? ` · ${String(part.value)}` : ""}
          </span>
        </h3>
        <button type="button" className={css.quiet} onClick={onClear} aria-label="clear selection">
          ×
        </button>
      </div>
      {str(part?.marking) ? <p className={css.meta}>marked “{str(part?.marking)}”</p> : null}
      {str(part?.note) ? <p className={css.meta}>{str(part?.note)}</p> : null}
      <table className={css.table}>
        <tbody>
          {row("Peak voltage", si(f.voltage_peak, "V"))}
          {row("RMS current", si(f.current_rms, "A"))}
          {row("Dissipation", si(f.power, "W"))}
          <tr>
            <th scope="row">Against its rating</th>
            <td data-testid="part-rating">
              {rating === null
                ? "no power rating in the record"
                : `${power !== null ? `${Number(((power / rating.watts) * 100).toPrecision(3))} % of ` : ""}${si(rating.watts, "W")} (${rating.basis})`}
            </td>
          </tr>
        </tbody>
      </table>
      <h4>Findings</h4>
      {mine.length === 0 ? (
        <p className="muted">None name this part.</p>
      ) : (
        <ul className={css.lines}>
          {mine.map((x, i) => (
            <li key={i}>
              <span className={`${css.badge} ${severityClasses(x.severity).badge}`}>
                {SEVERITY_WORD[x.severity]}
              </span>{" "}
              {findingLine(x)}
            </li>
          ))}
        </ul>
      )}
      <h4>Comments</h4>
      {!canComment ? (
        <p className="muted">Team members see comments here.</p>
      ) : (
        <>
          {notes.length === 0 ? <p className="muted">None on this part.</p> : null}
          <ul className={css.lines}>
            {notes.map((c) => (
              <li key={c.id}>
                <strong>{c.authorName ?? "former member"}</strong>: {c.body}
              </li>
            ))}
          </ul>
          <button type="button" className={css.quiet} onClick={() => onComment(partRef)}>
            Comment on {partRef}
          </button>
        </>
      )}
    </aside>
  );
}
