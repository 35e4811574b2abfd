/**
 * Accounts and sessions: better-auth with email and password, its Drizzle adapter on our
 * `users`, `sessions`, `accounts` and `verifications` tables (plural names), sessions in
 * Postgres. Passwords are hashed with better-auth's default, scrypt (node:crypto; N=16384,
 * r=16, p=1, so about 32 MB of memory per hash). Sign-out-everywhere is better-auth's
 * `/api/auth/revoke-sessions`, password change its `/api/auth/change-password`.
 */
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { schema } from "@teardown/db";
import { authSecret } from "./auth-secret";
import { database } from "./database";
import { loopbackAliases } from "./loopback-origins";

/** The shortest password accepted. */
export const MIN_PASSWORD_CHARS = 10;
/** The longest password accepted (scrypt reads all of it). */
export const MAX_PASSWORD_CHARS = 128;
/** The longest user name accepted (it is shown beside every comment and in member lists). */
export const MAX_USER_NAME_CHARS = 100;
/** How long a session lasts without use, in seconds (30 days). */
const SESSION_EXPIRES_SECONDS = 30 * 24 * 60 * 60;

/**
 * The app's own address: `APP_URL`, else http://localhost:$PORT. Browsers' POSTs carry it as
 * `Origin`, and better-auth refuses cookie-authenticated POSTs from any other origin.
 */
export function appUrl(): string {
  return (process.env.APP_URL ?? `http://localhost:${process.env.PORT ?? 3000}`).replace(
    /\/+$/,
    "",
  );
}

/** Extra origins allowed besides APP_URL (comma-separated `TRUSTED_ORIGINS`, e.g. a second host name). */
export function trustedOrigins(): string[] {
  const extra = (process.env.TRUSTED_ORIGINS ?? "")
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean);
  // The start prints a localhost address; 127.0.0.1 and [::1] reach the same server.
  return [appUrl(), ...loopbackAliases(appUrl()), ...extra];
}

function makeAuth() {
  return betterAuth({
    appName: "Teardown Ledger",
    baseURL: appUrl(),
    basePath: "/api/auth",
    secret: authSecret(),
    trustedOrigins: trustedOrigins(),
    database: drizzleAdapter(database().db, {
      provider: "pg",
      usePlural: true,
      schema: {
        users: schema.users,
        sessions: schema.sessions,
        accounts: schema.accounts,
        verifications: schema.verifications,
      },
    }),
    // No sign-in at sign-up: better-auth then answers a taken email exactly as a new one (same
    // status, same shape, a password hashed either way), so sign-up tells nobody who has an
    // account. The form signs in right after.
    emailAndPassword: {
      enabled: true,
      minPasswordLength: MIN_PASSWORD_CHARS,
      maxPasswordLength: MAX_PASSWORD_CHARS,
      autoSignIn: false,
    },
    session: { expiresIn: SESSION_EXPIRES_SECONDS },
    telemetry: { enabled: false },
    // Attempts are limited by our request guard, which knows which proxy hop to believe;
    // better-auth's own limiter would key on the client's X-Forwarded-For.
    rateLimit: { enabled: false },
    // better-auth skips the origin check when NODE_ENV is "test"; keep it on everywhere, so tests
    // exercise what production does.
    advanced: { disableOriginCheck: false },
  });
}

export type Auth = ReturnType<typeof makeAuth>;

const globalForAuth = globalThis as unknown as { teardownAuth?: Auth };

/** The process's auth instance, made on first use (never at import, so builds need no secret). */
export function auth(): Auth {
  globalForAuth.teardownAuth ??= makeAuth();
  return globalForAuth.teardownAuth;
}

/** Forgets the instance (tests that switch databases). */
export function resetAuth(): void {
  globalForAuth.teardownAuth = undefined;
}
