/**
 * Role checks, on the server, for every read and write. Someone who is not on a team learns
 * nothing about it: its team-only entries and the team itself answer 404 exactly as unknown ids
 * do. A member whose role is too low gets 403.
 */
import { eq } from "drizzle-orm";
import { membershipRole, schema, type Database } from "@teardown/db";
import { forbidden, notFound } from "./api-error";
import type { Caller } from "./caller";

export type Role = "owner" | "editor" | "viewer";

const ROLE_RANK: Readonly<Record<Role, number>> = { viewer: 1, editor: 2, owner: 3 };

/** True when `role` is at least `min`. */
export function roleAtLeast(role: Role | null, min: Role): boolean {
  return role !== null && ROLE_RANK[role] >= ROLE_RANK[min];
}

/** The user's role on the team, or null when not a member. */
export async function roleOn(
  db: Database,
  teamId: string,
  userId: string | null,
): Promise<Role | null> {
  return membershipRole(db, teamId, userId);
}

/** The caller's role on the team: 404 when not a member, 403 when below `min`. */
export async function requireTeamRole(
  db: Database,
  caller: Caller,
  teamId: string,
  min: Role,
): Promise<Role> {
  const role = await roleOn(db, teamId, caller.userId);
  if (role === null) throw notFound("team");
  if (!roleAtLeast(role, min)) throw forbidden(min);
  return role;
}

export type EntryRow = typeof schema.entries.$inferSelect;

/** An entry with the caller's role on its team (null for an outsider reading a public entry). */
export interface EntryAccess {
  entry: EntryRow;
  role: Role | null;
}

/**
 * The entry if the caller may read it: a member of its team, or anyone when it is public and
 * not archived. Anything else is 404, the same answer as an unknown id.
 */
export async function readableEntry(
  db: Database,
  caller: Caller | null,
  entryId: string,
): Promise<EntryAccess> {
  const [entry] = await db.select().from(schema.entries).where(eq(schema.entries.id, entryId));
  if (!entry) throw notFound();
  const role = await roleOn(db, entry.teamId, caller?.userId ?? null);
  if (role !== null) return { entry, role };
  if (entry.visibility === "public" && entry.archivedAt === null) return { entry, role: null };
  throw notFound();
}

/** The entry if the caller's role allows `min` on it: 404 when unreadable, 403 when readable but too low. */
export async function entryWithRole(
  db: Database,
  caller: Caller | null,
  entryId: string,
  min: Role,
): Promise<EntryAccess & { role: Role }> {
  const access = await readableEntry(db, caller, entryId);
  // An outsider reading a public entry can see it exists, so 403 (not 404) says why they cannot change it.
  if (!roleAtLeast(access.role, min)) throw forbidden(min);
  return access as EntryAccess & { role: Role };
}
