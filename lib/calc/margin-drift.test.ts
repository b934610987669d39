import { describe, expect, it } from "vitest";
import { addDays } from "./drift-series";
import { DEFAULT_HEALTH_THRESHOLDS } from "./health-thresholds";
import { assessMarginDrift, PROJECTION_HORIZON_DAYS } from "./margin-drift";

const start = new Date("2026-01-05T18:00:00Z");
const line = (days: number[], at0: number, perDay: number) =>
  days.map((d) => ({ at: addDays(start, d), value: at0 + perDay * d }));

const base = { name: "voltage" as const, threshold: 0.2, confidence: 0.95, thresholds: DEFAULT_HEALTH_THRESHOLDS };

describe("assessMarginDrift", () => {
  it("projects an exact falling line to the day it meets the threshold", () => {
    // derived: 0.5 − 0.01·d meets 0.2 at d = 30; from day 9 that is 21 days, 21 sessions at one a day
    const result = assessMarginDrift({
      ...base,
      series: line([0, 1, 2, 3, 4, 5, 6, 7, 8, 9], 0.5, -0.01),
      now: addDays(start, 9),
      sessionsPerDay: 1,
    });
    expect(result.falling).toBe(true);
    expect(result.crossing?.at.getTime()).toBeCloseTo(addDays(start, 30).getTime(), -3);
    expect(result.crossing?.daysAway).toBeCloseTo(21, 9);
    expect(result.crossing?.sessionsAway).toBe(21);
    expect(result.crossing?.latest?.getTime()).toBeCloseTo(addDays(start, 30).getTime(), -3);
    expect(result.findings.map((f) => f.severity)).toEqual(["hold"]); // 21 days ≤ holdWithinDays (30)
  });

  it("holds when the fitted line is already at the threshold even if the last reading is above it", () => {
    const series = line([0, 1, 2, 3, 4, 5, 6], 0.5, -0.01);
    const result = assessMarginDrift({ ...base, series, now: addDays(start, 40), sessionsPerDay: null });
    expect(result.crossing).toMatchObject({ alreadyReached: true, daysAway: 0 });
    expect(result.findings.some((f) => f.severity === "hold" && /already at the 20 % limit/.test(f.text))).toBe(true);
  });

  it("says 'not enough data' below six readings, yet still flags a latest reading under the threshold", () => {
    const result = assessMarginDrift({ ...base, series: line([0, 1], 0.25, -0.1), now: addDays(start, 2), sessionsPerDay: 1 });
    expect(result.trend).toBeNull();
    expect(result.findings.map((f) => [f.severity, f.text])).toEqual([
      ["hold", "Latest voltage headroom is 15 %, below the 20 % limit (session of 2026-01-06)."],
      ["info", "Not enough data for a voltage headroom trend: 2 recorded, at least 6 needed."],
    ]);
  });

  it("treats a reading of exactly the threshold as at, not below, the limit", () => {
    // 1 − 0.8 = 0.19999999999999996 in floating point: a peak at exactly 80 % of its rating is within 80 %
    const result = assessMarginDrift({ ...base, series: [{ at: start, value: 1 - 0.8 }], now: start, sessionsPerDay: null });
    expect(result.findings.map((f) => f.severity)).toEqual(["watch", "info"]);
  });

  it("reports a minute but steady fall by its rate alone when its line meets the limit beyond the horizon", () => {
    // derived: 0.5 − 1e-9·d is significant (every pair falls) and meets 0.2 at d = 3e8, about 820 000 years on: past the
    // 1 000-year horizon, and past what a Date can hold
    const result = assessMarginDrift({ ...base, series: line([0, 1, 2, 3, 4, 5, 6, 7], 0.5, -1e-9), now: addDays(start, 7), sessionsPerDay: 1 });
    expect(result.falling).toBe(true);
    expect(result.crossing).toBeNull();
    expect(result.findings.map((f) => [f.severity, f.daysAway])).toEqual([["info", undefined]]);
    expect(result.findings[0]!.text).toMatch(/^Voltage headroom is falling about [\d.]+ points a month \([^)]*\)\.$/);
  });

  it("still dates a projection just inside the horizon", () => {
    // derived: 0.5 − 0.3/(PROJECTION_HORIZON_DAYS + 6)·d meets 0.2 at d = PROJECTION_HORIZON_DAYS + 6, one day inside the
    // horizon counted from the last reading (day 7)
    const perDay = -0.3 / (PROJECTION_HORIZON_DAYS + 6);
    const days = [0, 1, 2, 3, 4, 5, 6, 7];
    const result = assessMarginDrift({ ...base, series: line(days, 0.5, perDay), now: start, sessionsPerDay: null });
    expect(result.crossing?.daysAway).toBeCloseTo(PROJECTION_HORIZON_DAYS - 1, 3);
    expect(result.crossing?.at.getUTCFullYear()).toBe(3026);
    expect(result.findings[0]!.text).toContain("around ");
  });
});
