/**
 * Recomputes the topology search features of entries written under an older feature
 * definition (the fingerprint used to carry value decades; migration 0003 marks every existing
 * row as behind). Runs at worker start, in the background, a batch at a time; each entry is
 * its own small write, so several workers starting at once only repeat harmless work. It needs
 * no analysis: the features come from the record alone.
 */
import { entriesBehindFingerprint, writeTopologyColumns, type Database } from "@teardown/db";
import { FINGERPRINT_VERSION, parseRecord, topologyColumnsFor } from "@teardown/engine";

/** Entries read per batch. */
const BACKFILL_BATCH = 200;

/** Brings every entry's topology features to the current definition; returns how many it wrote. */
export async function backfillFingerprints(
  db: Database,
): Promise<{ updated: number; unreadable: number }> {
  let updated = 0;
  let unreadable = 0;
  // One pass in id order, so a row that cannot be brought up to date is not read again.
  let after: string | null = null;
  for (;;) {
    const batch = await entriesBehindFingerprint(db, FINGERPRINT_VERSION, after, BACKFILL_BATCH);
    if (batch.length === 0) return { updated, unreadable };
    after = batch[batch.length - 1]!.id;
    for (const row of batch) {
      const parsed = parseRecord(JSON.stringify(row.record), { filename: "revision.json" });
      if (!parsed.ok) {
        // A stored record that no longer validates keeps empty features: it cannot be searched
        // by structure.
        unreadable++;
        continue;
      }
      await writeTopologyColumns(db, row.id, row.revision, {
        ...topologyColumnsFor(parsed.record),
        tags: parsed.record.device.tags.join(" "),
      });
      updated++;
    }
  }
}
