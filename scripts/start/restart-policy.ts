/**
 * When the start script restarts a crashed worker or web server, and when it gives up. A child
 * that keeps dying (a bad config, a broken build) must not be restarted forever: after
 * `maxRestarts` within `windowMs` the start stops everything with the reason.
 */

/** Restarts allowed for one child within the window before the start gives up. */
export const MAX_RESTARTS = 5;
/** The window those restarts are counted in. */
export const RESTART_WINDOW_MS = 10 * 60_000;
/** Waits before the n-th restart in the window: 1 s, 2 s, 4 s ... at most 15 s. */
export function restartDelayMs(restartsInWindow: number): number {
  return Math.min(15_000, 1000 * 2 ** Math.max(0, restartsInWindow - 1));
}

/** Counts one child's restarts in a sliding window. */
export class RestartBudget {
  private readonly times: number[] = [];
  constructor(
    private readonly max = MAX_RESTARTS,
    private readonly windowMs = RESTART_WINDOW_MS,
  ) {}

  /** Records a crash at `now`; returns how many restarts are now in the window, or null when over. */
  take(now: number): number | null {
    while (this.times.length && now - this.times[0]! > this.windowMs) this.times.shift();
    if (this.times.length >= this.max) return null;
    this.times.push(now);
    return this.times.length;
  }
}

/** A child's exit, in words for the log. */
export function describeExit(code: number | null, signal: NodeJS.Signals | null): string {
  return `code ${code}, signal ${signal}`;
}
