"use client";
/**
 * Risk flags, most severe first: each with its severity in words, the parts and nets involved,
 * the numbers behind it (evidence, one sentence per labelled quantity: "time constant: 2.2 s"),
 * the published document the rule comes from (source) and what it does not decide (caution).
 * The safety caution stands above the list.
 */
import { SafetyCaution } from "../../safety-caution";
import { DISPLAY_DIGITS, NOT_COMPUTED, si } from "../si-units";
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

/** Units shown with an SI prefix (24.1 mA); the others (%, mm, ppm, none) as plain numbers. */
const PREFIXED_UNITS = new Set(["V", "A", "W", "VA", "F", "H", "Ω", "s", "Hz", "J"]);
/** Units written against the number (90°, 2.1×). */
const ATTACHED_UNITS = new Set(["°", "×"]);

/** One evidence entry ({ label, value, unit }) as a sentence: "time constant: 2.2 s". */
export function evidenceSentence(entry: unknown): string | null {
  const e = obj(entry);
  const label = str(e.label);
  if (label === null) return null;
  const unit = str(e.unit) ?? "";
  const v = e.value;
  if (typeof v === "string") return `${label}: ${v}`;
  if (typeof v !== "number" || !Number.isFinite(v)) return `${label}: ${NOT_COMPUTED}`;
  if (PREFIXED_UNITS.has(unit)) return `${label}: ${si(v, unit)}`;
  const n = Number(v.toPrecision(DISPLAY_DIGITS));
  if (ATTACHED_UNITS.has(unit)) return `${label}: ${n}${unit}`;
  return `${label}: ${n}${unit ? ` ${unit}` : ""}`;
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
        // Results of an older engine kept evidence as raw keys: they are not guessed at.
        const older = !Array.isArray(f.evidence) && f.evidence !== undefined;
        const evidence = arr(f.evidence)
          .map(evidenceSentence)
          .filter((x): x is string => x !== null);
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
              <ul className={css.evidence} aria-label="evidence">
                {evidence.map((sentence, k) => (
                  <li key={k}>{sentence}.</li>
                ))}
              </ul>
            ) : (
              <p className={css.missing}>
                {older
                  ? "Evidence kept in an older format: analyse again to see it."
                  : "No evidence given."}
              </p>
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
