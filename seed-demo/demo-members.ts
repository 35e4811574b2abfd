/**
 * The demo lab's members as real accounts: a user row and a password credential in the shape
 * the sign-in library reads (provider "credential", account id = user id, its scrypt hash), so
 * a demo member signs in through the ordinary sign-in page.
 */
import { hashPassword } from "better-auth/crypto";
import { eq } from "drizzle-orm";
import { schema, type DatabaseOrTx } from "@teardown/db";
import { DEMO_MEMBERS, DEMO_PASSWORD, type MemberKey } from "./scenario.js";

/** The user id the seed gives a member (stable, so a reader of the database can tell). */
export function demoUserId(key: MemberKey): string {
  return `demo-${key}`;
}

/** Hashes the demo password once per member (each hash has its own salt); slow, so done outside the transaction. */
export async function hashDemoPasswords(): Promise<Map<MemberKey, string>> {
  const out = new Map<MemberKey, string>();
  for (const m of DEMO_MEMBERS) out.set(m.key, await hashPassword(DEMO_PASSWORD));
  return out;
}

/**
 * Creates the members who do not exist yet and makes every member part of the team. A member
 * whose e-mail already belongs to someone else's account is left alone and not added.
 */
export async function addDemoMembers(
  tx: DatabaseOrTx,
  teamId: string,
  hashes: Map<MemberKey, string>,
): Promise<Map<MemberKey, string>> {
  const ids = new Map<MemberKey, string>();
  for (const m of DEMO_MEMBERS) {
    const id = demoUserId(m.key);
    const created = await tx
      .insert(schema.users)
      .values({ id, name: m.name, email: m.email, emailVerified: true })
      .onConflictDoNothing()
      .returning({ id: schema.users.id });
    if (created.length > 0)
      await tx.insert(schema.accounts).values({
        id: `${id}-credential`,
        accountId: id,
        providerId: "credential",
        userId: id,
        password: hashes.get(m.key)!,
      });
    const [own] = await tx
      .select({ id: schema.users.id })
      .from(schema.users)
      .where(eq(schema.users.id, id));
    if (own) ids.set(m.key, own.id);
  }
  const keys = [...ids.keys()];
  if (keys.length > 0)
    await tx
      .insert(schema.memberships)
      .values(
        keys.map((k) => ({
          teamId,
          userId: ids.get(k)!,
          role: DEMO_MEMBERS.find((m) => m.key === k)!.role,
        })),
      )
      .onConflictDoNothing();
  return ids;
}
