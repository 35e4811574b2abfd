"use client";
/**
 * Each measurement the record holds, with its instrument and uncertainty, drawn against the band
 * the traced circuit predicts for it: a bar for the band (parts' tolerances and the stated
 * uncertainty), a tick at the nominal prediction, a diamond at the measured value, and the
 * verdict in words.
 */
import { NOT_COMPUTED, finite, ratio, si } from "../si-units";
import { measurementName } from "./measurement-words";
import { arr, measurementUnit, obj, str, type Obj } from "./result-access";
import css from "../entry.module.css";

const STRIP_W = 320;
const STRIP_H = 26;
const STRIP_PAD = 12;

interface Band {
  low: number | null;
  high: number | null;
  predicted: number | null;
  measured: number | null;
}

function BandStrip({ low, high, predicted, measured }: Band) {
  const values = [low, high, predicted, measured].filter((v): v is number => v !== null);
  if (values.length < 2 || low === null || high === null) return null;
  let lo = Math.min(...values);
  let hi = Math.max(...values);
  const margin = (hi - lo) * 0.1 || Math.abs(hi) * 0.1 || 1;
  lo -= margin;
  hi += margin;
  const x = (v: number) => STRIP_PAD + ((v - lo) / (hi - lo)) * (STRIP_W - 2 * STRIP_PAD);
  return (
    <svg width={STRIP_W} height={STRIP_H} viewBox={`0 0 ${STRIP_W} ${STRIP_H}`} aria-hidden="true">
      <line x1={STRIP_PAD} x2={STRIP_W - STRIP_PAD} y1={13} y2={13} stroke="#d9d6cf" />
      <rect
        x={x(low)}
        y={7}
        width={Math.max(2, x(high) - x(low))}
        height={12}
        fill="#c9dfe1"
        stroke="#1d5c63"
      />
      {predicted !== null ? (
        <line x1={x(predicted)} x2={x(predicted)} y1={4} y2={22} stroke="#1d5c63" strokeWidth={2} />
      ) : null}
      {measured !== null ? (
        <path d={`M ${x(measured)} 5 l 7 8 l -7 8 l -7 -8 z`} fill="#8b1a1a" stroke="#fff" />
      ) : null}
    </svg>
  );
}

/** The measurements of the record, each against its predicted band when there is one. */
export function MeasurementsSection({ result, record }: { result: Obj; record: Obj }) {
  const measurements = arr(record.measurements).map(obj);
  if (measurements.length === 0) return <p className="muted">The record has no measurements.</p>;
  const byIndex = new Map<number, Obj>();
  for (const c of arr(result.comparisons).map(obj))
    if (typeof c.measurement === "number") byIndex.set(c.measurement, c);
  return (
    <div className={css.scroll}>
      <table className={css.table} data-testid="measurements">
        <thead>
          <tr>
            <th>Measurement</th>
            <th className={css.num}>Measured</th>
            <th>Instrument, uncertainty</th>
            <th className={css.num}>Predicted band</th>
            <th>Band (bar), prediction (tick), measured (◆)</th>
            <th>Verdict</th>
          </tr>
        </thead>
        <tbody>
          {measurements.map((m, i) => {
            const what = str(m.what) ?? "";
            const unit = measurementUnit(what);
            const fmt = (v: unknown) => (unit === "" ? ratio(v) : si(v, unit));
            const c = byIndex.get(i);
            const verdict = str(c?.verdict);
            const supply = obj(m.supply);
            return (
              <tr key={i} data-measurement={i}>
                <td>
                  {measurementName(what, m)}
                  {finite(supply.vrms) !== null ? (
                    <div className={css.meta}>
                      at {si(supply.vrms, "V")}, {si(supply.hz, "Hz")}
                    </div>
                  ) : null}
                  {str(m.note) ? <div className={css.meta}>{str(m.note)}</div> : null}
                </td>
                <td className={css.num}>{fmt(m.value)}</td>
                <td>
                  {str(m.instrument) ?? "instrument not stated"}
                  {", "}
                  {m.uncertainty !== undefined && m.uncertainty !== null
                    ? `± ${String(m.uncertainty)}`
                    : "uncertainty not stated"}
                </td>
                <td className={css.num}>{c ? `${fmt(c.low)} to ${fmt(c.high)}` : NOT_COMPUTED}</td>
                <td>
                  {c ? (
                    <BandStrip
                      low={finite(c.low)}
                      high={finite(c.high)}
                      predicted={finite(c.predicted)}
                      measured={finite(c.measured)}
                    />
                  ) : null}
                </td>
                <td
                  className={
                    verdict === "agrees"
                      ? css.agrees
                      : verdict === "disagrees"
                        ? css.disagrees
                        : css.missing
                  }
                >
                  {verdict ?? "not compared"}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
