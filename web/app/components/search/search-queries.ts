"use client";
/**
 * The search page's reads through TanStack Query and the one HTTP client. Each key holds the
 * whole request, so a URL the user goes back to is answered from the cache.
 */
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { getJson, sendJson } from "../../client/http";
import type {
  EntryState,
  FragmentAnswer,
  FragmentFormat,
  SearchAnswer,
  SimilarAnswer,
  TeamView,
} from "../../client/api-types";
import { searchApiUrl, SIMILAR_LIMIT, type TextSearchState } from "./search-url";

/** One page of a text search with its facet counts. */
export function useTextSearch(state: TextSearchState) {
  const url = searchApiUrl(state);
  return useQuery({
    queryKey: ["search", url],
    queryFn: () => getJson<SearchAnswer>(url),
    placeholderData: keepPreviousData,
  });
}

/** The entries most like one entry, best first. */
export function useSimilar(entryId: string) {
  return useQuery({
    queryKey: ["search", "similar", entryId],
    queryFn: () =>
      getJson<SimilarAnswer>(
        `/api/entries/${encodeURIComponent(entryId)}/similar?limit=${SIMILAR_LIMIT}`,
      ),
    retry: false,
  });
}

/** The entries that contain a pasted fragment (a read, though it is a POST: the text is long). */
export function useFragmentSearch(text: string, format: FragmentFormat) {
  return useQuery({
    queryKey: ["search", "fragment", format, text],
    queryFn: () => sendJson<FragmentAnswer>("/api/search/fragment", { text, format }),
    enabled: text.trim() !== "",
    retry: false,
  });
}

/** One entry as its page reads it (the schematic's stored layout is in its analysis). */
export function useEntryState(entryId: string | null) {
  return useQuery({
    queryKey: ["entry", entryId],
    queryFn: () => getJson<EntryState>(`/api/entries/${encodeURIComponent(entryId!)}`),
    enabled: entryId !== null,
    retry: false,
  });
}

/** The signed-in visitor's teams, to name the team facet's values (none when signed out). */
export function useMyTeams() {
  return useQuery({
    queryKey: ["teams", "mine"],
    queryFn: () =>
      getJson<{ teams: Pick<TeamView, "id" | "name">[] }>("/api/teams").then((r) => r.teams),
    retry: false,
    staleTime: 60_000,
  });
}
