/**
 * Personal API tokens for scripts. A token is shown once when made; only its sha256 is kept,
 * so a stolen database does not give working tokens. A revoked token is refused from then on.
 */
import { createHash, randomBytes, randomUUID } from "node:crypto";
import { and, desc, eq, isNull, sql } from "drizzle-orm";
import { schema, type Database } from "@teardown/db";
import { notFound } from "./api-error";
import { audit } from "./audit";

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
}

const infoColumns = {
  id: schema.apiTokens.id,
  name: schema.apiTokens.name,
  createdAt: schema.apiTokens.createdAt,
  lastUsedAt: schema.apiTokens.lastUsedAt,
  revokedAt: schema.apiTokens.revokedAt,
};

/** Makes a token for the user; the plain token is in the answer and nowhere else. */
export async function createApiToken(
  db: Database,
  userId: string,
  name: string,
): Promise<ApiTokenInfo & { token: string }> {
  const token = `${API_TOKEN_PREFIX}${randomBytes(TOKEN_BYTES).toString("base64url")}`;
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(schema.apiTokens)
      .values({ id: randomUUID(), userId, name, tokenHash: hashToken(token) })
      .returning(infoColumns);
    await audit(tx, {
      actorId: userId,
      teamId: null,
      action: "token.create",
      targetType: "api_token",
      targetId: row!.id,
      detail: { name },
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

/** Revokes one of the user's tokens (404 when it is not theirs); revoking twice is harmless. */
export async function revokeApiToken(
  db: Database,
  userId: string,
  tokenId: string,
): Promise<ApiTokenInfo> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(schema.apiTokens)
      .set({ revokedAt: sql`coalesce(${schema.apiTokens.revokedAt}, now())` })
      .where(and(eq(schema.apiTokens.id, tokenId), eq(schema.apiTokens.userId, userId)))
      .returning(infoColumns);
    if (!row) throw notFound("token");
    await audit(tx, {
      actorId: userId,
      teamId: null,
      action: "token.revoke",
      targetType: "api_token",
      targetId: tokenId,
    });
    return row;
  });
}

/** The user a live token belongs to, or null (unknown or revoked). */
export async function userForToken(
  db: Database,
  token: string,
): Promise<{ userId: string; tokenId: string } | null> {
  const [row] = await db
    .select({ userId: schema.apiTokens.userId, tokenId: schema.apiTokens.id })
    .from(schema.apiTokens)
    .where(
      and(eq(schema.apiTokens.tokenHash, hashToken(token)), isNull(schema.apiTokens.revokedAt)),
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
