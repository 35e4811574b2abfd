"use client";
/**
 * The findings, most severe first: each one sentence with its leading quantities and units, its
 * source as a citation, the parts and nets it concerns, and a link that selects them on the
 * schematic. The rest of a finding's figures sit behind "all figures". The safety caution stands
 * once at the top of the page, next to the summary's figures.
 */
import { codeWords, findingSentence, SEVERITY_WORD, type Finding } from "./finding-text";
import css from "../entry.module.css";

/** The CSS classes of a severity: its badge and its card. */
export function severityClasses(severity: string): { badge: string; card: string } {
  if (severity === "danger") return { badge: css.sevDanger!, card: css.flagDanger! };
  if (severity === "warning") return { badge: css.sevWarning!, card: css.flagWarning! };
  return { badge: css.sevInfo!, card: css.flagInfo! };
}

/** The list; `onShow` selects a finding's parts and nets on the schematic. */
export function FindingsList({
  findings,
  onShow,
}: {
  findings: readonly Finding[] | null;
  onShow: (parts: string[], nets: string[]) => void;
}) {
  if (findings === null) return <p className={css.missing}>Findings not computed.</p>;
  if (findings.length === 0)
    return (
      <p className="muted" data-testid="findings">
        No finding was raised for this circuit. That is not a verdict of safety.
      </p>
    );
  // A caution most findings share is said once under the list, not on every card.
  const seen = new Map<string, number>();
  for (const f of findings) if (f.caution) seen.set(f.caution, (seen.get(f.caution) ?? 0) + 1);
  const shared = [...seen].filter(([, n]) => n > 1).map(([c]) => c);
  return (
    <div data-testid="findings">
      {findings.map((f, i) => {
        const cls = severityClasses(f.severity);
        const more = f.figures.length > 3;
        return (
          <article
            key={i}
            className={`${css.flag} ${cls.card}`}
            data-severity={f.severity}
            data-flag={f.code}
          >
            <h3>
              <span className={`${css.badge} ${cls.badge}`}>{SEVERITY_WORD[f.severity]}</span>
              {codeWords(f.code)}
            </h3>
            <p className={css.findingText}>{findingSentence(f)}</p>
            {more ? (
              <details className={css.evidence}>
                <summary>All {f.figures.length} figures</summary>
                <ul aria-label="evidence">
                  {f.figures.map((s, k) => (
                    <li key={k}>{s}</li>
                  ))}
                </ul>
              </details>
            ) : null}
            {f.olderEvidence ? (
              <p className={css.missing}>
                Figures kept in an older format: analyse again to see them.
              </p>
            ) : null}
            <p className={css.meta}>
              {f.parts.length + f.nets.length > 0 ? (
                <>
                  Concerns {f.parts.join(", ")}
                  {f.parts.length > 0 && f.nets.length > 0 ? " and " : ""}
                  {f.nets.map((n) => `net ${n}`).join(", ")} ·{" "}
                  <button
                    type="button"
                    className={css.linkButton}
                    data-testid="show-on-schematic"
                    onClick={() => onShow(f.parts, f.nets)}
                  >
                    show on the schematic
                  </button>
                  {" · "}
                </>
              ) : null}
              Source: <cite>{f.source || "not given"}</cite>
            </p>
            {f.caution && !shared.includes(f.caution) ? (
              <p className={css.meta}>{f.caution}</p>
            ) : null}
          </article>
        );
      })}
      {shared.map((c) => (
        <p key={c} className={css.meta}>
          Said of several findings above: {c}
        </p>
      ))}
    </div>
  );
}
