/**
 * Teams and their members. The creator of a team is its owner; only owners change roles or
 * remove others; anyone may leave, except the last owner (a team is never left without one).
 */
import { and, asc, eq, sql } from "drizzle-orm";
import { schema, type Database } from "@teardown/db";
import { ApiError, notFound } from "./api-error";
import { requireTeamRole, type Role } from "./access";
import { audit, type Tx } from "./audit";
import type { Caller } from "./caller";

/** A team as the API shows it, with the caller's role. */
export interface TeamView {
  id: string;
  name: string;
  slug: string;
  role: Role;
  createdAt: Date;
}

/** A slug from a name: lower case letters, digits and dashes. */
export function slugFor(name: string): string {
  const base = name
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 50);
  return base || "team";
}

// Postgres: unique violation.
const PG_UNIQUE_VIOLATION = "23505";

/** Creates a team with the caller as owner (409 when the slug is taken). */
export async function createTeam(
  db: Database,
  caller: Caller,
  input: { name: string; slug?: string | undefined },
): Promise<TeamView> {
  const slug = input.slug ?? slugFor(input.name);
  try {
    return await db.transaction(async (tx) => {
      const [team] = await tx.insert(schema.teams).values({ name: input.name, slug }).returning();
      await tx
        .insert(schema.memberships)
        .values({ teamId: team!.id, userId: caller.userId, role: "owner" });
      await audit(tx, {
        actorId: caller.userId,
        teamId: team!.id,
        action: "team.create",
        targetType: "team",
        targetId: team!.id,
        detail: { name: input.name, slug },
      });
      return {
        id: team!.id,
        name: team!.name,
        slug: team!.slug,
        role: "owner" as const,
        createdAt: team!.createdAt,
      };
    });
  } catch (err) {
    const code =
      (err as { code?: string; cause?: { code?: string } }).code ??
      (err as { cause?: { code?: string } }).cause?.code;
    if (code === PG_UNIQUE_VIOLATION)
      throw new ApiError(
        409,
        "slug-taken",
        `the team address "${slug}" is taken; choose another slug`,
        { path: "slug" },
      );
    throw err;
  }
}

/** The teams the caller belongs to, by name. */
export async function listTeams(db: Database, caller: Caller): Promise<TeamView[]> {
  return db
    .select({
      id: schema.teams.id,
      name: schema.teams.name,
      slug: schema.teams.slug,
      role: schema.memberships.role,
      createdAt: schema.teams.createdAt,
    })
    .from(schema.memberships)
    .innerJoin(schema.teams, eq(schema.teams.id, schema.memberships.teamId))
    .where(eq(schema.memberships.userId, caller.userId))
    .orderBy(asc(schema.teams.name));
}

/** One member of a team. */
export interface MemberView {
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: Date;
}

/** The team's members (any role may read them). */
export async function listMembers(db: Database | Tx, teamId: string): Promise<MemberView[]> {
  return db
    .select({
      userId: schema.users.id,
      name: schema.users.name,
      email: schema.users.email,
      role: schema.memberships.role,
      joinedAt: schema.memberships.createdAt,
    })
    .from(schema.memberships)
    .innerJoin(schema.users, eq(schema.users.id, schema.memberships.userId))
    .where(eq(schema.memberships.teamId, teamId))
    .orderBy(asc(schema.users.name));
}

/** The team with its members and the caller's role (404 for non-members). */
export async function getTeam(
  db: Database,
  caller: Caller,
  teamId: string,
): Promise<TeamView & { members: MemberView[] }> {
  const role = await requireTeamRole(db, caller, teamId, "viewer");
  const [team] = await db.select().from(schema.teams).where(eq(schema.teams.id, teamId));
  if (!team) throw notFound("team");
  return {
    id: team.id,
    name: team.name,
    slug: team.slug,
    role,
    createdAt: team.createdAt,
    members: await listMembers(db, teamId),
  };
}

/** Locks the team's memberships and returns the member's row and the number of owners. */
async function lockedMember(
  tx: Tx,
  teamId: string,
  userId: string,
): Promise<{ role: Role | null; owners: number }> {
  const rows = await tx.execute<{ user_id: string; role: Role }>(
    sql`select user_id, role from memberships where team_id = ${teamId} for update`,
  );
  return {
    role: rows.rows.find((r) => r.user_id === userId)?.role ?? null,
    owners: rows.rows.filter((r) => r.role === "owner").length,
  };
}

function lastOwner(): ApiError {
  return new ApiError(
    409,
    "last-owner",
    "a team needs at least one owner: make someone else owner first",
  );
}

/** Changes a member's role (owner only; the last owner cannot step down). */
export async function changeRole(
  db: Database,
  caller: Caller,
  teamId: string,
  userId: string,
  role: Role,
): Promise<MemberView> {
  await requireTeamRole(db, caller, teamId, "owner");
  return db.transaction(async (tx) => {
    const current = await lockedMember(tx, teamId, userId);
    if (current.role === null) throw notFound("member");
    if (current.role === "owner" && role !== "owner" && current.owners === 1) throw lastOwner();
    await tx
      .update(schema.memberships)
      .set({ role })
      .where(and(eq(schema.memberships.teamId, teamId), eq(schema.memberships.userId, userId)));
    await audit(tx, {
      actorId: caller.userId,
      teamId,
      action: "member.role",
      targetType: "user",
      targetId: userId,
      detail: { from: current.role, to: role },
    });
    const member = (await listMembers(tx, teamId)).find((m) => m.userId === userId);
    return member!;
  });
}

/** Removes a member: the owner removes anyone, any member removes themself (leaves). */
export async function removeMember(
  db: Database,
  caller: Caller,
  teamId: string,
  userId: string,
): Promise<void> {
  const self = userId === caller.userId;
  await requireTeamRole(db, caller, teamId, self ? "viewer" : "owner");
  await db.transaction(async (tx) => {
    const current = await lockedMember(tx, teamId, userId);
    if (current.role === null) throw notFound("member");
    if (current.role === "owner" && current.owners === 1) throw lastOwner();
    await tx
      .delete(schema.memberships)
      .where(and(eq(schema.memberships.teamId, teamId), eq(schema.memberships.userId, userId)));
    await audit(tx, {
      actorId: caller.userId,
      teamId,
      action: self ? "member.leave" : "member.remove",
      targetType: "user",
      targetId: userId,
    });
  });
}
