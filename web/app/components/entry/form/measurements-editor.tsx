"use client";
/** Measurements of the form editor: what was measured, the reading, where, at which supply, how sure. */
import { MEASUREMENT_KINDS, type MeasurementKind } from "@teardown/engine";
import { newMeasurement, type FormState, type MeasurementRow } from "./form-state";
import { FieldProblems, hasProblem } from "./field-problems";
import { NetPairFields } from "./net-pair-fields";
import type { ProblemPlaces } from "./place-errors";
import css from "./form.module.css";

type Update = (fn: (s: FormState) => FormState) => void;

const UNIT_OF: Readonly<Record<MeasurementKind, string>> = {
  "input.current_rms": "A",
  "input.power": "W",
  "input.apparent_power": "VA",
  "input.power_factor": "ratio",
  "voltage.dc": "V",
  "voltage.rms": "V",
  "voltage.peak": "V",
  "part.current_rms": "A",
  "part.power": "W",
};

/** The measurements table. */
export function MeasurementsEditor({
  state,
  update,
  places,
}: {
  state: FormState;
  update: Update;
  places: ProblemPlaces;
}) {
  const set = (i: number, change: Partial<MeasurementRow>) =>
    update((s) => ({
      ...s,
      measurements: s.measurements.map((m, j) => (j === i ? { ...m, ...change } : m)),
    }));
  return (
    <fieldset className={css.fieldset}>
      <legend>Measurements</legend>
      <FieldProblems places={places} path="measurements" />
      {state.measurements.length === 0 ? (
        <p className={css.label}>
          None yet. Readings are checked against the traced circuit&apos;s prediction.
        </p>
      ) : null}
      {state.measurements.length > 0 ? (
        <table className={css.table}>
          <thead>
            <tr>
              <th>What</th>
              <th>Value</th>
              <th>Where</th>
              <th>Supply (V, Hz)</th>
              <th>Uncertainty</th>
              <th>Instrument</th>
              <th />
            </tr>
          </thead>
          <tbody>
            {state.measurements.map((m, i) => {
              const base = `measurements[${i}]`;
              return (
                <tr key={m.key}>
                  <td>
                    <select
                      className={css.select}
                      name={`measurements.${i}.what`}
                      value={m.what}
                      onChange={(e) => set(i, { what: e.target.value as MeasurementKind })}
                    >
                      {MEASUREMENT_KINDS.map((k) => (
                        <option key={k} value={k}>
                          {k}
                        </option>
                      ))}
                    </select>
                    <FieldProblems places={places} path={`${base}.what`} />
                    <FieldProblems places={places} path={base} />
                  </td>
                  <td>
                    <input
                      className={`${css.input} ${css.small}`}
                      name={`measurements.${i}.value`}
                      placeholder={`in ${UNIT_OF[m.what]}`}
                      value={m.value}
                      aria-invalid={hasProblem(places, `${base}.value`)}
                      onChange={(e) => set(i, { value: e.target.value })}
                    />
                    <FieldProblems places={places} path={`${base}.value`} />
                  </td>
                  <td>
                    {m.what.startsWith("voltage.") ? (
                      <NetPairFields
                        places={places}
                        betweenPath={`${base}.between`}
                        first={{
                          name: `measurements.${i}.from`,
                          label: "from net",
                          placeholder: "from",
                          value: m.from,
                          onChange: (v) => set(i, { from: v }),
                        }}
                        second={{
                          name: `measurements.${i}.to`,
                          label: "to net",
                          placeholder: "to",
                          value: m.to,
                          onChange: (v) => set(i, { to: v }),
                        }}
                      />
                    ) : m.what.startsWith("part.") ? (
                      <select
                        className={css.select}
                        name={`measurements.${i}.part`}
                        value={m.part}
                        aria-invalid={hasProblem(places, `${base}.part`)}
                        onChange={(e) => set(i, { part: e.target.value })}
                      >
                        <option value="">(part)</option>
                        {state.parts.map((p) => (
                          <option key={p.key} value={p.ref}>
                            {p.ref}
                          </option>
                        ))}
                      </select>
                    ) : (
                      <span className={css.label}>at the plug</span>
                    )}
                    <FieldProblems places={places} path={`${base}.between`} />
                    <FieldProblems places={places} path={`${base}.part`} />
                  </td>
                  <td>
                    <div className={css.pins}>
                      <input
                        className={`${css.input} ${css.tiny}`}
                        name={`measurements.${i}.supply.vrms`}
                        aria-label="supply volts"
                        placeholder={state.vrms || "rated"}
                        value={m.vrms}
                        onChange={(e) => set(i, { vrms: e.target.value })}
                      />
                      <input
                        className={`${css.input} ${css.tiny}`}
                        name={`measurements.${i}.supply.hz`}
                        aria-label="supply hertz"
                        placeholder={state.hz || "rated"}
                        value={m.hz}
                        onChange={(e) => set(i, { hz: e.target.value })}
                      />
                    </div>
                    <FieldProblems places={places} path={`${base}.supply`} />
                  </td>
                  <td>
                    <input
                      className={`${css.input} ${css.tiny}`}
                      name={`measurements.${i}.uncertainty`}
                      placeholder="2%"
                      value={m.uncertainty}
                      aria-invalid={hasProblem(places, `${base}.uncertainty`)}
                      onChange={(e) => set(i, { uncertainty: e.target.value })}
                    />
                    <FieldProblems places={places} path={`${base}.uncertainty`} />
                  </td>
                  <td>
                    <input
                      className={css.input}
                      name={`measurements.${i}.instrument`}
                      value={m.instrument}
                      onChange={(e) => set(i, { instrument: e.target.value })}
                    />
                    <FieldProblems places={places} path={`${base}.instrument`} />
                  </td>
                  <td>
                    <button
                      type="button"
                      className="small"
                      onClick={() =>
                        update((s) => ({
                          ...s,
                          measurements: s.measurements.filter((_, j) => j !== i),
                        }))
                      }
                    >
                      Remove
                    </button>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      ) : null}
      <div className={css.add}>
        <button
          type="button"
          className="small"
          onClick={() =>
            update((s) => ({ ...s, measurements: [...s.measurements, newMeasurement()] }))
          }
        >
          + measurement
        </button>
      </div>
    </fieldset>
  );
}
