"use client";
/**
 * The harmonic magnitudes of the line current, stored with the analysis, as bars (uPlot's bar
 * path builder): order on the x axis, RMS amperes up, each bar's share of the fundamental in the
 * legend. Results stored before harmonics were kept say so instead of guessing.
 */
import { useMemo } from "react";
import uPlot from "uplot";
import { obj, type Obj } from "./result-access";
import { finite, si } from "../si-units";
import { UPlotChart } from "./uplot-chart";
import css from "../entry.module.css";

const CHART_HEIGHT_PX = 200;
/** Orders shown: the ones that matter for mains equipment and fit a bar chart's width. */
const MAX_ORDER = 40;

/** One harmonic: its order (1 is the fundamental) and its RMS magnitude in amperes. */
export interface Harmonic {
  order: number;
  amps: number;
}

/** The line current's harmonics stored with the analysis (`input.harmonics`), or null when absent. */
export function harmonicsOf(result: Obj): Harmonic[] | null {
  const stored = obj(result.input).harmonics;
  if (!Array.isArray(stored)) return null;
  return stored
    .map(obj)
    .map((h) => ({ order: finite(h.order) ?? 0, amps: finite(h.rms) ?? NaN }))
    .filter((h) => h.order >= 1 && Number.isFinite(h.amps));
}

/** The bar chart, or a line saying the result has none. */
export function HarmonicsChart({ result }: { result: Obj }) {
  const list = useMemo(() => harmonicsOf(result), [result]);
  const shown = useMemo(
    () => (list ?? []).filter((h) => h.order <= MAX_ORDER).sort((a, b) => a.order - b.order),
    [list],
  );
  const fundamental = shown.find((h) => h.order === 1)?.amps ?? null;
  const { options, data } = useMemo(() => {
    const bars = uPlot.paths.bars!({ size: [0.7, 24] });
    const opts: Omit<uPlot.Options, "width" | "height"> = {
      scales: { x: { time: false, range: (_u, lo, hi) => [lo - 0.8, hi + 0.8] } },
      series: [
        { label: "order", value: (_u, v) => (v == null ? "" : String(v)) },
        {
          label: "line current harmonic (RMS)",
          stroke: "#1d5c63",
          fill: "rgba(29, 92, 99, 0.45)",
          paths: bars,
          points: { show: false },
          value: (_u, v) =>
            v == null
              ? ""
              : fundamental
                ? `${si(v, "A")} (${Number(((v / fundamental) * 100).toPrecision(3))} % of the fundamental)`
                : si(v, "A"),
        },
      ],
      axes: [
        {
          label: "harmonic order (× mains frequency)",
          // Orders are whole numbers: ticks on 1, 2, 5 or 10 steps, never 2.5.
          incrs: [1, 2, 5, 10],
          values: (_u, t) => t.map((v) => String(Math.round(v))),
        },
        { label: "RMS current", size: 64, values: (_u, t) => t.map((v) => si(v, "A", 3)) },
      ],
    };
    return {
      options: opts,
      data: [shown.map((h) => h.order), shown.map((h) => h.amps)] as uPlot.AlignedData,
    };
  }, [shown, fundamental]);
  if (list === null)
    return (
      <p className={css.missing} data-testid="harmonics-missing">
        Harmonics were not stored with this analysis; they appear once it is analysed again.
      </p>
    );
  return (
    <UPlotChart
      options={options}
      data={data}
      height={CHART_HEIGHT_PX}
      label="harmonic magnitudes of the line current"
      testId="harmonics-chart"
    />
  );
}
