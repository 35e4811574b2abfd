"use client";
/**
 * A what-if answer beside the stored analysis: the supply, input figures, each trigger's firing
 * and each part's peak voltage and dissipation, with the difference (absolute and relative).
 * Rows that did not change are kept, so the table reads the same for every what-if.
 */
import { NOT_COMPUTED, degrees, finite, percent, ratio, si } from "../si-units";
import { arr, obj, str, type Obj } from "./result-access";
import css from "../entry.module.css";

interface Row {
  label: string;
  a: unknown;
  b: unknown;
  fmt: (v: unknown) => string;
}

function difference(row: Row): string {
  const a = finite(row.a);
  const b = finite(row.b);
  if (a === null || b === null) return row.a === row.b ? "same" : "changed";
  if (a === b) return "same";
  const sign = b > a ? "+" : "−";
  const rel = a !== 0 ? ` (${sign}${Math.abs(((b - a) / a) * 100).toPrecision(3)} %)` : "";
  return `${sign}${row.fmt(Math.abs(b - a))}${rel}`;
}

const fires = (v: unknown) => (v === true ? "fires" : v === false ? "does not fire" : NOT_COMPUTED);

/** The comparison table. */
export function WhatIfCompare({ stored, variant }: { stored: Obj; variant: Obj }) {
  const sIn = obj(stored.input);
  const vIn = obj(variant.input);
  const rows: Row[] = [
    {
      label: "Supply voltage (RMS)",
      a: obj(stored.supply).vrms,
      b: obj(variant.supply).vrms,
      fmt: (v) => si(v, "V"),
    },
    {
      label: "Supply frequency",
      a: obj(stored.supply).hz,
      b: obj(variant.supply).hz,
      fmt: (v) => si(v, "Hz"),
    },
    { label: "Line current (RMS)", a: sIn.current_rms, b: vIn.current_rms, fmt: (v) => si(v, "A") },
    { label: "Real power", a: sIn.power, b: vIn.power, fmt: (v) => si(v, "W") },
    {
      label: "Apparent power",
      a: sIn.apparent_power,
      b: vIn.apparent_power,
      fmt: (v) => si(v, "VA"),
    },
    { label: "Power factor", a: sIn.power_factor, b: vIn.power_factor, fmt: ratio },
    { label: "Line current THD", a: sIn.thd, b: vIn.thd, fmt: percent },
  ];
  const vTriggers = new Map(
    arr(variant.triggers)
      .map(obj)
      .map((t) => [str(t.part), t] as const),
  );
  for (const t of arr(stored.triggers).map(obj)) {
    const v = vTriggers.get(str(t.part)) ?? {};
    rows.push({ label: `${str(t.part)} fires`, a: t.fires, b: v.fires, fmt: fires });
    rows.push({
      label: `${str(t.part)} firing angle`,
      a: t.fires ? t.angle_deg : null,
      b: v.fires ? v.angle_deg : null,
      fmt: degrees,
    });
  }
  const partRows: Row[] = [];
  const sParts = obj(stored.parts);
  const vParts = obj(variant.parts);
  for (const ref of Object.keys(sParts)) {
    const a = obj(sParts[ref]);
    const b = obj(vParts[ref]);
    partRows.push({
      label: `${ref} peak voltage`,
      a: a.voltage_peak,
      b: b.voltage_peak,
      fmt: (v) => si(v, "V"),
    });
    partRows.push({ label: `${ref} dissipation`, a: a.power, b: b.power, fmt: (v) => si(v, "W") });
  }
  return (
    <>
      <CompareTable rows={rows} testId="what-if-compare" />
      <details>
        <summary>
          Each part&apos;s peak voltage and dissipation ({partRows.length / 2} parts)
        </summary>
        <CompareTable rows={partRows} testId="what-if-compare-parts" />
      </details>
    </>
  );
}

function CompareTable({ rows, testId }: { rows: Row[]; testId: string }) {
  return (
    <div className={css.scroll}>
      <table className={css.table} data-testid={testId}>
        <thead>
          <tr>
            <th>Figure</th>
            <th className={css.num}>Stored analysis</th>
            <th className={css.num}>What-if</th>
            <th className={css.num}>Difference</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const d = difference(r);
            return (
              <tr key={r.label} className={d !== "same" ? css.changed : undefined}>
                <td>{r.label}</td>
                <td className={css.num}>{r.fmt(r.a)}</td>
                <td className={css.num}>{r.fmt(r.b)}</td>
                <td className={css.num}>{d}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
