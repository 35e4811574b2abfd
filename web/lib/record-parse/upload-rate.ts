/**
 * A per-caller limit on record submissions (new entries and revisions), the requests that cost
 * seconds of CPU to read. Each caller has a bucket of `submissionBurst()` submissions refilled at
 * `submissionsPerMinute()`; an empty bucket answers 429 with how long to wait. Kept in this process's
 * memory: each web replica limits on its own, which bounds the work each one is given.
 */
import { ApiError } from "../api-error";

/** Submissions a caller may make per minute, on average (read per call, so tests can set it). */
export const submissionsPerMinute = () => Number(process.env.RECORD_SUBMISSIONS_PER_MINUTE ?? 30);
/** Submissions a caller may make at once after a quiet spell. */
export const submissionBurst = () => Number(process.env.RECORD_SUBMISSION_BURST ?? 10);
/** Buckets kept at most; the fullest (longest idle) are dropped first when there are more. */
const MAX_BUCKETS = 10_000;

interface Bucket {
  tokens: number;
  at: number;
}

const globalForRate = globalThis as unknown as { teardownUploadBuckets?: Map<string, Bucket> };

/** Takes one submission from the caller's bucket, or throws 429 saying when to try again. */
export function takeUploadAllowance(callerKey: string, now: number = Date.now()): void {
  const buckets = (globalForRate.teardownUploadBuckets ??= new Map());
  const perMinute = submissionsPerMinute();
  const burst = submissionBurst();
  const perMs = perMinute / 60_000;
  const b = buckets.get(callerKey) ?? { tokens: burst, at: now };
  b.tokens = Math.min(burst, b.tokens + (now - b.at) * perMs);
  b.at = now;
  if (b.tokens < 1) {
    buckets.set(callerKey, b);
    const waitS = Math.ceil((1 - b.tokens) / perMs / 1000);
    throw new ApiError(
      429,
      "too-many-submissions",
      `too many records submitted; at most ${perMinute} a minute (try again in ${waitS} s)`,
      { retryAfterSeconds: waitS },
    );
  }
  b.tokens -= 1;
  buckets.delete(callerKey); // re-inserted last: Map order is then least recently used first
  buckets.set(callerKey, b);
  if (buckets.size > MAX_BUCKETS) buckets.delete(buckets.keys().next().value!);
}

/** Forgets every bucket (tests). */
export function resetUploadAllowances(): void {
  globalForRate.teardownUploadBuckets?.clear();
}
