import { describe, expect, it } from "vitest";
import { THROTTLE, activeFailures, delayBeforeAttemptMs, isLocked, recordFailure, type ThrottleState } from "./throttle-policy";

describe("sign-in throttle policy", () => {
  const t0 = new Date("2026-03-01T10:00:00Z");

  it("adds no delay for the first failures, then doubles up to the cap", () => {
    expect(delayBeforeAttemptMs(0)).toBe(0);
    expect(delayBeforeAttemptMs(THROTTLE.freeFailures)).toBe(0);
    expect(delayBeforeAttemptMs(THROTTLE.freeFailures + 1)).toBe(THROTTLE.baseDelayMs);
    expect(delayBeforeAttemptMs(THROTTLE.freeFailures + 2)).toBe(THROTTLE.baseDelayMs * 2);
    expect(delayBeforeAttemptMs(50)).toBe(THROTTLE.maxDelayMs);
  });

  it("locks the key after repeated failures and unlocks when the lock expires", () => {
    let state: ThrottleState | null = null;
    for (let i = 0; i < THROTTLE.lockAfterFailures; i++) state = recordFailure(state, new Date(t0.getTime() + i * 1000), 15);
    expect(state!.failures).toBe(THROTTLE.lockAfterFailures);
    expect(isLocked(state, new Date(t0.getTime() + 60_000))).toBe(true);
    expect(isLocked(state, new Date(t0.getTime() + 16 * 60_000))).toBe(false);
  });

  it("forgets failures after a quiet window", () => {
    const state = recordFailure(recordFailure(null, t0, 15), t0, 15);
    expect(activeFailures(state, new Date(t0.getTime() + 60_000))).toBe(2);
    expect(activeFailures(state, new Date(t0.getTime() + THROTTLE.windowMs + 1))).toBe(0);
    expect(recordFailure(state, new Date(t0.getTime() + THROTTLE.windowMs + 1), 15).failures).toBe(1);
  });
});
