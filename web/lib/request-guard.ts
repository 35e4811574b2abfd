/**
 * The request guard: which origins may send cookie-authenticated writes, which address a
 * request comes from (and how many proxy hops to believe for it), and how many sign-in and
 * sign-up attempts an address or an account may make. Every route reaches it through the
 * caller check (`caller.ts`) and the auth route, so there is one place for each rule.
 */
import { ApiError } from "./api-error";
import { appUrl, trustedOrigins } from "./auth";
import { PEER_ADDRESS_HEADER, trustedProxyHops } from "./peer-address-hook";

/** Methods that change nothing, so a foreign page gains nothing by sending them with a cookie. */
const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * Refuses (403) a cookie-authenticated write unless the browser says it comes from one of the
 * app's own origins. Browsers send `Origin` on every non-GET request, cors or no-cors, so a
 * missing one means a non-browser client with a borrowed cookie; scripts use bearer tokens.
 */
export function checkWriteOrigin(req: Request): void {
  if (SAFE_METHODS.has(req.method.toUpperCase())) return;
  const origin = req.headers.get("origin");
  if (origin !== null && trustedOrigins().includes(origin.replace(/\/+$/, ""))) return;
  throw new ApiError(
    403,
    "foreign-origin",
    origin === null
      ? "a signed-in write must come from the app's own pages (no Origin header); scripts use an API token"
      : `a signed-in write must come from the app's own pages (${appUrl()}), not from ${origin.slice(0, 200)}`,
  );
}

/** The address of a request that did not come through the server's socket (see limitAuthAttempt). */
export const UNKNOWN_ADDRESS = "unknown";

/**
 * The client's address. The chain is the `X-Forwarded-For` list followed by the TCP peer; each
 * trusted proxy appended the address it saw, so the entry `hops` places left of the peer is the
 * last one written by a proxy we trust. Anything further left was written by the client.
 */
export function clientAddress(req: Request, hops = trustedProxyHops()): string {
  const peer = req.headers.get(PEER_ADDRESS_HEADER)?.trim() || UNKNOWN_ADDRESS;
  if (hops === 0) return peer;
  const forwarded = (req.headers.get("x-forwarded-for") ?? "")
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean);
  const chain = [...forwarded, peer];
  // A chain shorter than the hops we trust means a proxy is missing: use the farthest entry we have.
  return chain[Math.max(0, chain.length - 1 - hops)]!;
}

/** A fixed-window counter per key, in this process's memory (each web replica counts alone). */
export class RateLimiter {
  private readonly windows = new Map<string, { startMs: number; count: number }>();

  constructor(
    readonly limit: number,
    readonly windowMs: number,
    private readonly now: () => number = Date.now,
  ) {}

  /** Counts one attempt for `key`; null when allowed, else the seconds until the window ends. */
  hit(key: string): number | null {
    const t = this.now();
    const w = this.windows.get(key);
    if (!w || t - w.startMs >= this.windowMs) {
      this.windows.set(key, { startMs: t, count: 1 });
      this.sweep(t);
      return null;
    }
    w.count += 1;
    if (w.count <= this.limit) return null;
    return Math.max(1, Math.ceil((w.startMs + this.windowMs - t) / 1000));
  }

  // Forget finished windows now and then, so a flood of one-off keys cannot grow the map forever.
  private sweep(t: number): void {
    if (this.windows.size < 10_000) return;
    for (const [k, w] of this.windows) if (t - w.startMs >= this.windowMs) this.windows.delete(k);
  }
}

/** Sign-in attempts one address may make per minute. */
const SIGN_IN_PER_ADDRESS_PER_MINUTE = 20;
/** Sign-in attempts on one account per 15 minutes, from anywhere (stops a spread-out guesser). */
const SIGN_IN_PER_ACCOUNT_PER_15_MINUTES = 10;
/** Accounts one address may create per hour. */
const SIGN_UP_PER_ADDRESS_PER_HOUR = 30;

const MINUTE_MS = 60_000;

const globalForLimits = globalThis as unknown as {
  teardownAuthLimits?: Record<"signInAddress" | "signInAccount" | "signUpAddress", RateLimiter>;
};

function limits() {
  globalForLimits.teardownAuthLimits ??= {
    signInAddress: new RateLimiter(SIGN_IN_PER_ADDRESS_PER_MINUTE, MINUTE_MS),
    signInAccount: new RateLimiter(SIGN_IN_PER_ACCOUNT_PER_15_MINUTES, 15 * MINUTE_MS),
    signUpAddress: new RateLimiter(SIGN_UP_PER_ADDRESS_PER_HOUR, 60 * MINUTE_MS),
  };
  return globalForLimits.teardownAuthLimits;
}

/** Forgets every count (tests). */
export function resetRateLimits(): void {
  globalForLimits.teardownAuthLimits = undefined;
}

function tooMany(retryAfterS: number, what: string): ApiError {
  return new ApiError(429, "rate-limited", `too many ${what}; try again in ${retryAfterS} s`, {
    retryAfterSeconds: retryAfterS,
  });
}

/**
 * Counts a sign-in or sign-up attempt against its limits, or throws 429. `account` is the
 * lower-cased email a sign-in names (null when the body names none).
 */
export function limitAuthAttempt(
  req: Request,
  kind: "sign-in" | "sign-up",
  account: string | null,
): void {
  const l = limits();
  // The server hook stamps every request that arrives over a socket, so an unknown address means
  // a request made inside the process (tests calling handlers): it has no address to count, and
  // sharing one bucket would make unrelated callers block each other. Accounts are still counted.
  const address = clientAddress(req);
  const known = address !== UNKNOWN_ADDRESS;
  if (kind === "sign-up") {
    const wait = known ? l.signUpAddress.hit(address) : null;
    if (wait !== null) throw tooMany(wait, "accounts created from this address");
    return;
  }
  const byAddress = known ? l.signInAddress.hit(address) : null;
  if (byAddress !== null) throw tooMany(byAddress, "sign-in attempts from this address");
  if (account !== null) {
    const byAccount = l.signInAccount.hit(account);
    if (byAccount !== null) throw tooMany(byAccount, "sign-in attempts for this account");
  }
}
