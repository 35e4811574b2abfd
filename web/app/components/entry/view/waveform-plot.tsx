"use client";
/**
 * The steady-window waveforms (result.waveforms: `t` in seconds and named series) on one uPlot
 * chart: voltages on the left axis, currents on the right, each trace named in plain words,
 * the window labelled with how many mains cycles it spans, and each thyristor or triac's firing
 * instants drawn as dashed verticals. The person picks the traces; line current and the supply
 * voltage come first.
 */
import { useMemo, useState } from "react";
import type uPlot from "uplot";
import { arr, obj, str } from "./result-access";
import { finite, si } from "../si-units";
import { cyclesSpanned, firingInstants, seriesLabel, seriesUnit } from "./series-names";
import { UPlotChart } from "./uplot-chart";
import css from "../entry.module.css";

const COLOURS = ["#1d5c63", "#8b1a1a", "#4a4a8c", "#6b5a1e", "#2f6b3a", "#7a3e8c", "#3b6ea8"];
const PLOT_HEIGHT_PX = 280;
const FIRST_SHOWN = ["input.current", "supply.voltage"];
/** One empty list, so a result without a supply trace does not remake the chart each render. */
const NO_SAMPLES: number[] = [];

interface Firing {
  part: string;
  at: number[];
}

// Firing instants are in result time; the chart's axis starts at the window's first sample.
function firingHook(firings: Firing[], shiftS: number): uPlot.Plugin {
  return {
    hooks: {
      draw: (u: uPlot) => {
        const ctx = u.ctx;
        ctx.save();
        ctx.strokeStyle = "#a61b1b";
        ctx.fillStyle = "#a61b1b";
        ctx.setLineDash([4, 3]);
        ctx.lineWidth = 1;
        ctx.font = `${11 * devicePixelRatio}px sans-serif`;
        const top = u.bbox.top;
        const bottom = u.bbox.top + u.bbox.height;
        for (const f of firings)
          for (const t of f.at) {
            const x = u.valToPos((t - shiftS) * 1000, "x", true);
            ctx.beginPath();
            ctx.moveTo(x, top);
            ctx.lineTo(x, bottom);
            ctx.stroke();
            ctx.fillText(`${f.part} fires`, x + 3, top + 12 * devicePixelRatio);
          }
        ctx.restore();
      },
    },
  };
}

/** The waveform chart with its trace picker, or "not computed". */
export function WaveformPlots({ result }: { result: Record<string, unknown> }) {
  const w = obj(result.waveforms);
  const hz = finite(obj(result.supply).hz) ?? 0;
  const [picked, setPicked] = useState<string[] | null>(null);
  const { t, series } = useMemo(() => {
    const tt = arr(w.t).map(finite);
    const ss = Object.entries(obj(w.series))
      .map(([name, values]) => [name, arr(values).map(finite)] as const)
      .filter(([, v]) => v.length === tt.length && v.every((x) => x !== null)) as [
      string,
      number[],
    ][];
    return { t: tt.every((x) => x !== null) ? (tt as number[]) : [], series: ss };
  }, [w.t, w.series]);
  const names = series.map(([n]) => n);
  const shown = picked ?? names.filter((n) => FIRST_SHOWN.includes(n));
  const supply = series.find(([n]) => n === "supply.voltage")?.[1] ?? NO_SAMPLES;
  const firings: Firing[] = useMemo(
    () =>
      arr(result.triggers)
        .map(obj)
        .filter((g) => g.fires === true)
        .map((g) => ({
          part: str(g.part) ?? "?",
          at: firingInstants(t, supply, hz, finite(g.angle_deg), finite(g.angle_negative_deg)),
        })),
    [result.triggers, t, supply, hz],
  );
  const chosen = series.filter(([n]) => shown.includes(n));
  const { options, data } = useMemo(() => {
    const units = [...new Set(chosen.map(([n]) => seriesUnit(n)))];
    const opts: Omit<uPlot.Options, "width" | "height"> = {
      scales: { x: { time: false } },
      legend: { live: true },
      cursor: { drag: { x: true, y: false } },
      series: [
        { label: "time (ms)", value: (_u, v) => (v == null ? "" : `${v.toFixed(2)} ms`) },
        ...chosen.map(([n]) => ({
          label: seriesLabel(n),
          scale: seriesUnit(n),
          stroke: COLOURS[names.indexOf(n) % COLOURS.length]!,
          width: 1.5,
          value: (_u: uPlot, v: number | null) => (v == null ? "" : si(v, seriesUnit(n))),
        })),
      ],
      axes: [
        { label: "time in the steady window (ms)" },
        ...units.slice(0, 2).map((unit, i) => ({
          scale: unit,
          side: i === 0 ? 3 : 1,
          label: unit === "V" ? "volts" : unit === "A" ? "amperes" : "watts",
          grid: { show: i === 0 },
          size: 64,
          values: (_u: uPlot, ticks: number[]) => ticks.map((v) => si(v, unit, 3)),
        })),
      ],
      plugins: [firingHook(firings, t[0] ?? 0)],
    };
    const d: uPlot.AlignedData = [
      t.map((x) => (x - (t[0] ?? 0)) * 1000),
      ...chosen.map(([, v]) => v),
    ];
    return { options: opts, data: d };
    // chosen is derived from shown and series
  }, [shown.join("|"), series, firings, t]);

  if (t.length < 2 || series.length === 0)
    return <p className={css.missing}>Waveforms not computed.</p>;
  const cycles = cyclesSpanned(t, hz);
  const toggle = (name: string) =>
    setPicked(shown.includes(name) ? shown.filter((n) => n !== name) : [...shown, name]);
  return (
    <div data-testid="waveforms">
      <p className={css.meta} data-testid="waveform-window">
        Steady window of {si(t[t.length - 1]! - t[0]! + (t[1]! - t[0]!), "s")}
        {cycles !== null ? `: ${cycles} mains cycle${cycles === 1 ? "" : "s"} at ${hz} Hz` : ""}
        {firings.length > 0
          ? ` · dashed lines: ${firings.map((f) => `${f.part} firing`).join(", ")}`
          : ""}
      </p>
      <fieldset className={css.picker} aria-label="traces to plot">
        {names.map((name) => (
          <label key={name}>
            <input type="checkbox" checked={shown.includes(name)} onChange={() => toggle(name)} />{" "}
            {seriesLabel(name)}
          </label>
        ))}
      </fieldset>
      {chosen.length === 0 ? (
        <p className="muted">Pick a trace to plot.</p>
      ) : (
        <UPlotChart
          options={options}
          data={data}
          height={PLOT_HEIGHT_PX}
          label={`waveforms: ${chosen.map(([n]) => seriesLabel(n)).join(", ")}`}
          testId="waveform-chart"
        />
      )}
    </div>
  );
}
