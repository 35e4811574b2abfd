/**
 * Writes of the search columns: everything from one analysis (the worker), or the topology
 * features alone (the backfill that recomputes rows written under an older feature definition).
 */
import { and, eq, gt, lt } from "drizzle-orm";
import type { Database } from "../client.js";
import type { DatabaseOrTx } from "../entries.js";
import { entries, revisions } from "../schema/entries.js";

/** The topology features of one record (what the engine's topologyColumnsFor returns). */
export interface TopologyColumnValues {
  fingerprint: number[];
  valueFeatures: number[];
  fragmentFeatures: number[];
  /** The circuit's structure as the engine's topologyOf writes it. */
  topology: unknown;
  version: number;
}

/** Everything an analysis writes into an entry's search columns. */
export interface SearchColumnValues extends TopologyColumnValues {
  blocks: string[];
  flags: string[];
  facets: Record<string, string | number | boolean | null>;
  text: string;
  tags: string;
  mismatch: boolean;
}

/** Writes an analysis's search columns, when `revisionNumber` is still the entry's current one. */
export async function writeSearchColumns(
  db: DatabaseOrTx,
  entryId: string,
  revisionNumber: number,
  s: SearchColumnValues,
): Promise<void> {
  await db
    .update(entries)
    .set({
      searchBlocks: s.blocks,
      searchFlags: s.flags,
      fingerprint: s.fingerprint,
      valueFeatures: s.valueFeatures,
      fragmentFeatures: s.fragmentFeatures,
      topology: s.topology,
      fingerprintVersion: s.version,
      facets: s.facets,
      searchText: s.text,
      searchTags: s.tags,
      hasMismatch: s.mismatch,
    })
    .where(and(eq(entries.id, entryId), eq(entries.currentRevision, revisionNumber)));
}

/** Entries (after `afterId`, in id order) whose topology features are from an older definition. */
export async function entriesBehindFingerprint(
  db: Database,
  version: number,
  afterId: string | null,
  limit: number,
): Promise<Array<{ id: string; revision: number; record: unknown }>> {
  const rows = await db
    .select({ id: entries.id, revision: revisions.number, record: revisions.record })
    .from(entries)
    .innerJoin(
      revisions,
      and(eq(revisions.entryId, entries.id), eq(revisions.number, entries.currentRevision)),
    )
    .where(
      and(
        lt(entries.fingerprintVersion, version),
        afterId === null ? undefined : gt(entries.id, afterId),
      ),
    )
    .orderBy(entries.id)
    .limit(limit);
  return rows;
}

/**
 * Writes recomputed topology features (and the tags, which older rows lack), unless the entry
 * moved on to another revision meanwhile (its own analysis then writes them).
 */
export async function writeTopologyColumns(
  db: DatabaseOrTx,
  entryId: string,
  revisionNumber: number,
  t: TopologyColumnValues & { tags: string },
): Promise<void> {
  await db
    .update(entries)
    .set({
      fingerprint: t.fingerprint,
      valueFeatures: t.valueFeatures,
      fragmentFeatures: t.fragmentFeatures,
      topology: t.topology,
      fingerprintVersion: t.version,
      searchTags: t.tags,
    })
    .where(
      and(
        eq(entries.id, entryId),
        eq(entries.currentRevision, revisionNumber),
        lt(entries.fingerprintVersion, t.version),
      ),
    );
}
