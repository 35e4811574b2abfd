"use client";
/**
 * The search page's body: reads its state from the URL and shows one of the three views
 * (words and facts, similar circuits, circuit fragment) under a row of view links.
 */
import Link from "next/link";
import { useSearchParams } from "next/navigation";
import { useMemo } from "react";
import { FragmentView } from "./fragment-view";
import { useMyTeams } from "./search-queries";
import { emptyTextSearch, readSearchState, searchHref, type SearchState } from "./search-url";
import { SimilarView } from "./similar-view";
import { TextSearchView } from "./text-search-view";
import css from "./search.module.css";

const VIEWS: { view: SearchState["view"]; label: string; href: string }[] = [
  { view: "text", label: "Words and facts", href: searchHref(emptyTextSearch()) },
  { view: "fragment", label: "Circuit fragment", href: "/search?view=fragment" },
];

export function SearchView() {
  const params = useSearchParams();
  const state = useMemo(() => readSearchState(new URLSearchParams(params.toString())), [params]);
  const teams = useMyTeams();
  const teamNames = useMemo(
    () => new Map((teams.data ?? []).map((t) => [t.id, t.name] as const)),
    [teams.data],
  );
  return (
    <>
      <nav className={css.views} aria-label="Search views">
        {VIEWS.map((v) => (
          <Link
            key={v.view}
            href={v.href}
            aria-current={state.view === v.view ? "page" : undefined}
          >
            {v.label}
          </Link>
        ))}
        {state.view === "similar" && <span aria-current="page">Similar circuits</span>}
      </nav>
      {state.view === "text" ? (
        <TextSearchView state={state} teamNames={teamNames} />
      ) : state.view === "similar" ? (
        <SimilarView entryId={state.entryId} teamNames={teamNames} />
      ) : (
        <FragmentView key={`${state.format}\n${state.text}`} state={state} teamNames={teamNames} />
      )}
    </>
  );
}
