/** Keeps a pool's checked-out connections from crashing the process when the server goes away. */
import type { Pool, PoolClient } from "pg";

/**
 * Gives every client of `pool` a lasting 'error' listener. node-postgres emits 'error' on a
 * client whose connection dies; the pool listens only while the client is idle, so a connection
 * cut while checked out between statements (inside a transaction) would be an unhandled 'error'
 * event, which ends the process. With a listener the pending or next query fails instead, the
 * transaction rolls back, and the pool drops the dead client on release.
 */
export function guardPoolClients(pool: Pool, onError: (err: Error) => void): void {
  const guarded = new WeakSet<PoolClient>();
  // 'acquire' fires on every checkout, also of clients made before this call (the start-up ping's).
  pool.on("acquire", (client) => {
    if (guarded.has(client)) return;
    guarded.add(client);
    client.on("error", onError);
  });
}
