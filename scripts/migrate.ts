/** `npx tsx scripts/migrate.ts`: apply migrations and load the demo data once (for deployments). */
import {
  applyMigrations,
  createQueue,
  DatabaseUnavailableError,
  openDatabase,
  startQueue,
} from "@teardown/db";
import { loadDemoData } from "@teardown/seed-demo";

try {
  const handle = await openDatabase({ poolSize: 2 });
  await applyMigrations(handle.url);
  if (process.env.LOAD_DEMO_DATA !== "false") {
    const boss = createQueue(handle.url, { supervise: false });
    await startQueue(boss);
    await loadDemoData(handle.db, boss);
    await boss.stop({ close: true });
  }
  await handle.close();
} catch (err) {
  process.stderr.write(
    `teardown-ledger: ${err instanceof DatabaseUnavailableError ? err.message : String(err)}\n`,
  );
  process.exit(1);
}
