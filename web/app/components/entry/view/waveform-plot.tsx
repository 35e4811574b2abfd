"use client";
/**
 * The steady-cycle waveforms (result.waveforms: `t` in seconds and named series) as small
 * hand-drawn SVG line plots, one per series on a shared time axis, each with its own scale.
 */
import { useState } from "react";
import { arr, obj } from "./result-access";
import { finite, si } from "../si-units";
import css from "../entry.module.css";

const WIDTH_PX = 760;
const HEIGHT_PX = 150;
const LEFT_PX = 78;
const RIGHT_PX = 34;
const TOP_PX = 22;
const BOTTOM_PX = 26;
const TIME_TICKS = 5;
const COLOURS = ["#1d5c63", "#8b1a1a", "#4a4a8c", "#6b5a1e", "#2f6b3a"];

/** The unit a series name stands for: currents in A, powers in W, the rest (voltages) in V. */
export function seriesUnit(name: string): string {
  if (/power/i.test(name)) return "W";
  if (/current|^i[(.]|\.i$/i.test(name)) return "A";
  return "V";
}

function Plot({ name, t, y, colour }: { name: string; t: number[]; y: number[]; colour: string }) {
  const n = Math.min(t.length, y.length);
  const unit = seriesUnit(name);
  let lo = 0;
  let hi = 0;
  for (let i = 0; i < n; i++) {
    lo = Math.min(lo, y[i]!);
    hi = Math.max(hi, y[i]!);
  }
  if (hi === lo) hi = lo + 1;
  const t0 = t[0]!;
  const span = t[n - 1]! - t0 || 1;
  const plotW = WIDTH_PX - LEFT_PX - RIGHT_PX;
  const plotH = HEIGHT_PX - TOP_PX - BOTTOM_PX;
  const x = (tv: number) => LEFT_PX + ((tv - t0) / span) * plotW;
  const yy = (v: number) => TOP_PX + (1 - (v - lo) / (hi - lo)) * plotH;
  const points: string[] = [];
  for (let i = 0; i < n; i++) points.push(`${x(t[i]!).toFixed(1)},${yy(y[i]!).toFixed(1)}`);
  const ticks = Array.from({ length: TIME_TICKS + 1 }, (_, k) => t0 + (span * k) / TIME_TICKS);
  return (
    <div className={css.plot}>
      <svg
        viewBox={`0 0 ${WIDTH_PX} ${HEIGHT_PX}`}
        role="img"
        aria-label={`${name} over one cycle`}
      >
        <text x={LEFT_PX} y={14} fontSize={12} fill="#1f2328" fontWeight={600}>
          {name}
        </text>
        <rect x={LEFT_PX} y={TOP_PX} width={plotW} height={plotH} fill="none" stroke="#d9d6cf" />
        {lo < 0 && hi > 0 ? (
          <line
            x1={LEFT_PX}
            x2={LEFT_PX + plotW}
            y1={yy(0)}
            y2={yy(0)}
            stroke="#b8b3a8"
            strokeDasharray="3 3"
          />
        ) : null}
        {[hi, lo, ...(lo < 0 && hi > 0 ? [0] : [])].map((v, k) => (
          <text key={k} x={LEFT_PX - 6} y={yy(v) + 4} fontSize={11} textAnchor="end" fill="#5c6670">
            {si(v, unit)}
          </text>
        ))}
        {ticks.map((tv, k) => (
          <g key={k}>
            <line
              x1={x(tv)}
              x2={x(tv)}
              y1={TOP_PX + plotH}
              y2={TOP_PX + plotH + 4}
              stroke="#5c6670"
            />
            <text
              x={x(tv)}
              y={HEIGHT_PX - 8}
              fontSize={11}
              textAnchor={k === TIME_TICKS ? "end" : k === 0 ? "start" : "middle"}
              fill="#5c6670"
            >
              {si(tv - t0, "s")}
            </text>
          </g>
        ))}
        <polyline
          points={points.join(" ")}
          fill="none"
          stroke={colour}
          strokeWidth={1.6}
          strokeLinejoin="round"
        />
      </svg>
    </div>
  );
}

/** Series shown before the person picks: the plug's current and the supply voltage. */
const FIRST_SHOWN = /^(input|supply)\./;
const DEFAULT_SHOWN_COUNT = 2;

/** The series of result.waveforms, as chosen with the checkboxes above them, or "not computed". */
export function WaveformPlots({ waveforms }: { waveforms: unknown }) {
  const [picked, setPicked] = useState<string[] | null>(null);
  const w = obj(waveforms);
  const t = arr(w.t).map(finite);
  const series = Object.entries(obj(w.series))
    .map(([name, values]) => [name, arr(values).map(finite)] as const)
    .filter(([, v]) => v.length > 1 && v.every((x) => x !== null));
  if (t.length < 2 || t.some((x) => x === null) || series.length === 0)
    return <p className={css.missing}>Waveforms not computed.</p>;
  series.sort(
    ([a], [b]) => Number(!FIRST_SHOWN.test(a)) - Number(!FIRST_SHOWN.test(b)) || a.localeCompare(b),
  );
  const names = series.map(([name]) => name);
  const defaults = names.filter((n) => FIRST_SHOWN.test(n));
  const shown = new Set(
    picked ?? (defaults.length > 0 ? defaults : names.slice(0, DEFAULT_SHOWN_COUNT)),
  );
  const toggle = (name: string) =>
    setPicked(names.filter((n) => (n === name ? !shown.has(n) : shown.has(n))));
  return (
    <div data-testid="waveforms">
      <div className={css.row} role="group" aria-label="series to plot">
        {names.map((name) => (
          <label key={name} className={css.meta}>
            <input type="checkbox" checked={shown.has(name)} onChange={() => toggle(name)} /> {name}
          </label>
        ))}
      </div>
      {series
        .filter(([name]) => shown.has(name))
        .map(([name, values]) => (
          <Plot
            key={name}
            name={name}
            t={t as number[]}
            y={values as number[]}
            colour={COLOURS[names.indexOf(name) % COLOURS.length]!}
          />
        ))}
    </div>
  );
}
