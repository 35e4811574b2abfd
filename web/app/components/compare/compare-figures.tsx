"use client";
/**
 * The computed figures of two boards side by side (B − A and B / A) and the risk flags on one
 * board, the other or both, with the safety caution beside them. Used by the compare page and by
 * the revision diff page ("what the change did to the analysis").
 */
import { formatValue } from "@teardown/engine";
import type { EntryComparison, FigureRow } from "../../client/api-types";
import { SafetyCaution } from "../safety-caution";
import css from "./compare.module.css";

const FIGURE_WORDS: Readonly<Record<string, string>> = {
  "input.current_rms": "input current (RMS)",
  "input.power": "input power",
  "input.apparent_power": "apparent power",
  "input.power_factor": "power factor",
  "input.thd": "current distortion (THD)",
  "part.power": "dissipation",
  "part.voltage_peak": "peak voltage",
  "part.current_rms": "current (RMS)",
  "firing.angle_deg": "firing angle, positive half",
  "firing.angle_negative_deg": "firing angle, negative half",
  "firing.min_supply_vrms": "lowest supply that still fires",
};

/** A figure in engineering notation with its unit; "—" when not computed. */
export function figureText(v: number | null, unit: string): string {
  if (v === null) return "—";
  if (unit === "1") return String(Number(v.toPrecision(3)));
  if (unit === "°") return `${Number(v.toPrecision(4))}°`;
  return formatValue(v, unit, 3);
}

function ratioText(r: number | null): string {
  return r === null ? "—" : `×${Number(r.toPrecision(3))}`;
}

function whereText(row: FigureRow): string {
  if (row.refs === null) return "";
  const { a, b } = row.refs;
  if (a !== null && b !== null) return a === b ? a : `${a} ↔ ${b}`;
  return a !== null ? `${a} (only A)` : `${b} (only B)`;
}

function FigureTable({ rows, caption }: { rows: FigureRow[]; caption: string }) {
  if (rows.length === 0) return null;
  return (
    <table className={css.table}>
      <caption>{caption}</caption>
      <thead>
        <tr>
          <th scope="col">part</th>
          <th scope="col">figure</th>
          <th scope="col" className={css.num}>
            A
          </th>
          <th scope="col" className={css.num}>
            B
          </th>
          <th scope="col" className={css.num}>
            B − A
          </th>
          <th scope="col" className={css.num}>
            B / A
          </th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r, i) => (
          <tr key={`${r.what}-${whereText(r)}-${i}`} data-figure={r.what}>
            <td>{whereText(r)}</td>
            <td>{FIGURE_WORDS[r.what] ?? r.what}</td>
            <td className={css.num}>{figureText(r.a, r.unit)}</td>
            <td className={css.num}>{figureText(r.b, r.unit)}</td>
            <td className={css.num}>
              {r.difference === null
                ? "—"
                : `${r.difference > 0 ? "+" : ""}${figureText(r.difference, r.unit)}`}
            </td>
            <td className={css.num}>{ratioText(r.ratio)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** The figures of both boards: input, each part's dissipation and stress, firing angles. */
export function CompareFigures({ comparison }: { comparison: EntryComparison }) {
  const { figures, a, b } = comparison;
  const missing = [a.analysis === null ? "A" : null, b.analysis === null ? "B" : null].filter(
    (x) => x !== null,
  );
  return (
    <section className={css.section} data-testid="compare-figures">
      <h2>Computed figures</h2>
      <SafetyCaution />
      {missing.length > 0 ? (
        <p className={css.hint}>
          No finished analysis yet for board {missing.join(" and ")}: its figures and flags are left
          empty.
        </p>
      ) : null}
      <FigureTable rows={figures.filter((f) => f.what.startsWith("input."))} caption="Input" />
      <FigureTable
        rows={figures.filter((f) => f.what.startsWith("part."))}
        caption="Each part's dissipation and stress"
      />
      <FigureTable
        rows={figures.filter((f) => f.what.startsWith("firing."))}
        caption="Firing of thyristors and triacs"
      />
    </section>
  );
}

function FlagList({ title, codes, testId }: { title: string; codes: string[]; testId: string }) {
  return (
    <div data-testid={testId}>
      <h3>{title}</h3>
      {codes.length === 0 ? (
        <p className={css.hint}>none</p>
      ) : (
        <ul>
          {codes.map((c) => (
            <li key={c}>
              <code>{c}</code>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** Risk flag codes raised on board A only, on board B only, and on both. */
export function CompareFlags({ comparison }: { comparison: EntryComparison }) {
  const { flags } = comparison;
  return (
    <section className={css.section} data-testid="compare-flags">
      <h2>Risk flags</h2>
      <div className={css.columns3}>
        <FlagList title="Only on A" codes={flags.onlyA} testId="flags-only-a" />
        <FlagList title="Only on B" codes={flags.onlyB} testId="flags-only-b" />
        <FlagList title="On both" codes={flags.both} testId="flags-both" />
      </div>
    </section>
  );
}
