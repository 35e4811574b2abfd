/**
 * The audit trail: one row per write, always inside the write's own transaction, and the team
 * owners' view of it.
 */
import { and, desc, eq, lt } from "drizzle-orm";
import { schema, type Database } from "@teardown/db";
import { requireTeamRole } from "./access";
import type { Caller } from "./caller";

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

/** The most audit rows one page shows. */
export const MAX_AUDIT_PAGE = 200;

/** One audit row as a team owner reads it. */
export interface AuditRow {
  id: number;
  at: Date;
  actorId: string | null;
  actorName: string | null;
  action: string;
  targetType: string;
  targetId: string;
  detail: Record<string, unknown>;
}

/**
 * The team's audit trail, newest first, for its owners only (404 to outsiders, 403 to editors
 * and viewers). `before` is the id of the last row of the previous page.
 */
export async function teamAuditLog(
  db: Database,
  caller: Caller,
  teamId: string,
  page: { limit: number; before?: number | undefined },
): Promise<{ rows: AuditRow[]; nextBefore: number | null }> {
  await requireTeamRole(db, caller, teamId, "owner");
  const a = schema.auditLog;
  const rows = await db
    .select({
      id: a.id,
      at: a.at,
      actorId: a.actorId,
      actorName: schema.users.name,
      action: a.action,
      targetType: a.targetType,
      targetId: a.targetId,
      detail: a.detail,
    })
    .from(a)
    .leftJoin(schema.users, eq(schema.users.id, a.actorId))
    .where(and(eq(a.teamId, teamId), page.before === undefined ? undefined : lt(a.id, page.before)))
    .orderBy(desc(a.id))
    .limit(page.limit + 1);
  const shown = rows.slice(0, page.limit) as AuditRow[];
  const more = rows.length > page.limit;
  return { rows: shown, nextBefore: more ? shown[shown.length - 1]!.id : null };
}
