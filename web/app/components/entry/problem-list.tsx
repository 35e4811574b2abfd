"use client";
/**
 * The problems of an uploaded file (or the warnings of an accepted one), by line: each with its place (line, column, field path)
 * and the lines of the file around it, so the person sees the very text the reader refused.
 */
import type { ApiProblem } from "../../client/api-types";
import css from "./entry.module.css";

const CONTEXT_LINES = 1;

function Excerpt({ lines, line }: { lines: string[]; line: number }) {
  const from = Math.max(1, line - CONTEXT_LINES);
  const to = Math.min(lines.length, line + CONTEXT_LINES);
  const shown = [];
  for (let n = from; n <= to; n++)
    shown.push(
      <div key={n} className={n === line ? css.excerptHit : undefined}>
        <span className={css.lineNo}>{n}</span>
        {lines[n - 1]}
      </div>,
    );
  return <div className={css.excerpt}>{shown}</div>;
}

/** Every problem of a refused file, in line order, with excerpts when the file's text is at hand. */
export function ProblemList({
  problems,
  text,
  title,
  warnings = false,
}: {
  problems: ApiProblem[];
  text: string | null;
  title: string;
  /** Warnings of an accepted file rather than the problems of a refused one. */
  warnings?: boolean;
}) {
  const lines = text === null ? [] : text.split(/\r?\n/);
  const sorted = [...problems].sort(
    (a, b) => (a.line ?? Infinity) - (b.line ?? Infinity) || (a.column ?? 0) - (b.column ?? 0),
  );
  return (
    <div
      className={warnings ? css.notice : css.errorBox}
      role={warnings ? "status" : "alert"}
      data-testid={warnings ? "upload-warnings" : "upload-problems"}
    >
      <strong>{title}</strong>
      <ul>
        {sorted.map((p, i) => (
          <li key={i}>
            {p.line != null ? (
              <strong>
                line {p.line}
                {p.column != null ? `, column ${p.column}` : ""}
              </strong>
            ) : null}
            {p.line != null && p.path ? " — " : null}
            {p.path ? <code className={css.code}>{p.path}</code> : null}
            {p.line != null || p.path ? ": " : null}
            {p.message}
            {p.line != null && lines.length >= p.line ? (
              <Excerpt lines={lines} line={p.line} />
            ) : null}
          </li>
        ))}
      </ul>
    </div>
  );
}
