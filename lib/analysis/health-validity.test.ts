import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { assessCoilHealth, type CoilHealth } from "../calc/coil-health";
import type { CoilSession } from "../calc/coil-logbook";
import { createSeededRandom } from "../calc/seeded-random";
import { computeHealthValidUntil } from "./health-validity";

const DAY = 86_400_000;
const START = new Date("2026-01-05T23:30:00Z");

/** Sessions with a voltage headroom falling `slopePerDay` from `v0`, with ±1.5 points of noise (common practice). */
function fallingLogbook(o: { seed: number; sessions: number; v0: number; slopePerDay: number; spacingDays: number }): CoilSession[] {
  const rng = createSeededRandom(o.seed);
  return Array.from({ length: o.sessions }, (_, i) => {
    const day = i * o.spacingDays;
    return {
      startedAt: new Date(START.getTime() + day * DAY),
      supplyVoltageV: 170,
      supplyCurrentA: 2.4 * (1 + 0.03 * rng.normal()),
      durationS: 300,
      voltageHeadroom: o.v0 + o.slopePerDay * day + 0.015 * rng.normal(),
      currentHeadroom: 0.5 + 0.015 * rng.normal(),
      thermalHeadroom: 0.35 + 0.015 * rng.normal(),
    };
  });
}

const assess = (sessions: readonly CoilSession[], now: Date) => assessCoilHealth({ sessions, sweeps: [], now });
const verdict = (health: CoilHealth) => ({ status: health.status, reasons: health.reasons });

describe("computeHealthValidUntil", () => {
  it("is null for a logbook with no falling margin: time alone never changes its health", () => {
    const sessions = fallingLogbook({ seed: 1, sessions: 20, v0: 0.45, slopePerDay: 0, spacingDays: 7 });
    const now = new Date(sessions.at(-1)!.startedAt.getTime() + DAY);
    const health = assess(sessions, now);
    expect(health.margins.voltage.falling).toBe(false);
    expect(computeHealthValidUntil(health, now)).toBeNull();
    expect(verdict(assess(sessions, new Date(now.getTime() + 900 * DAY)))).toEqual(verdict(health));
  });

  it("ends when the rounded sessions-away figure drops, and the words change right after", () => {
    // Headroom 0.40 falling 0.0008 a day meets the 0.20 limit around day 250; 30 sessions a week apart end on day 203.
    const sessions = fallingLogbook({ seed: 7, sessions: 30, v0: 0.4, slopePerDay: -0.0008, spacingDays: 7 });
    const now = new Date(sessions.at(-1)!.startedAt.getTime() + 2 * DAY);
    const health = assess(sessions, now);
    const crossing = health.margins.voltage.crossing!;
    expect(crossing.alreadyReached).toBe(false);
    expect(crossing.sessionsAway).not.toBeNull();
    const validUntil = computeHealthValidUntil(health, now)!;
    // One session every 7 days: the figure drops within a week, never later.
    expect(validUntil.getTime()).toBeGreaterThan(now.getTime());
    expect(validUntil.getTime()).toBeLessThanOrEqual(now.getTime() + 7 * DAY);
    expect(verdict(assess(sessions, new Date(validUntil.getTime() - 1)))).toEqual(verdict(health));
    expect(verdict(assess(sessions, new Date(validUntil.getTime() + 2)))).not.toEqual(verdict(health));
  });

  it("holds the verdict from now until it ends, and the projection does not start before the last session", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 1_000_000 }),
        fc.integer({ min: 12, max: 40 }),
        fc.double({ min: -0.004, max: -0.0003, noNaN: true }),
        fc.constantFrom(7, 3, 0.02), // a week, three days, or every half hour (a span under a day: "in about N days")
        fc.double({ min: -5, max: 400, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (seed, count, slopePerDay, spacingDays, offsetDays, fraction) => {
          const slope = spacingDays < 1 ? slopePerDay * 300 : slopePerDay;
          const sessions = fallingLogbook({ seed, sessions: count, v0: 0.45, slopePerDay: slope, spacingDays });
          const now = new Date(sessions.at(-1)!.startedAt.getTime() + offsetDays * (spacingDays < 1 ? DAY / 50 : DAY));
          const health = assess(sessions, now);
          const validUntil = computeHealthValidUntil(health, now);
          const expected = verdict(health);
          if (validUntil === null) {
            expect(verdict(assess(sessions, new Date(now.getTime() + 1000 * DAY)))).toEqual(expected);
            return;
          }
          expect(validUntil.getTime()).toBeGreaterThanOrEqual(now.getTime());
          const inside = new Date(now.getTime() + Math.floor(fraction * (validUntil.getTime() - now.getTime())));
          expect(verdict(assess(sessions, inside))).toEqual(expected);
          if (validUntil.getTime() > now.getTime()) expect(verdict(assess(sessions, new Date(validUntil.getTime() - 1)))).toEqual(expected);
        },
      ),
      { numRuns: 150 },
    );
  });
});
