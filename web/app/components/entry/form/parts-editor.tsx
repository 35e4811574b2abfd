"use client";
/**
 * The parts table of the form editor: one row per part with kind-aware pin fields (the roles
 * come from the engine's kind table), and a details row for ratings, model and note.
 */
import { useState } from "react";
import { kindInfo } from "@teardown/engine";
import {
  KIND_NAMES,
  newPart,
  refitPins,
  valueUnit,
  type FormState,
  type PartRow,
} from "./form-state";
import { FieldProblems, hasProblem } from "./field-problems";
import { pathWithin, type ProblemPlaces } from "./place-errors";
import css from "./form.module.css";

type Update = (fn: (s: FormState) => FormState) => void;

const DETAIL_FIELDS = ["rating", "model", "note", "polarised", "closed"];

function nextRef(parts: PartRow[], kind: string): string {
  const letter =
    {
      resistor: "R",
      capacitor: "C",
      inductor: "L",
      diode: "D",
      zener: "D",
      led: "D",
      thyristor: "Q",
      triac: "Q",
      transformer: "T",
      fuse: "F",
      varistor: "RV",
      load: "LD",
      switch: "S",
      connector: "J",
      testpoint: "TP",
    }[kind] ?? "X";
  let n = 1;
  while (parts.some((p) => p.ref === `${letter}${n}`)) n += 1;
  return `${letter}${n}`;
}

/** The parts table. */
export function PartsEditor({
  state,
  update,
  places,
}: {
  state: FormState;
  update: Update;
  places: ProblemPlaces;
}) {
  const [open, setOpen] = useState<Record<string, boolean>>({});
  const setPart = (i: number, change: Partial<PartRow>) =>
    update((s) => ({ ...s, parts: s.parts.map((p, j) => (j === i ? { ...p, ...change } : p)) }));

  return (
    <fieldset className={css.fieldset}>
      <legend>Parts</legend>
      <FieldProblems places={places} path="parts" />
      <table className={css.table}>
        <thead>
          <tr>
            <th>Ref</th>
            <th>Kind</th>
            <th>Value</th>
            <th>Tolerance</th>
            <th>Pins → nets</th>
            <th>Marking</th>
            <th />
          </tr>
        </thead>
        {state.parts.map((p, i) => {
          const base = `parts[${i}]`;
          const info = kindInfo(p.kind);
          const unit = valueUnit(p.kind);
          const variadic = info === null || info.variadic;
          // A problem in a details field opens the details, so it is never hidden.
          const detailProblem = DETAIL_FIELDS.some((f) =>
            [...places.at.keys()].some((k) => pathWithin(k, `${base}.${f}`)),
          );
          const expanded = open[p.key] === true || detailProblem;
          return (
            <tbody key={p.key} data-part-row={i}>
              <tr>
                <td>
                  <input
                    className={`${css.input} ${css.tiny}`}
                    name={`parts.${i}.ref`}
                    aria-label={`part ${i + 1} ref`}
                    value={p.ref}
                    aria-invalid={hasProblem(places, `${base}.ref`)}
                    onChange={(e) => setPart(i, { ref: e.target.value })}
                  />
                  <FieldProblems places={places} path={`${base}.ref`} />
                  <FieldProblems places={places} path={base} />
                </td>
                <td>
                  <input
                    className={`${css.input} ${css.kind}`}
                    name={`parts.${i}.kind`}
                    aria-label={`part ${i + 1} kind`}
                    list="teardown-kinds"
                    value={p.kind}
                    aria-invalid={hasProblem(places, `${base}.kind`)}
                    onChange={(e) => {
                      const kind = e.target.value;
                      setPart(i, { kind, pins: refitPins(p.pins, kind, p.polarised) });
                    }}
                  />
                  {info === null && p.kind.trim() !== "" ? (
                    <div className={css.warning}>not simulated</div>
                  ) : null}
                  <FieldProblems places={places} path={`${base}.kind`} />
                </td>
                <td>
                  <input
                    className={`${css.input} ${css.small}`}
                    name={`parts.${i}.value`}
                    aria-label={`part ${i + 1} value`}
                    placeholder={unit ? `in ${unit}` : "none"}
                    value={p.value}
                    aria-invalid={hasProblem(places, `${base}.value`)}
                    onChange={(e) => setPart(i, { value: e.target.value })}
                  />
                  <FieldProblems places={places} path={`${base}.value`} />
                </td>
                <td>
                  <input
                    className={`${css.input} ${css.tiny}`}
                    name={`parts.${i}.tolerance`}
                    aria-label={`part ${i + 1} tolerance`}
                    placeholder="5%"
                    value={p.tolerance}
                    aria-invalid={hasProblem(places, `${base}.tolerance`)}
                    onChange={(e) => setPart(i, { tolerance: e.target.value })}
                  />
                  <FieldProblems places={places} path={`${base}.tolerance`} />
                </td>
                <td>
                  <div className={css.pins}>
                    {p.pins.map((pin, k) => (
                      <label key={k} className={css.pin}>
                        {pin.role}
                        <input
                          className={css.input}
                          name={`parts.${i}.pins.${pin.role}`}
                          list="teardown-nets"
                          value={pin.net}
                          aria-invalid={hasProblem(places, `${base}.pins`)}
                          onChange={(e) =>
                            setPart(i, {
                              pins: p.pins.map((q, m) =>
                                m === k ? { ...q, net: e.target.value } : q,
                              ),
                            })
                          }
                        />
                      </label>
                    ))}
                    {variadic ? (
                      <span className={css.actions}>
                        <button
                          type="button"
                          className="small"
                          title="add a pin"
                          onClick={() =>
                            setPart(i, {
                              pins: [...p.pins, { role: `p${p.pins.length + 1}`, net: "" }],
                            })
                          }
                        >
                          + pin
                        </button>
                        {p.pins.length > 1 ? (
                          <button
                            type="button"
                            className="small"
                            title="remove the last pin"
                            onClick={() => setPart(i, { pins: p.pins.slice(0, -1) })}
                          >
                            − pin
                          </button>
                        ) : null}
                      </span>
                    ) : null}
                  </div>
                  <FieldProblems places={places} path={`${base}.pins`} />
                </td>
                <td>
                  <input
                    className={css.input}
                    name={`parts.${i}.marking`}
                    aria-label={`part ${i + 1} marking`}
                    value={p.marking}
                    onChange={(e) => setPart(i, { marking: e.target.value })}
                  />
                  <FieldProblems places={places} path={`${base}.marking`} />
                </td>
                <td className={css.actions}>
                  <button
                    type="button"
                    className="small"
                    aria-expanded={expanded}
                    onClick={() => setOpen((o) => ({ ...o, [p.key]: !expanded }))}
                  >
                    {expanded ? "Less" : "More"}
                  </button>
                  <button
                    type="button"
                    className="small"
                    aria-label={`remove part ${p.ref || i + 1}`}
                    onClick={() =>
                      update((s) => ({ ...s, parts: s.parts.filter((_, j) => j !== i) }))
                    }
                  >
                    Remove
                  </button>
                </td>
              </tr>
              {expanded ? (
                <tr className={css.details}>
                  <td colSpan={7}>
                    <div className={css.grid}>
                      {(
                        [
                          ["volts", "Rated volts", "rating.volts"],
                          ["amps", "Rated amps", "rating.amps"],
                          ["watts", "Rated watts", "rating.watts"],
                          ["ratingClass", "Safety class (X2, Y1…)", "rating.class"],
                          ["ratingPackage", "Package", "rating.package"],
                          ["surgeAmps", "Surge amps", "rating.surge_amps"],
                        ] as const
                      ).map(([field, label, path]) => (
                        <label key={field} className={css.label}>
                          {label}
                          <input
                            className={css.input}
                            name={`parts.${i}.${path}`}
                            value={p[field]}
                            aria-invalid={hasProblem(places, `${base}.${path}`)}
                            onChange={(e) =>
                              setPart(i, { [field]: e.target.value } as Partial<PartRow>)
                            }
                          />
                          <FieldProblems places={places} path={`${base}.${path}`} />
                        </label>
                      ))}
                      <label className={`${css.label} ${css.modelField}`}>
                        Model parameters (name=value …)
                        <input
                          className={css.input}
                          name={`parts.${i}.model`}
                          placeholder={
                            p.kind === "thyristor" || p.kind === "triac"
                              ? "vgt=0.7 igt=50u ih=3m von=1.2"
                              : "r=529"
                          }
                          value={p.model}
                          aria-invalid={hasProblem(places, `${base}.model`)}
                          onChange={(e) => setPart(i, { model: e.target.value })}
                        />
                        <FieldProblems places={places} path={`${base}.model`} />
                      </label>
                      <label className={css.label}>
                        Note
                        <input
                          className={css.input}
                          name={`parts.${i}.note`}
                          value={p.note}
                          onChange={(e) => setPart(i, { note: e.target.value })}
                        />
                        <FieldProblems places={places} path={`${base}.note`} />
                      </label>
                      {p.kind === "capacitor" ? (
                        <label className={css.check}>
                          <input
                            type="checkbox"
                            name={`parts.${i}.polarised`}
                            checked={p.polarised}
                            onChange={(e) =>
                              setPart(i, {
                                polarised: e.target.checked,
                                pins: refitPins(
                                  p.pins.map((q, m) => ({ ...q, role: String(m) })),
                                  p.kind,
                                  e.target.checked,
                                ),
                              })
                            }
                          />
                          polarised (pins plus, minus)
                        </label>
                      ) : null}
                      {p.kind === "switch" ? (
                        <label className={css.check}>
                          <input
                            type="checkbox"
                            name={`parts.${i}.closed`}
                            checked={p.closed}
                            onChange={(e) => setPart(i, { closed: e.target.checked })}
                          />
                          closed
                        </label>
                      ) : null}
                    </div>
                    <FieldProblems places={places} path={`${base}.rating`} />
                    <FieldProblems places={places} path={`${base}.polarised`} />
                    <FieldProblems places={places} path={`${base}.closed`} />
                  </td>
                </tr>
              ) : null}
            </tbody>
          );
        })}
      </table>
      <datalist id="teardown-kinds">
        {KIND_NAMES.map((k) => (
          <option key={k} value={k} />
        ))}
      </datalist>
      <div className={`${css.add} ${css.actions}`}>
        {["resistor", "capacitor", "diode", "thyristor", "triac", "fuse"].map((kind) => (
          <button
            key={kind}
            type="button"
            onClick={() =>
              update((s) => ({ ...s, parts: [...s.parts, newPart(kind, nextRef(s.parts, kind))] }))
            }
          >
            + {kind}
          </button>
        ))}
        <button
          type="button"
          className="small"
          onClick={() => update((s) => ({ ...s, parts: [...s.parts, newPart("", "")] }))}
        >
          + other part
        </button>
      </div>
    </fieldset>
  );
}
