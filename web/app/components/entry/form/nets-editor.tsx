"use client";
/**
 * Nets of the form editor: every net the parts name, plus nets added by hand, each with its
 * role (line, neutral, earth, output) and whether a person can touch it. A net named only on
 * pins is listed too; editing it writes it into the record's `nets`.
 */
import { NET_ROLES } from "@teardown/engine";
import { newNet, type FormState, type NetRow } from "./form-state";
import { FieldProblems, hasProblem } from "./field-problems";
import type { ProblemPlaces } from "./place-errors";
import css from "./form.module.css";

type Update = (fn: (s: FormState) => FormState) => void;

interface ShownNet {
  row: NetRow;
  /** True when the net is only named on pins (no row of its own yet). */
  derived: boolean;
}

function shownNets(state: FormState): ShownNet[] {
  const out: ShownNet[] = state.nets.map((row) => ({ row, derived: false }));
  const named = new Set(state.nets.map((n) => n.name.trim()));
  for (const p of state.parts)
    for (const pin of p.pins) {
      const name = pin.net.trim();
      if (name === "" || named.has(name)) continue;
      named.add(name);
      out.push({ row: { ...newNet(name), key: `derived:${name}` }, derived: true });
    }
  return out;
}

/** The nets table. */
export function NetsEditor({
  state,
  update,
  places,
}: {
  state: FormState;
  update: Update;
  places: ProblemPlaces;
}) {
  const nets = shownNets(state);
  const change = (shown: ShownNet, edit: Partial<NetRow>) =>
    update((s) =>
      shown.derived
        ? { ...s, nets: [...s.nets, { ...shown.row, key: `derived:${shown.row.name}`, ...edit }] }
        : { ...s, nets: s.nets.map((n) => (n.key === shown.row.key ? { ...n, ...edit } : n)) },
    );
  return (
    <fieldset className={css.fieldset}>
      <legend>Nets</legend>
      <p className={css.label}>
        Voltages are computed against the neutral. Mark every net a person can touch in normal use.
      </p>
      <FieldProblems places={places} path="nets" />
      <table className={css.table}>
        <thead>
          <tr>
            <th>Net</th>
            <th>Role</th>
            <th>Touchable</th>
            <th>Note</th>
            <th />
          </tr>
        </thead>
        <tbody>
          {nets.map((shown, i) => {
            const { row } = shown;
            const base = `nets.${row.name.trim()}`;
            return (
              <tr key={row.key} data-net-row={row.name}>
                <td>
                  {shown.derived ? (
                    <span className="code">{row.name}</span>
                  ) : (
                    <input
                      className={`${css.input} ${css.small}`}
                      name={`nets.${i}.name`}
                      aria-label={`net ${i + 1} name`}
                      value={row.name}
                      onChange={(e) => change(shown, { name: e.target.value })}
                    />
                  )}
                  <FieldProblems places={places} path={base} />
                </td>
                <td>
                  <select
                    className={css.select}
                    name={`nets.${i}.role`}
                    aria-label={`net ${row.name} role`}
                    value={row.role}
                    aria-invalid={hasProblem(places, `${base}.role`)}
                    onChange={(e) => change(shown, { role: e.target.value })}
                  >
                    <option value="">(none)</option>
                    {NET_ROLES.map((r) => (
                      <option key={r} value={r}>
                        {r}
                      </option>
                    ))}
                  </select>
                  <FieldProblems places={places} path={`${base}.role`} />
                </td>
                <td>
                  <label className={css.check}>
                    <input
                      type="checkbox"
                      name={`nets.${i}.accessible`}
                      aria-label={`net ${row.name} accessible`}
                      checked={row.accessible}
                      onChange={(e) => change(shown, { accessible: e.target.checked })}
                    />
                    accessible
                  </label>
                </td>
                <td>
                  <input
                    className={css.input}
                    name={`nets.${i}.note`}
                    aria-label={`net ${row.name} note`}
                    value={row.note}
                    onChange={(e) => change(shown, { note: e.target.value })}
                  />
                  <FieldProblems places={places} path={`${base}.note`} />
                </td>
                <td>
                  {shown.derived ? null : (
                    <button
                      type="button"
                      className="small"
                      onClick={() =>
                        update((s) => ({ ...s, nets: s.nets.filter((n) => n.key !== row.key) }))
                      }
                    >
                      Remove
                    </button>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <div className={css.add}>
        <button
          type="button"
          className="small"
          onClick={() => update((s) => ({ ...s, nets: [...s.nets, newNet("")] }))}
        >
          + net
        </button>
      </div>
      <datalist id="teardown-nets">
        {nets.map((n) => (
          <option key={n.row.key} value={n.row.name} />
        ))}
      </datalist>
    </fieldset>
  );
}
