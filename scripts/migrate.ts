/** `npx tsx scripts/migrate.ts`: apply migrations and load the demo data once (for deployments). */
import { applyMigrations, DatabaseUnavailableError, openDatabase } from "@teardown/db";
import { loadDemoData } from "@teardown/seed-demo";

try {
  const handle = await openDatabase({ poolSize: 2 });
  await applyMigrations(handle.url);
  if (process.env.LOAD_DEMO_DATA !== "false") await loadDemoData(handle.db);
  await handle.close();
} catch (err) {
  process.stderr.write(`teardown-ledger: ${err instanceof DatabaseUnavailableError ? err.message : String(err)}\n`);
  process.exit(1);
}
