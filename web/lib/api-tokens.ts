/**
 * Personal API tokens for scripts. A token is shown once when made; only its sha256 is kept,
 * so a stolen database does not give working tokens. A revoked or expired token is refused.
 *
 * Lineage: a token made by a request that was itself authenticated by a token records that
 * parent, never expires later than it, and is revoked with it (the whole subtree, in the same
 * transaction), so a leaked token cannot leave behind a longer-lived copy of itself. Signing out
 * everywhere revokes every token of the user.
 */
import { createHash, randomBytes, randomUUID } from "node:crypto";
import { and, desc, eq, gt, isNull, or, sql } from "drizzle-orm";
import { schema, type Database } from "@teardown/db";
import { notFound, unauthenticated } from "./api-error";
import { audit, type Tx } from "./audit";

/** Tokens start with this, so a leaked one is recognisable in logs and secret scanners. */
export const API_TOKEN_PREFIX = "tl_";
/** Random bytes in a token (256 bits). */
const TOKEN_BYTES = 32;
/** last_used_at is refreshed at most this often, so reads do not write on every request. */
const LAST_USED_RESOLUTION_SECONDS = 60;

/** The stored form of a token. */
export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/** A token as listed (never the token itself). */
export interface ApiTokenInfo {
  id: string;
  name: string;
  createdAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
  expiresAt: Date | null;
  parentId: string | null;
}

/** The longest lifetime a token may be given, in days. */
export const MAX_TOKEN_DAYS = 365;
const DAY_MS = 24 * 60 * 60 * 1000;

const infoColumns = {
  id: schema.apiTokens.id,
  name: schema.apiTokens.name,
  createdAt: schema.apiTokens.createdAt,
  lastUsedAt: schema.apiTokens.lastUsedAt,
  revokedAt: schema.apiTokens.revokedAt,
  expiresAt: schema.apiTokens.expiresAt,
  parentId: schema.apiTokens.parentId,
};

/** What a new token may be given: a lifetime, and the token that is minting it (if any). */
export interface NewTokenOptions {
  expiresInDays?: number | undefined;
  parentTokenId?: string | undefined;
}

/**
 * Makes a token for the user; the plain token is in the answer and nowhere else. A child of a
 * token expires no later than its parent (a parent without an end gives no end of its own).
 */
export async function createApiToken(
  db: Database,
  userId: string,
  name: string,
  opts: NewTokenOptions = {},
): Promise<ApiTokenInfo & { token: string }> {
  const token = `${API_TOKEN_PREFIX}${randomBytes(TOKEN_BYTES).toString("base64url")}`;
  return db.transaction(async (tx) => {
    let expiresAt =
      opts.expiresInDays === undefined ? null : new Date(Date.now() + opts.expiresInDays * DAY_MS);
    if (opts.parentTokenId !== undefined) {
      // Lock the parent so a revocation racing this insert either sees the child or wins first.
      const [parent] = await tx
        .select({ expiresAt: schema.apiTokens.expiresAt, revokedAt: schema.apiTokens.revokedAt })
        .from(schema.apiTokens)
        .where(eq(schema.apiTokens.id, opts.parentTokenId))
        .for("update");
      if (!parent || parent.revokedAt !== null) throw unauthenticated();
      if (parent.expiresAt !== null && (expiresAt === null || expiresAt > parent.expiresAt))
        expiresAt = parent.expiresAt;
    }
    const [row] = await tx
      .insert(schema.apiTokens)
      .values({
        id: randomUUID(),
        userId,
        name,
        tokenHash: hashToken(token),
        parentId: opts.parentTokenId ?? null,
        expiresAt,
      })
      .returning(infoColumns);
    await audit(tx, {
      actorId: userId,
      teamId: null,
      action: "token.create",
      targetType: "api_token",
      targetId: row!.id,
      detail: { name, parentId: row!.parentId, expiresAt: row!.expiresAt?.toISOString() ?? null },
    });
    return { ...row!, token };
  });
}

/** The user's tokens, newest first, revoked ones included (marked). */
export async function listApiTokens(db: Database, userId: string): Promise<ApiTokenInfo[]> {
  return db
    .select(infoColumns)
    .from(schema.apiTokens)
    .where(eq(schema.apiTokens.userId, userId))
    .orderBy(desc(schema.apiTokens.createdAt));
}

/** Marks a token and every token descended from it revoked; returns how many changed. */
async function revokeSubtree(tx: Tx, tokenId: string): Promise<number> {
  const res = await tx.execute(sql`
    with recursive subtree(id) as (
      select id from api_tokens where id = ${tokenId}
      union
      select t.id from api_tokens t join subtree s on t.parent_id = s.id
    )
    update api_tokens set revoked_at = now()
    where id in (select id from subtree) and revoked_at is null`);
  return res.rowCount ?? 0;
}

/**
 * Revokes one of the user's tokens and its descendants (404 when it is not theirs); revoking
 * twice is harmless.
 */
export async function revokeApiToken(
  db: Database,
  userId: string,
  tokenId: string,
): Promise<ApiTokenInfo> {
  return db.transaction(async (tx) => {
    const [owned] = await tx
      .select({ id: schema.apiTokens.id })
      .from(schema.apiTokens)
      .where(and(eq(schema.apiTokens.id, tokenId), eq(schema.apiTokens.userId, userId)));
    if (!owned) throw notFound("token");
    const revoked = await revokeSubtree(tx, tokenId);
    const [row] = await tx
      .select(infoColumns)
      .from(schema.apiTokens)
      .where(eq(schema.apiTokens.id, tokenId));
    await audit(tx, {
      actorId: userId,
      teamId: null,
      action: "token.revoke",
      targetType: "api_token",
      targetId: tokenId,
      detail: { revokedWithDescendants: revoked },
    });
    return row!;
  });
}

/** Revokes every live token of the user (signing out everywhere); `reason` goes in the audit row. */
export async function revokeAllApiTokens(
  db: Database,
  userId: string,
  reason: string,
): Promise<number> {
  return db.transaction(async (tx) => {
    const rows = await tx
      .update(schema.apiTokens)
      .set({ revokedAt: sql`now()` })
      .where(and(eq(schema.apiTokens.userId, userId), isNull(schema.apiTokens.revokedAt)))
      .returning({ id: schema.apiTokens.id });
    await audit(tx, {
      actorId: userId,
      teamId: null,
      action: "token.revoke-all",
      targetType: "user",
      targetId: userId,
      detail: { reason, revoked: rows.length },
    });
    return rows.length;
  });
}

/** The user a live token belongs to, or null (unknown, revoked or expired). */
export async function userForToken(
  db: Database,
  token: string,
): Promise<{ userId: string; tokenId: string } | null> {
  const [row] = await db
    .select({ userId: schema.apiTokens.userId, tokenId: schema.apiTokens.id })
    .from(schema.apiTokens)
    .where(
      and(
        eq(schema.apiTokens.tokenHash, hashToken(token)),
        isNull(schema.apiTokens.revokedAt),
        or(isNull(schema.apiTokens.expiresAt), gt(schema.apiTokens.expiresAt, sql`now()`)),
      ),
    );
  if (!row) return null;
  await db
    .update(schema.apiTokens)
    .set({ lastUsedAt: sql`now()` })
    .where(
      and(
        eq(schema.apiTokens.id, row.tokenId),
        sql`(${schema.apiTokens.lastUsedAt} is null or ${schema.apiTokens.lastUsedAt} < now() - make_interval(secs => ${LAST_USED_RESOLUTION_SECONDS}))`,
      ),
    );
  return row;
}
