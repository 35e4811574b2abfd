/**
 * A per-caller limit on computed what-ifs (cached answers are free): a bucket of
 * `whatIfBurst()` runs refilled at `whatIfsPerMinute()`; an empty bucket answers 429 with how
 * long to wait. In this process's memory, like the upload limit: each web replica limits alone.
 */
import { ApiError } from "../api-error";

export const whatIfsPerMinute = () => Number(process.env.WHAT_IF_RUNS_PER_MINUTE ?? 6);
export const whatIfBurst = () => Number(process.env.WHAT_IF_RUN_BURST ?? 3);
const MAX_BUCKETS = 10_000;

interface Bucket {
  tokens: number;
  at: number;
}

const globalForRate = globalThis as unknown as { teardownWhatIfBuckets?: Map<string, Bucket> };

/** Takes one run from the caller's bucket, or throws 429 saying when to try again. */
export function takeWhatIfAllowance(callerKey: string, now: number = Date.now()): void {
  const buckets = (globalForRate.teardownWhatIfBuckets ??= new Map());
  const perMinute = whatIfsPerMinute();
  const perMs = perMinute / 60_000;
  const b = buckets.get(callerKey) ?? { tokens: whatIfBurst(), at: now };
  b.tokens = Math.min(whatIfBurst(), b.tokens + (now - b.at) * perMs);
  b.at = now;
  buckets.delete(callerKey); // re-inserted last: Map order is then least recently used first
  buckets.set(callerKey, b);
  if (buckets.size > MAX_BUCKETS) buckets.delete(buckets.keys().next().value!);
  if (b.tokens < 1) {
    const waitS = Math.ceil((1 - b.tokens) / perMs / 1000);
    throw new ApiError(
      429,
      "too-many-what-ifs",
      `too many what-if runs; at most ${perMinute} a minute (try again in ${waitS} s)`,
      { retryAfterSeconds: waitS },
    );
  }
  b.tokens -= 1;
}

/** Forgets every bucket (tests). */
export function resetWhatIfAllowances(): void {
  globalForRate.teardownWhatIfBuckets?.clear();
}
