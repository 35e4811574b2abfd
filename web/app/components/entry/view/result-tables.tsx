"use client";
/**
 * The computed figures of an analysis as tables: input figures, per part, per net, triggers,
 * blocks and circuit checks (measurements against their bands are in measurements-section). Any missing field reads "not computed".
 */
import { NOT_COMPUTED, degrees, percent, ratio, si } from "../si-units";
import { arr, has, obj, str, strings, type Obj } from "./result-access";
import css from "../entry.module.css";

function Cell({ children, num = true }: { children: string; num?: boolean }) {
  return (
    <td className={`${num ? css.num : ""} ${children === NOT_COMPUTED ? css.missing : ""}`}>
      {children}
    </td>
  );
}

function NotComputed({ what }: { what: string }) {
  return <p className={css.missing}>{what} not computed.</p>;
}

/** Input current, power, apparent power, power factor and THD. */
export function InputFigures({ result }: { result: Obj }) {
  const input = obj(result.input);
  const supply = obj(result.supply);
  const items: [string, string][] = [
    ["Input current (RMS)", si(input.current_rms, "A")],
    ["Real power", si(input.power, "W")],
    ["Apparent power", si(input.apparent_power, "VA")],
    ["Power factor", ratio(input.power_factor)],
    ["Line current THD", percent(input.thd)],
  ];
  return (
    <>
      <p className={css.meta}>
        {has(supply, "vrms")
          ? `At a supply of ${si(supply.vrms, "V")} RMS, ${si(supply.hz, "Hz")}`
          : "Supply not stated in the result"}
        {str(result.engine) ? ` · engine ${str(result.engine)}` : ""}
      </p>
      <div className={css.figures} data-testid="input-figures">
        {items.map(([label, value]) => (
          <div key={label} className={css.figure}>
            <div className={css.label}>{label}</div>
            <div className={`${css.value} ${value === NOT_COMPUTED ? css.missing : ""}`}>
              {value}
            </div>
          </div>
        ))}
      </div>
    </>
  );
}

/** One row per part of the record, with its computed peak voltage, RMS current and dissipation. */
export function PartFiguresTable({
  result,
  record,
  onComment,
  leftOut = new Map(),
}: {
  result: Obj;
  record: Obj;
  onComment?: (ref: string) => void;
  /** Parts the analysis left out, with why: their figures read "left out", not blank or zero. */
  leftOut?: ReadonlyMap<string, string>;
}) {
  const figures = obj(result.parts);
  const series = obj(result.series);
  const parts = arr(record.parts).map(obj);
  return (
    <div className={css.scroll}>
      <table className={css.table} data-testid="part-figures">
        <thead>
          <tr>
            <th>Part</th>
            <th>Kind</th>
            <th>Value</th>
            <th>E series</th>
            <th className={css.num}>Peak voltage</th>
            <th className={css.num}>RMS current</th>
            <th className={css.num}>Mean (DC) current</th>
            <th className={css.num}>Dissipation</th>
            <th>Rating</th>
            {onComment ? <th /> : null}
          </tr>
        </thead>
        <tbody>
          {parts.map((p) => {
            const ref = String(p.ref);
            const f = obj(figures[ref]);
            const rating = obj(p.rating);
            const ratingText = [
              has(rating, "volts") ? `${rating.volts} V` : null,
              has(rating, "amps") ? `${rating.amps} A` : null,
              has(rating, "watts") ? `${rating.watts} W` : null,
              str(rating.class),
            ]
              .filter(Boolean)
              .join(", ");
            return (
              <tr key={ref} data-part={ref}>
                <td>
                  <strong>{ref}</strong>
                  {str(p.marking) ? <div className={css.meta}>{str(p.marking)}</div> : null}
                </td>
                <td>{String(p.kind ?? "")}</td>
                <td>{p.value === undefined || p.value === null ? "—" : String(p.value)}</td>
                <td>{has(series, ref) ? String(series[ref]) : ref in series ? "none" : "—"}</td>
                {leftOut.has(ref) ? (
                  <td colSpan={4} className={css.missing} data-testid="left-out">
                    left out: {leftOut.get(ref)}
                  </td>
                ) : (
                  <>
                    <Cell>{si(f.voltage_peak, "V")}</Cell>
                    <Cell>{si(f.current_rms, "A")}</Cell>
                    <Cell>{si(f.current_dc, "A")}</Cell>
                    <Cell>{si(f.power, "W")}</Cell>
                  </>
                )}
                <td>{ratingText || "—"}</td>
                {onComment ? (
                  <td>
                    <button type="button" className={css.quiet} onClick={() => onComment(ref)}>
                      Comment
                    </button>
                  </td>
                ) : null}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

/** One row per net: role, touchable, DC, RMS and peak against the reference. */
export function NetFiguresTable({
  result,
  record,
  leftOut = new Map(),
}: {
  result: Obj;
  record: Obj;
  /** Nets the analysis left out, with why. */
  leftOut?: ReadonlyMap<string, string>;
}) {
  const figures = obj(result.nets);
  const declared = obj(record.nets);
  const names = new Set<string>([...Object.keys(declared)]);
  for (const p of arr(record.parts).map(obj)) {
    const pins = p.pins;
    for (const n of Array.isArray(pins) ? pins : Object.values(obj(pins))) names.add(String(n));
  }
  for (const n of Object.keys(figures)) names.add(n);
  return (
    <div className={css.scroll}>
      <table className={css.table} data-testid="net-figures">
        <thead>
          <tr>
            <th>Net</th>
            <th>Role</th>
            <th>Touchable</th>
            <th className={css.num}>DC</th>
            <th className={css.num}>RMS</th>
            <th className={css.num}>Peak</th>
          </tr>
        </thead>
        <tbody>
          {[...names].map((n) => {
            const info = obj(declared[n]);
            const f = obj(figures[n]);
            return (
              <tr key={n}>
                <td className={css.code}>{n}</td>
                <td>{str(info.role) ?? ""}</td>
                <td>
                  {info.accessible === true ? <strong className={css.danger}>yes</strong> : "no"}
                </td>
                {leftOut.has(n) ? (
                  <td colSpan={3} className={css.missing}>
                    left out: {leftOut.get(n)}
                  </td>
                ) : (
                  <>
                    <Cell>{si(f.dc, "V")}</Cell>
                    <Cell>{si(f.rms, "V")}</Cell>
                    <Cell>{si(f.peak, "V")}</Cell>
                  </>
                )}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

/**
 * Each thyristor or triac: whether it fires, the firing angle and the lowest supply at which it
 * keeps firing while running and at which it starts from cold; below, when the circuit settles
 * differently from a cold start and while running, both states' input power.
 */
export function TriggersTable({ result }: { result: Obj }) {
  if (!Array.isArray(result.triggers)) return <NotComputed what="Triggers" />;
  const triggers = arr(result.triggers).map(obj);
  if (triggers.length === 0) return <p className="muted">No thyristor or triac in this circuit.</p>;
  const states = Array.isArray(result.steady_states) ? arr(result.steady_states).map(obj) : [];
  const cold = states.find((s) => s.start === "cold");
  const running = states.find((s) => s.start === "running");
  return (
    <>
      <table className={css.table} data-testid="triggers">
        <thead>
          <tr>
            <th>Part</th>
            <th>Fires</th>
            <th className={css.num}>Firing angle (positive half)</th>
            <th className={css.num}>Firing angle (negative half)</th>
            <th className={css.num}>Lowest firing supply while running</th>
            <th className={css.num}>Lowest firing supply from cold</th>
          </tr>
        </thead>
        <tbody>
          {triggers.map((t, i) => (
            <tr key={i}>
              <td>
                <strong>{str(t.part) ?? "?"}</strong>
              </td>
              <td>
                {t.fires === true ? (
                  "yes"
                ) : t.fires === false ? (
                  <strong className={css.danger}>no</strong>
                ) : (
                  <span className={css.missing}>{NOT_COMPUTED}</span>
                )}
              </td>
              <Cell>{t.fires === false ? "—" : degrees(t.angle_deg)}</Cell>
              <Cell>{has(t, "angle_negative_deg") ? degrees(t.angle_negative_deg) : "—"}</Cell>
              <Cell>{si(t.min_supply_vrms, "V")}</Cell>
              <Cell>{has(t, "min_supply_cold_vrms") ? si(t.min_supply_cold_vrms, "V") : "—"}</Cell>
            </tr>
          ))}
        </tbody>
      </table>
      {cold && running ? (
        <p data-testid="steady-states">
          From a cold start and while running (come down from {si(running.from_vrms, "V")}) the
          circuit settles into different states: input power {si(obj(cold.input).power, "W")} from
          cold, {si(obj(running.input).power, "W")} while running. The figures on this page are the
          cold start&apos;s.
        </p>
      ) : null}
    </>
  );
}

/** The functional blocks found, each with its parts. */
export function BlocksList({ result }: { result: Obj }) {
  if (!Array.isArray(result.blocks)) return <NotComputed what="Blocks" />;
  const blocks = arr(result.blocks).map(obj);
  if (blocks.length === 0) return <p className="muted">No functional block was recognised.</p>;
  return (
    <ul data-testid="blocks">
      {blocks.map((b, i) => (
        <li key={i}>
          <strong>{str(b.kind) ?? "block"}</strong>: {strings(b.parts).join(", ")}
        </li>
      ))}
    </ul>
  );
}

/** The checks of the traced circuit and the engine's notes (assumptions, parts left out). */
export function ChecksList({ result }: { result: Obj }) {
  const checks = arr(result.checks).map(obj);
  const notes = strings(result.notes);
  if (checks.length === 0 && notes.length === 0)
    return <p className="muted">No checks or warnings.</p>;
  return (
    <ul data-testid="checks">
      {checks.map((c, i) => (
        <li key={`c${i}`}>
          <span
            className={`${css.badge} ${c.severity === "error" ? css.sevDanger : c.severity === "warning" ? css.sevWarning : css.sevInfo}`}
          >
            {str(c.severity) ?? "info"}
          </span>{" "}
          {str(c.message) ?? str(c.code) ?? ""}
        </li>
      ))}
      {notes.map((n, i) => (
        <li key={`n${i}`}>
          <span className={`${css.badge} ${css.sevInfo}`}>note</span> {n}
        </li>
      ))}
    </ul>
  );
}
