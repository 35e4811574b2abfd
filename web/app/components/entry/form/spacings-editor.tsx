"use client";
/** Board spacings of the form editor: creepage and clearance measured between two nets. */
import { newSpacing, type FormState, type SpacingRow } from "./form-state";
import { FieldProblems, hasProblem } from "./field-problems";
import { NetPairFields } from "./net-pair-fields";
import type { ProblemPlaces } from "./place-errors";
import css from "./form.module.css";

type Update = (fn: (s: FormState) => FormState) => void;

/** The board spacings table. */
export function SpacingsEditor({
  state,
  update,
  places,
}: {
  state: FormState;
  update: Update;
  places: ProblemPlaces;
}) {
  const set = (i: number, change: Partial<SpacingRow>) =>
    update((s) => ({
      ...s,
      spacings: s.spacings.map((m, j) => (j === i ? { ...m, ...change } : m)),
    }));
  return (
    <fieldset className={css.fieldset}>
      <legend>Board spacings</legend>
      <FieldProblems places={places} path="board" />
      {state.spacings.length > 0 ? (
        <table className={css.table}>
          <thead>
            <tr>
              <th>Between nets</th>
              <th>Creepage (mm)</th>
              <th>Clearance (mm)</th>
              <th>Slot</th>
              <th>Material group</th>
              <th>Pollution degree</th>
              <th />
            </tr>
          </thead>
          <tbody>
            {state.spacings.map((s, i) => {
              const base = `board.spacings[${i}]`;
              return (
                <tr key={s.key}>
                  <td>
                    <NetPairFields
                      places={places}
                      betweenPath={`${base}.between`}
                      first={{
                        name: `spacings.${i}.a`,
                        label: "first net",
                        value: s.a,
                        onChange: (v) => set(i, { a: v }),
                      }}
                      second={{
                        name: `spacings.${i}.b`,
                        label: "second net",
                        value: s.b,
                        onChange: (v) => set(i, { b: v }),
                      }}
                    />
                    <FieldProblems places={places} path={`${base}.between`} />
                    <FieldProblems places={places} path={base} />
                  </td>
                  <td>
                    <input
                      className={`${css.input} ${css.tiny}`}
                      name={`spacings.${i}.creepage_mm`}
                      inputMode="decimal"
                      value={s.creepage}
                      aria-invalid={hasProblem(places, `${base}.creepage_mm`)}
                      onChange={(e) => set(i, { creepage: e.target.value })}
                    />
                    <FieldProblems places={places} path={`${base}.creepage_mm`} />
                  </td>
                  <td>
                    <input
                      className={`${css.input} ${css.tiny}`}
                      name={`spacings.${i}.clearance_mm`}
                      inputMode="decimal"
                      value={s.clearance}
                      aria-invalid={hasProblem(places, `${base}.clearance_mm`)}
                      onChange={(e) => set(i, { clearance: e.target.value })}
                    />
                    <FieldProblems places={places} path={`${base}.clearance_mm`} />
                  </td>
                  <td>
                    <input
                      type="checkbox"
                      name={`spacings.${i}.slot`}
                      aria-label="routed slot"
                      checked={s.slot}
                      onChange={(e) => set(i, { slot: e.target.checked })}
                    />
                  </td>
                  <td>
                    <select
                      className={css.select}
                      name={`spacings.${i}.material_group`}
                      value={s.materialGroup}
                      onChange={(e) => set(i, { materialGroup: e.target.value })}
                    >
                      <option value="">IIIa (assumed)</option>
                      {["I", "II", "IIIa", "IIIb"].map((g) => (
                        <option key={g} value={g}>
                          {g}
                        </option>
                      ))}
                    </select>
                    <FieldProblems places={places} path={`${base}.material_group`} />
                  </td>
                  <td>
                    <select
                      className={css.select}
                      name={`spacings.${i}.pollution_degree`}
                      value={s.pollutionDegree}
                      onChange={(e) => set(i, { pollutionDegree: e.target.value })}
                    >
                      <option value="">2 (assumed)</option>
                      {["1", "2", "3"].map((g) => (
                        <option key={g} value={g}>
                          {g}
                        </option>
                      ))}
                    </select>
                    <FieldProblems places={places} path={`${base}.pollution_degree`} />
                  </td>
                  <td>
                    <button
                      type="button"
                      className="small"
                      onClick={() =>
                        update((st) => ({ ...st, spacings: st.spacings.filter((_, j) => j !== i) }))
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
      ) : (
        <p className={css.label}>None yet.</p>
      )}
      <div className={css.add}>
        <button
          type="button"
          className="small"
          onClick={() => update((s) => ({ ...s, spacings: [...s.spacings, newSpacing()] }))}
        >
          + spacing
        </button>
      </div>
    </fieldset>
  );
}
