/** A user's membership of a team: shared by the web app's role checks and anything else that asks. */
import { and, eq } from "drizzle-orm";
import type { Database } from "../client.js";
import { memberships } from "../schema/teams.js";

export type MemberRole = "owner" | "editor" | "viewer";

/** The user's role on the team, or null when not a member (or anonymous). */
export async function membershipRole(
  db: Database,
  teamId: string,
  userId: string | null,
): Promise<MemberRole | null> {
  if (userId === null) return null;
  const [row] = await db
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
  return row?.role ?? null;
}
