"use client";
/**
 * Risk flags, most severe first: each with its severity in words, the parts and nets involved,
 * the numbers behind it (evidence), where the rule comes from (source) and what it does not
 * decide (caution). The safety caution stands above the list.
 */
import { SafetyCaution } from "../../safety-caution";
import { evidenceText } from "../si-units";
import { arr, obj, str, strings } from "./result-access";
import css from "../entry.module.css";

const SEVERITY_ORDER: Readonly<Record<string, number>> = { danger: 0, warning: 1, info: 2 };
const SEVERITY_WORD: Readonly<Record<string, string>> = {
  danger: "Danger",
  warning: "Warning",
  info: "Note",
};

/** The CSS classes of a severity: its badge and its card. */
export function severityClasses(severity: string): { badge: string; card: string } {
  if (severity === "danger") return { badge: css.sevDanger!, card: css.flagDanger! };
  if (severity === "warning") return { badge: css.sevWarning!, card: css.flagWarning! };
  return { badge: css.sevInfo!, card: css.flagInfo! };
}

/** The flags of a result, or "not computed" when the result has no flags field. */
export function FlagsList({ flags, onPart }: { flags: unknown; onPart?: (ref: string) => void }) {
  if (!Array.isArray(flags)) return <p className={css.missing}>Flags not computed.</p>;
  const list = arr(flags)
    .map(obj)
    .sort(
      (a, b) =>
        (SEVERITY_ORDER[String(a.severity)] ?? 3) - (SEVERITY_ORDER[String(b.severity)] ?? 3),
    );
  const counts = ["danger", "warning", "info"]
    .map((s) => [s, list.filter((f) => f.severity === s).length] as const)
    .filter(([, n]) => n > 0);
  return (
    <div data-testid="flags">
      <SafetyCaution />
      {list.length === 0 ? (
        <p className="muted">
          No flags were raised for this circuit. That is not a verdict of safety.
        </p>
      ) : (
        <p className="muted">
          {counts
            .map(([s, n]) => `${n} ${SEVERITY_WORD[s]!.toLowerCase()}${n === 1 ? "" : "s"}`)
            .join(", ")}
        </p>
      )}
      {list.map((f, i) => {
        const severity = str(f.severity) ?? "info";
        const cls = severityClasses(severity);
        const evidence = Object.entries(obj(f.evidence));
        const parts = strings(f.parts);
        const nets = strings(f.nets);
        return (
          <article
            key={i}
            className={`${css.flag} ${cls.card}`}
            data-severity={severity}
            data-flag={str(f.code) ?? ""}
          >
            <h3>
              <span className={`${css.badge} ${cls.badge}`}>
                {SEVERITY_WORD[severity] ?? severity}
              </span>
              <code>{str(f.code) ?? "unnamed flag"}</code>
              {parts.map((p) =>
                onPart ? (
                  <button
                    key={p}
                    type="button"
                    className={css.quiet}
                    onClick={() => onPart(p)}
                    title={`comment on ${p}`}
                  >
                    {p}
                  </button>
                ) : (
                  <span key={p} className={css.partTag}>
                    {p}
                  </span>
                ),
              )}
              {nets.map((n) => (
                <span key={n} className={css.partTag}>
                  net {n}
                </span>
              ))}
            </h3>
            <p style={{ margin: "0.2rem 0" }}>{str(f.message) ?? ""}</p>
            {evidence.length > 0 ? (
              <dl className={css.evidence} aria-label="evidence">
                {evidence.map(([k, v]) => (
                  <div key={k} style={{ display: "contents" }}>
                    <dt>{k.replace(/_/g, " ")}</dt>
                    <dd>{evidenceText(k, v)}</dd>
                  </div>
                ))}
              </dl>
            ) : (
              <p className={css.missing}>No evidence given.</p>
            )}
            <div className={css.meta}>
              Source: {str(f.source) ?? "not given"}
              {str(f.caution) ? <> · {str(f.caution)}</> : null}
            </div>
          </article>
        );
      })}
    </div>
  );
}
