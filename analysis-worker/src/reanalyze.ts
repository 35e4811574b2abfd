/**
 * `npm run reanalyze`: enqueue every entry's current revision for the current engine version.
 * Older analyses stay readable until the new one is done (they are other rows).
 */
import { and, eq, isNotNull } from "drizzle-orm";
import {
  createQueue,
  DatabaseUnavailableError,
  enqueueAnalysis,
  openDatabase,
  schema,
  startQueue,
} from "@teardown/db";
import { ENGINE_VERSION } from "@teardown/engine";

try {
  const handle = await openDatabase({ poolSize: 2 });
  const boss = createQueue(handle.url, { supervise: false });
  await startQueue(boss);
  const current = await handle.db
    .select({ id: schema.revisions.id })
    .from(schema.revisions)
    .innerJoin(
      schema.entries,
      and(
        eq(schema.entries.id, schema.revisions.entryId),
        eq(schema.entries.currentRevision, schema.revisions.number),
      ),
    )
    .where(isNotNull(schema.entries.currentRevision));
  let queued = 0;
  for (const rev of current)
    if (
      await handle.db.transaction((tx) =>
        enqueueAnalysis(tx, boss, { revisionId: rev.id, engineVersion: ENGINE_VERSION }),
      )
    )
      queued++;
  process.stdout.write(
    `reanalyze: ${queued} of ${current.length} current revisions queued for engine ${ENGINE_VERSION}\n`,
  );
  await boss.stop({ close: true });
  await handle.close();
} catch (err) {
  process.stderr.write(
    `teardown-ledger reanalyze: ${err instanceof DatabaseUnavailableError ? err.message : String(err)}\n`,
  );
  process.exit(1);
}
