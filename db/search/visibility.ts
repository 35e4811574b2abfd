/**
 * The one visibility rule every search query embeds in its own SQL, so nobody finds, counts or
 * ranks what they may not read: entries of the viewer's teams, and public entries; archived
 * entries and entries without a revision are never search results.
 */
import { sql, type SQL } from "drizzle-orm";

/** True for rows of `entries` (aliased `alias`) the viewer may find; `viewerId` null = anonymous. */
export function visibleEntry(alias: string, viewerId: string | null): SQL {
  const e = sql.raw(alias);
  const mine =
    viewerId === null
      ? sql`false`
      : sql`${e}.team_id in (select m.team_id from memberships m where m.user_id = ${viewerId})`;
  return sql`(${e}.archived_at is null and ${e}.current_revision is not null and (${e}.visibility = 'public' or ${mine}))`;
}

/** True for rows whose team the viewer is a member of (comments are searched only there). */
export function viewersTeam(alias: string, viewerId: string | null): SQL {
  if (viewerId === null) return sql`false`;
  return sql`${sql.raw(alias)}.team_id in (select m.team_id from memberships m where m.user_id = ${viewerId})`;
}
