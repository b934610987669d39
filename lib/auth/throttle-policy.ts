/**
 * How repeated failed sign-ins are slowed down: a growing delay from the third failure, then a
 * lock-out. Pure so it can be tested without a database or a clock.
 */
export const THROTTLE = {
  /** Failures before any delay is added. */
  freeFailures: 2,
  /** First added delay, doubled for each further failure, capped at maxDelayMs. */
  baseDelayMs: 500,
  maxDelayMs: 4_000,
  /** Failures that lock the key. */
  lockAfterFailures: 8,
  /** Failures older than this are forgotten. */
  windowMs: 15 * 60_000,
} as const;

export interface ThrottleState {
  failures: number;
  lastFailureAt: Date;
  lockedUntil: Date | null;
}

/** Failures still counting at `now` (the window resets after a quiet period). */
export function activeFailures(state: ThrottleState | null, now: Date): number {
  if (!state) return 0;
  return now.getTime() - state.lastFailureAt.getTime() > THROTTLE.windowMs ? 0 : state.failures;
}

export function isLocked(state: ThrottleState | null, now: Date): boolean {
  return !!state?.lockedUntil && state.lockedUntil.getTime() > now.getTime();
}

/** Delay to impose before answering an attempt, given the failures so far. */
export function delayBeforeAttemptMs(failures: number): number {
  if (failures <= THROTTLE.freeFailures) return 0;
  const doublings = failures - THROTTLE.freeFailures - 1;
  return Math.min(THROTTLE.baseDelayMs * 2 ** doublings, THROTTLE.maxDelayMs);
}

/** The state after one more failure at `now`. */
export function recordFailure(state: ThrottleState | null, now: Date, lockMinutes: number): ThrottleState {
  const failures = activeFailures(state, now) + 1;
  const lockedUntil =
    failures >= THROTTLE.lockAfterFailures ? new Date(now.getTime() + lockMinutes * 60_000) : (state?.lockedUntil ?? null);
  return { failures, lastFailureAt: now, lockedUntil };
}
