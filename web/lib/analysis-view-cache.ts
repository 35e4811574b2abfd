/**
 * Finished analyses, read once per process. A done analysis row never changes while it stays
 * done (a re-run sets it back to queued and writes a new finish time), so its parsed view can be
 * kept under (analysis id, finish time). Reading it again per request cost the most on the entry
 * page and its API: fetching the result and layout JSON from Postgres and checking the result
 * against the engine's schema, for every view. Measured on the shared 2-core dev machine (a
 * night-light entry, 25 kB result): the full row read 7.9 ms against 0.4 ms without the JSON
 * columns, and the schema check 3.5 ms, per request.
 *
 * Bounded, least recently used first out; a process restart starts empty. The cached view is
 * shared between requests, so callers serialise it and never change it.
 */
import type { AnalysisView } from "./entry-state";

/** How many finished analyses one process keeps parsed (each is some tens of kilobytes). */
const MAX_CACHED = 300;

const globalForCache = globalThis as unknown as {
  teardownAnalysisViews?: Map<string, Extract<AnalysisView, { state: "done" }>>;
};

function views() {
  globalForCache.teardownAnalysisViews ??= new Map();
  return globalForCache.teardownAnalysisViews;
}

/** The key of one finished analysis: its id and finish time (a re-run changes the latter). */
export function doneKey(id: string, finishedAt: Date | null): string {
  return `${id}@${finishedAt?.getTime() ?? "none"}`;
}

/** The cached view of a finished analysis, or undefined (then it is marked most recent). */
export function cachedDoneView(key: string): Extract<AnalysisView, { state: "done" }> | undefined {
  const map = views();
  const hit = map.get(key);
  if (hit) {
    map.delete(key);
    map.set(key, hit);
  }
  return hit;
}

/** Keeps a finished analysis's view, dropping the least recently used beyond the bound. */
export function keepDoneView(key: string, view: Extract<AnalysisView, { state: "done" }>): void {
  const map = views();
  map.set(key, view);
  while (map.size > MAX_CACHED) map.delete(map.keys().next().value as string);
}
