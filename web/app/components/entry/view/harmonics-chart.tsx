"use client";
/**
 * The harmonic magnitudes of the line current, stored with the analysis, as bars (uPlot's bar
 * path builder): order on the x axis, RMS amperes up, each bar's share of the fundamental in the
 * legend. Results stored before harmonics were kept say so instead of guessing.
 */
import { useMemo } from "react";
import uPlot from "uplot";
import { arr, obj, type Obj } from "./result-access";
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

function magnitude(h: Obj): number | null {
  return finite(h.rms) ?? finite(h.amps) ?? finite(h.magnitude) ?? finite(h.current_rms);
}

/**
 * The line current's harmonics from the stored result, in the shapes the field may take: a list
 * of `{ order, rms }` (or `amps`/`magnitude`), or one under `input_current`/`line_current`/`current`,
 * or parallel `orders` and `rms` lists. Null when the result holds none.
 */
export function harmonicsOf(result: Obj): Harmonic[] | null {
  let h: unknown = result.harmonics;
  const o = obj(h);
  if (!Array.isArray(h)) h = o.input_current ?? o.line_current ?? o.current ?? h;
  const inner = obj(h);
  if (!Array.isArray(h) && Array.isArray(inner.orders)) {
    const mags = arr(inner.rms ?? inner.amps ?? inner.magnitude);
    return arr(inner.orders)
      .map((n, i) => ({ order: finite(n) ?? 0, amps: finite(mags[i]) ?? NaN }))
      .filter((x) => x.order >= 1 && Number.isFinite(x.amps));
  }
  if (!Array.isArray(h)) return null;
  const list = h
    .map((x, i) => {
      const e = obj(x);
      const order = finite(e.order) ?? finite(e.n) ?? (typeof x === "number" ? i + 1 : null);
      const amps = typeof x === "number" ? x : magnitude(e);
      return order !== null && amps !== null ? { order, amps } : null;
    })
    .filter((x): x is Harmonic => x !== null && x.order >= 1);
  return list.length > 0 ? list : null;
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
        { label: "harmonic order (× mains frequency)" },
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
