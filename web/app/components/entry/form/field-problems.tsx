"use client";
/** The problems placed at one field, right under it. */
import type { ProblemPlaces } from "./place-errors";
import css from "./form.module.css";

/** The messages of the problems placed at `path` (nothing when there are none). */
export function FieldProblems({ places, path }: { places: ProblemPlaces; path: string }) {
  const list = places.at.get(path);
  if (!list || list.length === 0) return null;
  return (
    <>
      {list.map((p, i) => (
        <div key={i} className={css.problem} role="alert" data-path={p.path}>
          {p.path !== path && p.path.startsWith(path) ? (
            <span>{p.path.slice(path.length).replace(/^\./, "")}: </span>
          ) : null}
          {p.message}
        </div>
      ))}
    </>
  );
}

/** True when a problem sits at `path`, for aria-invalid. */
export function hasProblem(places: ProblemPlaces, path: string): boolean {
  return (places.at.get(path)?.length ?? 0) > 0;
}
