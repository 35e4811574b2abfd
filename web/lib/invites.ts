/**
 * One-time invitation links. The owner makes a link carrying a random token (only its sha256 is
 * stored) with a role and an expiry; the first signed-in person to accept it joins with that
 * role. A used or expired link answers 410 Gone; an unknown one 404.
 */
import { randomBytes } from "node:crypto";
import { eq, sql } from "drizzle-orm";
import { schema, type Database } from "@teardown/db";
import { ApiError, notFound } from "./api-error";
import { hashToken } from "./api-tokens";
import { requireTeamRole, type Role } from "./access";
import { audit } from "./audit";
import { appUrl } from "./auth";
import type { Caller } from "./caller";

/** How long a link lasts when the owner does not say, in hours (7 days). */
export const DEFAULT_INVITE_HOURS = 7 * 24;
/** The longest a link may last, in hours (30 days). */
export const MAX_INVITE_HOURS = 30 * 24;
/** Random bytes in an invite token. */
const INVITE_TOKEN_BYTES = 32;

/** A freshly made invite: the token and link are shown once. */
export interface NewInvite {
  id: string;
  token: string;
  url: string;
  role: Role;
  expiresAt: Date;
}

/** Makes an invite link to the team (owner only). */
export async function createInvite(
  db: Database,
  caller: Caller,
  teamId: string,
  input: { role: Role; expiresInHours?: number | undefined },
): Promise<NewInvite> {
  await requireTeamRole(db, caller, teamId, "owner");
  const token = randomBytes(INVITE_TOKEN_BYTES).toString("base64url");
  const hours = input.expiresInHours ?? DEFAULT_INVITE_HOURS;
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(schema.invites)
      .values({
        teamId,
        tokenHash: hashToken(token),
        role: input.role,
        createdBy: caller.userId,
        expiresAt: sql`now() + make_interval(hours => ${hours})`,
      })
      .returning();
    await audit(tx, {
      actorId: caller.userId,
      teamId,
      action: "invite.create",
      targetType: "invite",
      targetId: row!.id,
      detail: { role: input.role, hours },
    });
    return {
      id: row!.id,
      token,
      url: `${appUrl()}/invite/${token}`,
      role: row!.role,
      expiresAt: row!.expiresAt,
    };
  });
}

type InviteRow = typeof schema.invites.$inferSelect;

function gone(row: InviteRow, now: Date): ApiError | null {
  if (row.usedAt !== null)
    return new ApiError(410, "invite-used", "this invitation has already been used");
  if (row.expiresAt.getTime() <= now.getTime())
    return new ApiError(
      410,
      "invite-expired",
      "this invitation has expired; ask the team's owner for a new one",
    );
  return null;
}

/** What a link invites to (for the page that asks "join this team?"): 404 unknown, 410 used or expired. */
export async function inviteInfo(
  db: Database,
  token: string,
): Promise<{ teamName: string; role: Role; expiresAt: Date }> {
  const [found] = await db
    .select({
      invite: schema.invites,
      teamName: schema.teams.name,
      now: sql<Date>`now()`.mapWith((v) => new Date(v)),
    })
    .from(schema.invites)
    .innerJoin(schema.teams, eq(schema.teams.id, schema.invites.teamId))
    .where(eq(schema.invites.tokenHash, hashToken(token)));
  if (!found) throw notFound("invitation");
  const refused = gone(found.invite, found.now);
  if (refused) throw refused;
  return { teamName: found.teamName, role: found.invite.role, expiresAt: found.invite.expiresAt };
}

/** Accepts a link for the caller: joins the team with the link's role, and uses the link up. */
export async function acceptInvite(
  db: Database,
  caller: Caller,
  token: string,
): Promise<{ teamId: string; role: Role }> {
  return db.transaction(async (tx) => {
    const rows = await tx.execute<{ id: string }>(
      sql`select id from invites where token_hash = ${hashToken(token)} for update`,
    );
    const id = rows.rows[0]?.id;
    if (!id) throw notFound("invitation");
    const [row] = await tx.select().from(schema.invites).where(eq(schema.invites.id, id));
    const [{ now }] = (await tx.execute<{ now: Date }>(sql`select now() as now`)).rows as [
      { now: Date },
    ];
    const refused = gone(row!, new Date(now));
    if (refused) throw refused;
    const joined = await tx
      .insert(schema.memberships)
      .values({ teamId: row!.teamId, userId: caller.userId, role: row!.role })
      .onConflictDoNothing()
      .returning({ role: schema.memberships.role });
    // Someone already on the team keeps their role, and the link stays usable for whom it was meant.
    if (joined.length === 0)
      throw new ApiError(409, "already-member", "you are already a member of this team");
    await tx
      .update(schema.invites)
      .set({ usedAt: sql`now()`, usedBy: caller.userId })
      .where(eq(schema.invites.id, id));
    await audit(tx, {
      actorId: caller.userId,
      teamId: row!.teamId,
      action: "invite.accept",
      targetType: "invite",
      targetId: id,
      detail: { role: row!.role },
    });
    return { teamId: row!.teamId, role: row!.role };
  });
}
