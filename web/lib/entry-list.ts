/**
 * Lists and search of entries the caller may read: one team's entries, or everything visible
 * (the caller's teams and public entries). Filters: text, category, flag code, block kind;
 * sorted by last update or title; paginated by an opaque cursor (keyset, so pages never skip
 * or repeat while others save). Entries of teams the caller is not on never appear unless public.
 */
import { and, asc, desc, eq, isNotNull, isNull, or, sql, type SQL } from "drizzle-orm";
import { schema, type Database, type EntrySummary } from "@teardown/db";
import { ENGINE_VERSION } from "@teardown/engine";
import { ApiError } from "./api-error";
import { requireTeamRole } from "./access";
import type { Caller } from "./caller";

/** The most entries one page may hold. */
export const MAX_PAGE_SIZE = 100;
/** The page size when none is asked for. */
export const DEFAULT_PAGE_SIZE = 20;

export interface EntryListQuery {
  teamId?: string | undefined;
  q?: string | undefined;
  category?: string | undefined;
  flag?: string | undefined;
  block?: string | undefined;
  sort: "updated" | "title";
  archived: "exclude" | "include" | "only";
  limit: number;
  cursor?: string | undefined;
}

interface Cursor {
  v: string;
  id: string;
}

function encodeCursor(c: Cursor): string {
  return Buffer.from(JSON.stringify(c)).toString("base64url");
}

const CURSOR_ID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
// The form Postgres prints a timestamptz in (what encodeCursor stores for the "updated" sort).
const CURSOR_TIME =
  /^(\d{4})-(\d{2})-(\d{2}) (\d{2}):(\d{2}):(\d{2})(\.\d{1,6})?[+-]\d{2}(:\d{2})?$/;

/** True when `v` is a timestamp Postgres printed: the right shape and a real calendar time. */
function isCursorTime(v: string): boolean {
  const m = CURSOR_TIME.exec(v);
  if (!m) return false;
  const [y, mo, d, h, mi, s] = m.slice(1, 7).map(Number) as [
    number,
    number,
    number,
    number,
    number,
    number,
  ];
  const t = new Date(Date.UTC(y, mo - 1, d, h, mi, s));
  // Date.UTC rolls 31 February over into March; a real time survives the round trip unchanged.
  return (
    y >= 1 &&
    t.getUTCFullYear() === y &&
    t.getUTCMonth() === mo - 1 &&
    t.getUTCDate() === d &&
    t.getUTCHours() === h &&
    t.getUTCMinutes() === mi &&
    t.getUTCSeconds() === s
  );
}

/**
 * Reads a cursor back, checking every part before it reaches SQL: the id a uuid, the sort value
 * a timestamp for the "updated" sort or NUL-free text for "title". Anything else is 422.
 */
function decodeCursor(text: string, byTitle: boolean): Cursor {
  try {
    const c = JSON.parse(Buffer.from(text, "base64url").toString("utf8")) as Partial<Cursor>;
    const v = c?.v;
    if (
      typeof v === "string" &&
      typeof c.id === "string" &&
      CURSOR_ID.test(c.id) &&
      (byTitle ? !v.includes("\u0000") && v.length <= 1000 : isCursorTime(v))
    )
      return { v, id: c.id };
  } catch {
    // fall through to the 422 below
  }
  throw new ApiError(422, "invalid-request", "the cursor is not one this API gave out", {
    path: "cursor",
  });
}

const e = schema.entries;

/** One entry in a list (the same shape search answers with). */
export type { EntrySummary };

/** One page of entries the caller may read, and the cursor of the next page (null at the end). */
export async function listEntries(
  db: Database,
  caller: Caller | null,
  query: EntryListQuery,
): Promise<{ entries: EntrySummary[]; nextCursor: string | null }> {
  const where: SQL[] = [];
  const publicAndLive = and(eq(e.visibility, "public"), isNull(e.archivedAt))!;
  if (query.teamId !== undefined) {
    if (!caller) throw new ApiError(401, "unauthenticated", "sign in to list a team's entries");
    await requireTeamRole(db, caller, query.teamId, "viewer");
    where.push(eq(e.teamId, query.teamId));
  } else if (caller) {
    const mine = sql`${e.teamId} in (select team_id from memberships where user_id = ${caller.userId})`;
    where.push(or(mine, publicAndLive)!);
  } else {
    where.push(publicAndLive);
  }
  if (query.archived === "exclude") where.push(isNull(e.archivedAt));
  if (query.archived === "only") where.push(isNotNull(e.archivedAt));
  if (query.q) where.push(sql`${e.searchVector} @@ websearch_to_tsquery('simple', ${query.q})`);
  if (query.category) where.push(eq(e.category, query.category));
  if (query.flag) where.push(sql`${e.searchFlags} @> array[${query.flag}]::text[]`);
  if (query.block) where.push(sql`${e.searchBlocks} @> array[${query.block}]::text[]`);

  const byTitle = query.sort === "title";
  if (query.cursor) {
    const c = decodeCursor(query.cursor, byTitle);
    where.push(
      byTitle
        ? sql`(${e.title}, ${e.id}) > (${c.v}, ${c.id}::uuid)`
        : sql`(${e.updatedAt}, ${e.id}) < (${c.v}::timestamptz, ${c.id}::uuid)`,
    );
  }
  const rows = await db
    .select({
      id: e.id,
      teamId: e.teamId,
      title: e.title,
      category: e.category,
      visibility: e.visibility,
      currentRevision: e.currentRevision,
      updatedAt: e.updatedAt,
      // The exact stored time as text, so the cursor compares at full (microsecond) precision.
      updatedAtText: sql<string>`${e.updatedAt}::text`,
      archivedAt: e.archivedAt,
      flags: e.searchFlags,
      blocks: e.searchBlocks,
      analysisState: sql<
        EntrySummary["analysisState"]
      >`(select a.state from analyses a join revisions r on r.id = a.revision_id
        where r.entry_id = entries.id and r.number = entries.current_revision and a.engine_version = ${ENGINE_VERSION})`,
    })
    .from(e)
    .where(and(...where))
    .orderBy(...(byTitle ? [asc(e.title), asc(e.id)] : [desc(e.updatedAt), desc(e.id)]))
    .limit(query.limit + 1);
  const page = rows.slice(0, query.limit);
  const last = page[page.length - 1];
  const nextCursor =
    rows.length > query.limit && last
      ? encodeCursor({ v: byTitle ? last.title : last.updatedAtText, id: last.id })
      : null;
  return {
    entries: page.map(({ updatedAtText: _t, archivedAt, ...r }) => ({
      ...r,
      archived: archivedAt !== null,
    })),
    nextCursor,
  };
}
