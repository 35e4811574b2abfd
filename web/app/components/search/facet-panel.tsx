"use client";
/**
 * The facets of a text search: for each, its values with how many entries have them under the
 * current words and the other facets' picks. Several values of one facet may be picked (any of
 * them will do); picks of different facets must all hold. Each tick changes the URL. When more
 * entries match than the server counted, the counts are lower bounds and read "n+".
 */
import type { FacetCount, SearchFacets } from "../../client/api-types";
import { FACET_TITLES, facetValueLabel } from "./facet-labels";
import { FACETS, type Facet, type TextSearchState } from "./search-url";
import css from "./search.module.css";

/** The counted values, with any picked value the counts no longer hold shown as 0. */
function valuesOf(facet: Facet, facets: SearchFacets | undefined, picked: string[]): FacetCount[] {
  const counted = facets?.[facet] ?? [];
  const missing = picked
    .filter((v) => !counted.some((c) => c.value === v))
    .map((value) => ({ value, count: 0 }));
  return [...counted, ...missing];
}

export function FacetPanel({
  state,
  facets,
  exact,
  teamNames,
  onToggle,
}: {
  state: TextSearchState;
  facets: SearchFacets | undefined;
  /** False when the counts are lower bounds (more entries matched than were counted). */
  exact: boolean;
  teamNames: ReadonlyMap<string, string>;
  onToggle: (facet: Facet, value: string) => void;
}) {
  return (
    <aside className={css.facets} aria-label="Narrow the search">
      {!exact && (
        <p className="muted small" data-testid="facet-counts-approximate">
          More entries match than were counted: each count is at least the number shown.
        </p>
      )}
      {FACETS.map((facet) => {
        const values = valuesOf(facet, facets, state.filters[facet]);
        return (
          <fieldset key={facet} className={css.facet} data-facet={facet}>
            <legend>{FACET_TITLES[facet]}</legend>
            {values.length === 0 ? (
              <p className="muted small">none under this search</p>
            ) : (
              <ul>
                {values.map(({ value, count, label: named }) => {
                  const label = facetValueLabel(facet, value, teamNames, named);
                  const checked = state.filters[facet].includes(value);
                  return (
                    <li key={value}>
                      <label className={checked ? css.picked : undefined}>
                        <input
                          type="checkbox"
                          name={facet}
                          value={value}
                          checked={checked}
                          onChange={() => onToggle(facet, value)}
                        />{" "}
                        {label} <span className={css.count}>({exact ? count : `${count}+`})</span>
                      </label>
                    </li>
                  );
                })}
              </ul>
            )}
          </fieldset>
        );
      })}
    </aside>
  );
}
