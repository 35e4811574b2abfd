/**
 * The secret that signs session cookies: `BETTER_AUTH_SECRET` when set (required when web
 * replicas run on several machines, so they all accept each other's cookies), else one random
 * secret generated on first start and kept in `<data dir>/auth-secret`, so a restart keeps
 * everyone signed in.
 */
import { randomBytes } from "node:crypto";
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { dataDir } from "@teardown/db";

/** Bytes of randomness in a generated secret. */
const GENERATED_SECRET_BYTES = 32;
/** The shortest secret accepted from the environment, in characters. */
const MIN_SECRET_CHARS = 32;

/** The auth secret (from the environment, else persisted under the data dir). */
export function authSecret(): string {
  const fromEnv = process.env.BETTER_AUTH_SECRET;
  if (fromEnv) {
    if (fromEnv.length < MIN_SECRET_CHARS)
      throw new Error(`BETTER_AUTH_SECRET must be at least ${MIN_SECRET_CHARS} characters`);
    return fromEnv;
  }
  const file = path.join(dataDir(), "auth-secret");
  try {
    return readFileSync(file, "utf8").trim();
  } catch {
    mkdirSync(path.dirname(file), { recursive: true });
    try {
      // "wx": when two processes start together, one writes and the other reads the winner's secret.
      writeFileSync(file, `${randomBytes(GENERATED_SECRET_BYTES).toString("base64url")}\n`, {
        flag: "wx",
        mode: 0o600,
      });
    } catch (err) {
      if ((err as { code?: string }).code !== "EEXIST") throw err;
    }
    return readFileSync(file, "utf8").trim();
  }
}
