"use client";
/**
 * Words and facts: the search box, the facets with their counts, and one page of ranked hits
 * with highlighted snippets. Every change is a new URL (pushed, so Back undoes it); pages follow
 * the API's cursor forward, and the browser's Back returns to the page before.
 */
import Link from "next/link";
import { useRouter } from "next/navigation";
import type { FormEvent } from "react";
import { failureText } from "../../client/http";
import { CompareBar } from "./compare-bar";
import { useComparePicks } from "./compare-picker";
import { EntryHeading } from "./entry-heading";
import { FacetPanel } from "./facet-panel";
import { HighlightedSnippet } from "./highlighted-snippet";
import { useTextSearch } from "./search-queries";
import {
  emptyTextSearch,
  pickedCount,
  searchHref,
  toggleFacetValue,
  type TextSearchState,
} from "./search-url";
import css from "./search.module.css";

export function TextSearchView({
  state,
  teamNames,
}: {
  state: TextSearchState;
  teamNames: ReadonlyMap<string, string>;
}) {
  const router = useRouter();
  const query = useTextSearch(state);
  const picks = useComparePicks();
  const go = (next: TextSearchState) => router.push(searchHref(next), { scroll: false });

  function onSubmit(ev: FormEvent<HTMLFormElement>) {
    ev.preventDefault();
    const q = String(new FormData(ev.currentTarget).get("q") ?? "");
    go({ ...state, q, cursor: null });
  }

  const results = query.data?.results ?? [];
  const ranked = state.q.trim() !== "";
  return (
    <div className={css.textSearch}>
      <form role="search" className={css.searchForm} onSubmit={onSubmit} key={state.q}>
        <label className="grow">
          <span>Words</span>
          <input
            name="q"
            type="search"
            defaultValue={state.q}
            placeholder="title, summary, tags, markings, notes, comments"
            aria-describedby="search-help"
          />
        </label>
        <button type="submit">Search</button>
      </form>
      <p id="search-help" className="muted small">
        Quotes keep words together, <code>or</code> offers alternatives, a leading <code>-</code>{" "}
        leaves a word out. Comments are searched only in your own teams&apos; entries.
        {pickedCount(state) > 0 && (
          <>
            {" "}
            <Link href={searchHref({ ...emptyTextSearch(), q: state.q })}>Clear all facets</Link>
          </>
        )}
      </p>
      <div className={css.layout}>
        <FacetPanel
          state={state}
          facets={query.data?.facets}
          exact={query.data?.facetsExact ?? true}
          teamNames={teamNames}
          onToggle={(facet, value) => go(toggleFacetValue(state, facet, value))}
        />
        <section className={css.results} aria-label="Search results" aria-busy={query.isFetching}>
          <CompareBar picked={picks.picked} onClear={picks.clear} />
          {query.isError ? (
            <p className="error-text" role="alert">
              Could not search: {failureText(query.error)}
            </p>
          ) : query.isPending ? (
            <p className="muted">Searching…</p>
          ) : results.length === 0 ? (
            <p className="muted" data-testid="no-results">
              {state.cursor ? "No more entries." : "No entries match."}
            </p>
          ) : (
            <>
              {query.data?.rankedAll === false && (
                <p className="muted small" data-testid="ranked-sample">
                  Many entries hold these words, so only the first ones found were ranked. Add a
                  word or pick a facet to rank every match.
                </p>
              )}
              <ol className={css.hitList} data-testid="entry-list">
                {results.map((hit) => (
                  <li key={hit.entry.id} className={css.hit} data-entry-id={hit.entry.id}>
                    <input
                      type="checkbox"
                      className={css.pick}
                      aria-label={`Pick ${hit.entry.title} to compare`}
                      checked={picks.picked.includes(hit.entry.id)}
                      onChange={() => picks.toggle(hit.entry.id)}
                    />
                    <div className={css.hitBody}>
                      <EntryHeading entry={hit.entry} teamName={teamNames.get(hit.entry.teamId)} />
                      <HighlightedSnippet snippet={hit.snippet} />
                      <p className="muted small">
                        {ranked ? <>score {hit.score.toFixed(3)} · </> : null}
                        updated {hit.entry.updatedAt.slice(0, 10)} ·{" "}
                        <Link href={searchHref({ view: "similar", entryId: hit.entry.id })}>
                          Similar circuits
                        </Link>
                      </p>
                    </div>
                  </li>
                ))}
              </ol>
            </>
          )}
          <nav className="pager" aria-label="Result pages">
            {state.cursor && <Link href={searchHref({ ...state, cursor: null })}>First page</Link>}
            {query.data?.nextCursor && !query.isPlaceholderData && (
              <Link href={searchHref({ ...state, cursor: query.data.nextCursor })}>Next page</Link>
            )}
            {query.isFetching && <span className="muted">Loading…</span>}
          </nav>
        </section>
      </div>
    </div>
  );
}
