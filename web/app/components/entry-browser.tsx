"use client";
/**
 * A searchable, sortable, paginated list of entries over one of the API's list endpoints
 * (`/api/entries` for everything the visitor may read, `/api/teams/:id/entries` for one team).
 * Pages follow the API's opaque cursor; the cursors seen so far are kept so "Previous" works.
 * This is a plain list (sorting, archived entries); ranked search with facet counts, similar
 * circuits and fragments is the search page, which a link here opens with the same words.
 */
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useState, type FormEvent } from "react";
import { BLOCK_KINDS, FLAG_CODES } from "@teardown/engine";
import { getJson } from "../client/http";
import type { EntrySummary } from "../client/api-types";

interface Filters {
  q: string;
  category: string;
  flag: string;
  block: string;
  sort: "updated" | "title";
  archived: "exclude" | "include" | "only";
}

const NO_FILTERS: Filters = {
  q: "",
  category: "",
  flag: "",
  block: "",
  sort: "updated",
  archived: "exclude",
};
/** The search page for the same words (and the same team, for a team's list). */
function searchPageHref(endpoint: string, q: string): string {
  const p = new URLSearchParams();
  const team = /^\/api\/teams\/([^/]+)\/entries$/.exec(endpoint)?.[1];
  if (q.trim()) p.set("q", q.trim());
  if (team) p.set("team", decodeURIComponent(team));
  const qs = p.toString();
  return qs ? `/search?${qs}` : "/search";
}

/** Entries per page. */
const PAGE_SIZE = 20;

function listUrl(endpoint: string, f: Filters, cursor: string | null): string {
  const p = new URLSearchParams();
  for (const key of ["q", "category", "flag", "block"] as const)
    if (f[key].trim()) p.set(key, f[key].trim());
  p.set("sort", f.sort);
  p.set("archived", f.archived);
  p.set("limit", String(PAGE_SIZE));
  if (cursor) p.set("cursor", cursor);
  return `${endpoint}?${p.toString()}`;
}

/** The entry list with its search form; `showArchived` offers the archived toggle (team views). */
export function EntryBrowser(props: { endpoint: string; showArchived?: boolean; label: string }) {
  const [filters, setFilters] = useState<Filters>(NO_FILTERS);
  // cursors[i] is the cursor that fetches page i (page 0 needs none).
  const [cursors, setCursors] = useState<Array<string | null>>([null]);
  const [page, setPage] = useState(0);
  const cursor = cursors[page] ?? null;
  const query = useQuery({
    queryKey: ["entries", props.endpoint, filters, cursor],
    queryFn: () =>
      getJson<{ entries: EntrySummary[]; nextCursor: string | null }>(
        listUrl(props.endpoint, filters, cursor),
      ),
    placeholderData: keepPreviousData,
  });

  function apply(next: Filters) {
    setFilters(next);
    setCursors([null]);
    setPage(0);
  }
  function onSubmit(ev: FormEvent<HTMLFormElement>) {
    ev.preventDefault();
    const d = new FormData(ev.currentTarget);
    const text = (k: string) => String(d.get(k) ?? "");
    apply({
      ...filters,
      q: text("q"),
      category: text("category"),
      flag: text("flag"),
      block: text("block"),
    });
  }
  function goNext() {
    const next = query.data?.nextCursor;
    if (!next) return;
    setCursors((cs) => [...cs.slice(0, page + 1), next]);
    setPage(page + 1);
  }

  const entries = query.data?.entries ?? [];
  return (
    <section className="entry-browser" aria-label={props.label}>
      <form className="filters" onSubmit={onSubmit} role="search">
        <label className="grow">
          <span>Search</span>
          <input
            name="q"
            type="search"
            placeholder="title, notes, markings"
            defaultValue={filters.q}
          />
        </label>
        <label>
          <span>Category</span>
          <input name="category" placeholder="e.g. night light" defaultValue={filters.category} />
        </label>
        <label>
          <span>Flag</span>
          <select name="flag" defaultValue={filters.flag}>
            <option value="">any</option>
            {FLAG_CODES.map((c) => (
              <option key={c} value={c}>
                {c}
              </option>
            ))}
          </select>
        </label>
        <label>
          <span>Block</span>
          <select name="block" defaultValue={filters.block}>
            <option value="">any</option>
            {BLOCK_KINDS.map((k) => (
              <option key={k} value={k}>
                {k}
              </option>
            ))}
          </select>
        </label>
        <button type="submit">Search</button>
      </form>
      <div className="list-controls">
        <label>
          Sort by{" "}
          <select
            name="sort"
            value={filters.sort}
            onChange={(e) => apply({ ...filters, sort: e.target.value as Filters["sort"] })}
          >
            <option value="updated">last updated</option>
            <option value="title">title</option>
          </select>
        </label>
        {props.showArchived && (
          <label>
            Archived{" "}
            <select
              name="archived"
              value={filters.archived}
              onChange={(e) =>
                apply({ ...filters, archived: e.target.value as Filters["archived"] })
              }
            >
              <option value="exclude">hidden</option>
              <option value="include">shown too</option>
              <option value="only">only archived</option>
            </select>
          </label>
        )}
        <Link href={searchPageHref(props.endpoint, filters.q)}>
          Ranked search with facet counts
        </Link>
        {query.isFetching && <span className="muted">Loading…</span>}
      </div>
      {query.isError ? (
        <p className="error-text" role="alert">
          Could not load entries: {query.error.message}
        </p>
      ) : query.isPending ? (
        <p className="muted">Loading entries…</p>
      ) : entries.length === 0 ? (
        <p className="muted">{page === 0 ? "No entries match." : "No more entries."}</p>
      ) : (
        <table className="list" data-testid="entry-list">
          <thead>
            <tr>
              <th>Title</th>
              <th>Category</th>
              <th>Flags</th>
              <th>Analysis</th>
              <th>Updated</th>
            </tr>
          </thead>
          <tbody>
            {entries.map((e) => (
              <tr key={e.id} className={e.archived ? "archived" : undefined}>
                <td>
                  <Link href={`/entries/${e.id}`}>{e.title}</Link>
                  {e.archived && <span className="tag">archived</span>}
                  {e.visibility === "public" && <span className="tag quiet">public</span>}
                </td>
                <td>{e.category ?? "—"}</td>
                <td>
                  {e.flags.length === 0 ? (
                    <span className="muted">none</span>
                  ) : (
                    e.flags.map((f) => (
                      <span key={f} className="chip">
                        {f}
                      </span>
                    ))
                  )}
                </td>
                <td>
                  <span className={`state state-${e.analysisState ?? "none"}`}>
                    {e.analysisState ?? "—"}
                  </span>
                </td>
                <td>
                  <time dateTime={e.updatedAt}>{e.updatedAt.slice(0, 10)}</time>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <div className="pager">
        <button type="button" onClick={() => setPage(page - 1)} disabled={page === 0}>
          Previous
        </button>
        <span className="muted">Page {page + 1}</span>
        <button
          type="button"
          onClick={goNext}
          disabled={!query.data?.nextCursor || query.isPlaceholderData}
        >
          Next
        </button>
      </div>
    </section>
  );
}
