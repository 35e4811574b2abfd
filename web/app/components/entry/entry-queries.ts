"use client";
/**
 * The entry page's data through TanStack Query: the entry state (polled while its analysis is
 * queued or running), the team, revisions, photos, comments and what-if answers. One key per thing, so a write
 * invalidates exactly what it changed.
 */
import { useQuery } from "@tanstack/react-query";
import { getJson, sendJson } from "../../client/http";
import type {
  CommentView,
  EntryState,
  PhotoView,
  RevisionSummary,
  TeamView,
  WaveformsAnswer,
  WhatIfAnswer,
  WhatIfRequest,
} from "../../client/api-types";

/** How often the entry is re-read while its analysis is waiting or running, in milliseconds. */
export const ANALYSIS_POLL_MS = 1500;

/** True while the analysis has not finished (nothing queued yet counts as waiting). */
export function analysisPending(state: EntryState | undefined): boolean {
  const a = state?.analysis;
  return (
    state !== undefined &&
    (a === null || a === undefined || a.state === "queued" || a.state === "running")
  );
}

export const entryKey = (entryId: string) => ["entry", entryId] as const;

/** The entry state, re-read every ANALYSIS_POLL_MS while the analysis is queued or running. */
export function useEntry(entryId: string, initial?: EntryState | null) {
  return useQuery({
    queryKey: entryKey(entryId),
    ...(initial ? { initialData: initial } : {}),
    queryFn: () => getJson<EntryState>(`/api/entries/${entryId}`),
    refetchInterval: (q) => (analysisPending(q.state.data) ? ANALYSIS_POLL_MS : false),
    retry: false,
  });
}

/** The team (members only; null-ish for outsiders reading a public entry). */
export function useTeam(teamId: string | undefined, enabled = true) {
  return useQuery({
    queryKey: ["team", teamId],
    queryFn: () => getJson<{ team: TeamView }>(`/api/teams/${teamId}`).then((r) => r.team),
    enabled: enabled && teamId !== undefined,
    retry: false,
  });
}

/** The entry's history, newest first. */
export function useRevisions(entryId: string) {
  return useQuery({
    queryKey: ["entry", entryId, "revisions"],
    queryFn: () =>
      getJson<{ currentRevision: number; revisions: RevisionSummary[] }>(
        `/api/entries/${entryId}/revisions`,
      ),
  });
}

/** The entry's photos. */
export function usePhotos(entryId: string) {
  return useQuery({
    queryKey: ["entry", entryId, "photos"],
    queryFn: () =>
      getJson<{ photos: PhotoView[] }>(`/api/entries/${entryId}/photos`).then((r) => r.photos),
  });
}

/** The entry's comments (team members only). */
export function useComments(entryId: string, enabled: boolean) {
  return useQuery({
    queryKey: ["entry", entryId, "comments"],
    queryFn: () =>
      getJson<{ comments: CommentView[] }>(`/api/entries/${entryId}/comments`).then(
        (r) => r.comments,
      ),
    enabled,
    retry: false,
  });
}

/**
 * The waveforms of the analysis shown for a revision, fetched when first drawn. `analysisKey`
 * names that analysis (engine version and finish time), so a finished re-run asks again.
 */
export function useWaveforms(entryId: string, revision: number, analysisKey: string) {
  return useQuery({
    queryKey: ["entry", entryId, "waveforms", revision, analysisKey],
    queryFn: () =>
      getJson<WaveformsAnswer>(`/api/entries/${entryId}/revisions/${revision}/waveforms`),
    staleTime: Infinity,
    retry: false,
  });
}

/** The what-if of one input on one revision, asked once and kept (the server caches it too). */
export function useWhatIf(entryId: string, revision: number, input: WhatIfRequest | null) {
  return useQuery({
    queryKey: ["entry", entryId, "what-if", revision, JSON.stringify(input)],
    queryFn: () =>
      sendJson<WhatIfAnswer>(`/api/entries/${entryId}/what-if`, input).then((r) => r.result),
    enabled: input !== null,
    staleTime: Infinity,
    retry: false,
  });
}
