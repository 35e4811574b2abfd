"use client";
/**
 * One uPlot chart in a React component: made when the data or options change, sized to its
 * container's width (a ResizeObserver follows it), destroyed on unmount. uPlot draws on a canvas
 * and sets its sizes through the DOM, so it needs no inline style or script under our CSP.
 */
import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";

/** A chart of `data` (x first, then one array per series) at `height` pixels. */
export function UPlotChart({
  options,
  data,
  height,
  label,
  testId,
}: {
  options: Omit<uPlot.Options, "width" | "height">;
  data: uPlot.AlignedData;
  height: number;
  label: string;
  testId?: string;
}) {
  const box = useRef<HTMLDivElement | null>(null);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const chart = new uPlot({ ...options, width: el.clientWidth || 600, height }, data, el);
    const watch = new ResizeObserver(() => {
      if (el.clientWidth > 0) chart.setSize({ width: el.clientWidth, height });
    });
    watch.observe(el);
    return () => {
      watch.disconnect();
      chart.destroy();
    };
  }, [options, data, height]);
  return <div ref={box} role="img" aria-label={label} data-testid={testId} />;
}
