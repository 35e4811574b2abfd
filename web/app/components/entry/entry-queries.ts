"use client";
/**
 * The entry page's data through TanStack Query: the entry state (polled while its analysis is
 * queued or running), the team, revisions, photos and comments. One key per thing, so a write
 * invalidates exactly what it changed.
 */
import { useQuery } from "@tanstack/react-query";
import type { AnalysisResult } from "@teardown/engine";
import { getJson } from "./api-client";

export type Role = "owner" | "editor" | "viewer";

/** An analysis as GET /api/entries/:id shows it; fields by state (see web/lib/entry-state.ts). */
export interface AnalysisView {
  state: "queued" | "running" | "done" | "failed";
  engineVersion: string;
  queuedAt?: string;
  startedAt?: string | null;
  finishedAt?: string | null;
  /** The parsed result (done); null when the stored one could not be read. */
  result?: AnalysisResult | null;
  /** The older engine an upgraded result came from, else null. */
  upgradedFrom?: string | null;
  /** Why a stored result could not be read. */
  resultProblem?: string | null;
  layout?: unknown;
  timings?: unknown;
  error?: string;
  stage?: string | null;
}

/** GET /api/entries/:id. */
export interface EntryState {
  entry: {
    id: string;
    teamId: string;
    title: string;
    category: string | null;
    visibility: "team" | "public";
    currentRevision: number | null;
    archived: boolean;
    createdAt: string;
    updatedAt: string;
  };
  role: Role | null;
  revision: {
    number: number;
    message: string;
    authorId: string | null;
    createdAt: string;
    recordHash: string;
    record: Record<string, unknown>;
  };
  engineVersion: string;
  analysis: AnalysisView | null;
  olderAnalysis: AnalysisView | null;
}

export interface TeamMember {
  userId: string;
  name: string;
  email: string;
  role: Role;
}

export interface TeamView {
  id: string;
  name: string;
  role: Role;
  members: TeamMember[];
}

export interface RevisionSummary {
  number: number;
  message: string;
  authorId: string | null;
  authorName: string | null;
  recordHash: string;
  createdAt: string;
}

export interface PhotoView {
  id: string;
  side: "component" | "track" | "other";
  contentType: string;
  sizeBytes: number;
  width: number | null;
  height: number | null;
  caption: string | null;
  createdAt: string;
  url: string;
}

export interface CommentView {
  id: string;
  partRef: string | null;
  authorId: string | null;
  authorName: string | null;
  body: string;
  mentions: string[];
  createdAt: string;
}

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
