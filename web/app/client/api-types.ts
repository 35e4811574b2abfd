/**
 * The API's response shapes as the browser reads them: one type for each thing, shared by every
 * component. Where the server declares the shape it sends, the type here is derived from the
 * server's with `import type` (erased from the browser bundle); the rest name their server module.
 */
import type { EntrySummary as StoredEntrySummary } from "@teardown/db";
import type { AnalysisResult } from "@teardown/engine";
import type { CompareSide, EntryComparison } from "@/lib/compare/compare-entries";

export type { ComparedPair, FigureRow, NetChange } from "@teardown/engine";
export type { CompareSide, EntryComparison };

/** One problem the API lists (422 bodies), with the file line for records. */
export interface ApiProblem {
  path: string;
  message: string;
  code?: string;
  line?: number | null;
  column?: number | null;
}

/** The API's error body (`{ error: {...} }`), with the extra fields some answers carry. */
export interface ApiErrorBody {
  code: string;
  message: string;
  path?: string;
  errors?: ApiProblem[];
  [key: string]: unknown;
}

export type Role = "owner" | "editor" | "viewer";

/** A finished result as entry reads send it: everything but the waveforms (fetched on their own). */
export type EntryResult = AnalysisResult extends infer R
  ? R extends unknown
    ? Omit<R, "waveforms">
    : never
  : never;

/** GET /api/entries/:id/revisions/:number/waveforms. */
export interface WaveformsAnswer {
  engineVersion: string | null;
  finishedAt: string | null;
  /** Time in seconds and named series; null while no finished, solved analysis is shown. */
  waveforms: { t: number[]; series: Record<string, number[]> } | null;
}

/** An analysis as GET /api/entries/:id shows it; fields by state (see web/lib/entry-state.ts). */
export interface AnalysisView {
  state: "queued" | "running" | "done" | "failed";
  engineVersion: string;
  queuedAt?: string;
  startedAt?: string | null;
  finishedAt?: string | null;
  /** The parsed result without its waveforms (done); null when the stored one could not be read. */
  result?: EntryResult | null;
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

export interface FieldChange {
  field: string;
  from: unknown;
  to: unknown;
}
export interface PartBrief {
  ref: string;
  kind: string;
  value: string | null;
  pins: Record<string, string>;
}
/** The API's RevisionDiff (web/lib/revision-diff.ts). */
export interface RevisionDiff {
  record: FieldChange[];
  parts: {
    added: PartBrief[];
    removed: PartBrief[];
    changed: {
      ref: string;
      kind: string;
      changes: FieldChange[];
      pins: { pin: string; from: string | null; to: string | null }[];
    }[];
  };
  nets: { added: string[]; removed: string[]; changed: { net: string; changes: FieldChange[] }[] };
  measurements: {
    added: { key: string; what: string; value: number }[];
    removed: { key: string; what: string; value: number }[];
    changed: { key: string; what: string; changes: FieldChange[] }[];
  };
  same: boolean;
}

/** One member as the team endpoint lists it. */
export interface TeamMemberRow {
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}

/** One entry as the list and search endpoints return it: the server's summary, dates as JSON strings. */
export type EntrySummary = Omit<StoredEntrySummary, "updatedAt"> & { updatedAt: string };

/** An API token as the settings list shows it (never the token itself). */
export interface TokenInfo {
  id: string;
  name: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

/** A new one-time invitation, shown once. */
export interface NewInvite {
  token: string;
  url: string;
  role: string;
  expiresAt: string;
}

/** POST /api/entries/:id/what-if: another supply and/or changed part values. */
export interface WhatIfRequest {
  supply?: { vrms: number; hz: number };
  changes?: { part: string; value: string }[];
}

/** The what-if answer: the analysis result of that variant, in the stored result's shape. */
export interface WhatIfAnswer {
  result: AnalysisResult;
  /** The input as the server read it. */
  input: WhatIfRequest;
  /** True when the answer came from the cache of (revision, engine version, input). */
  cached: boolean;
  /** The revision it was run on (the entry's current one). */
  revision: number;
}

/** What a trigger suggests when it stops firing at a what-if supply (`triggers[].suggestion`). */
export interface TriggerSuggestion {
  part: string;
  value: number;
  series: string;
  angle_deg: number;
}

/** One value of a search facet and how many entries have it under the current query. */
export interface FacetCount {
  value: string;
  count: number;
  /** The value as people read it, where it is not the value itself (a team's name). */
  label?: string;
}

/** The facets GET /api/search counts (`mismatch` holds "true"/"false" when the server sends it). */
export interface SearchFacets {
  category: FacetCount[];
  flag: FacetCount[];
  block: FacetCount[];
  supply: FacetCount[];
  team: FacetCount[];
  mismatch?: FacetCount[];
}

/** One hit of GET /api/search; `snippet` is escaped text whose matched words sit in <mark>…</mark>. */
export interface SearchHit {
  entry: EntrySummary;
  score: number;
  snippet: string;
}

/** GET /api/search. */
export interface SearchAnswer {
  results: SearchHit[];
  facets: SearchFacets;
  /** False when more entries matched than the server counted: each count is a lower bound. */
  facetsExact: boolean;
  /** False when more entries matched than the server ranked: the best of the first ones. */
  rankedAll: boolean;
  nextCursor: string | null;
}

/** One hit of GET /api/entries/:id/similar: the entry, its similarity (0..1), blocks both have. */
export interface SimilarHit {
  entry: EntrySummary;
  score: number;
  sharedBlocks: string[];
}

/** GET /api/entries/:id/similar, best first. */
export interface SimilarAnswer {
  results: SimilarHit[];
}

/** Where a fragment sits in one entry: fragment part ref → the entry's part ref. */
export interface FragmentMatch {
  parts: Record<string, string>;
}

/** POST /api/search/fragment. */
export interface FragmentAnswer {
  results: { entry: EntrySummary; matches: FragmentMatch[] }[];
  /** False when the server stopped before confirming every candidate (the list may be short). */
  complete?: boolean;
}

/** The formats a pasted fragment may be written in. */
export type FragmentFormat = "record" | "deck" | "csv";
