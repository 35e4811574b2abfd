/**
 * `npm run worker`: one analysis worker process. It connects to the database named by
 * DATABASE_URL and waits for analysis jobs; SIGTERM lets it finish and exit.
 */
import { DatabaseUnavailableError, openDatabase } from "@teardown/db";

async function main(): Promise<void> {
  let handle;
  try {
    handle = await openDatabase({ poolSize: 2 });
  } catch (err) {
    process.stderr.write(`teardown-ledger worker: ${err instanceof DatabaseUnavailableError ? err.message : String(err)}\n`);
    process.exit(1);
  }
  process.stdout.write(JSON.stringify({ level: "info", msg: "worker ready" }) + "\n");
  const keepAlive = setInterval(() => {}, 60_000);
  const stop = async () => {
    clearInterval(keepAlive);
    await handle.close();
    process.exit(0);
  };
  process.on("SIGTERM", () => void stop());
  process.on("SIGINT", () => void stop());
}

void main();
