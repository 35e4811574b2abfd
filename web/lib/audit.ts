/** The audit trail: one row per write, always inside the write's own transaction. */
import { schema, type Database } from "@teardown/db";

/** A transaction handle, as Drizzle passes it to `db.transaction`. */
export type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

/** One audit row: who did what to which object (and of which team). */
export interface AuditEvent {
  actorId: string | null;
  teamId: string | null;
  action: string;
  targetType: string;
  targetId: string;
  detail?: Record<string, unknown>;
}

/** Writes an audit row in the caller's transaction, so it commits or rolls back with the change. */
export async function audit(tx: Tx, event: AuditEvent): Promise<void> {
  await tx.insert(schema.auditLog).values({ ...event, detail: event.detail ?? {} });
}
