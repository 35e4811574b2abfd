"use client";
/**
 * Two net-name inputs side by side, for anything measured "between" two nets (a voltage reading,
 * a board spacing). Both are flagged when the record's `<base>.between` has a problem.
 */
import { hasProblem } from "./field-problems";
import type { ProblemPlaces } from "./place-errors";
import css from "./form.module.css";

interface NetField {
  name: string;
  label: string;
  placeholder?: string;
  value: string;
  onChange: (value: string) => void;
}

/** The pair of inputs; `betweenPath` is the record path whose problems mark them invalid. */
export function NetPairFields({
  first,
  second,
  places,
  betweenPath,
}: {
  first: NetField;
  second: NetField;
  places: ProblemPlaces;
  betweenPath: string;
}) {
  const invalid = hasProblem(places, betweenPath);
  return (
    <div className={css.pins}>
      {[first, second].map((f) => (
        <input
          key={f.name}
          className={`${css.input} ${css.tiny}`}
          name={f.name}
          aria-label={f.label}
          placeholder={f.placeholder}
          list="teardown-nets"
          value={f.value}
          aria-invalid={invalid}
          onChange={(e) => f.onChange(e.target.value)}
        />
      ))}
    </div>
  );
}
