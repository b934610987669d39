/**
 * One margin (voltage, current or thermal headroom) across a coil's sessions: its latest reading against the
 * threshold, its robust trend, and when a falling trend would reach the threshold — with the finding each of
 * those raises under coil-health.ts's status rule.
 */
import { addDays, daysBetween, fitDriftTrend, isDriftTrendSignificant, type DatedValue, type DriftTrend } from "./drift-series";
import {
  describeFallingMargin,
  describeMarginBelowLimit,
  describeMarginNearLimit,
  describeNotEnoughData,
  type CrossingWords,
} from "./health-reasons";
import {
  MIN_OBSERVATIONS_FOR_TREND,
  type AssessmentDetail,
  type FindingSeverity,
  type HealthFinding,
  type HealthThresholds,
} from "./health-thresholds";
import { projectCrossing } from "./robust-trend";

/** Allowance when comparing a headroom with its threshold: 0.8 of a rating is "within 80 %" though 1 − 0.8 ≠ 0.2. */
const HEADROOM_TOLERANCE = 1e-12;

/**
 * The farthest a projection is dated: 1 000 years. A falling trend whose line meets the limit later still is reported by
 * its rate alone, as one that never meets it, and a range's far end beyond it reads "never": a date that far out tells a
 * steward nothing, and past ±100 million days a JavaScript Date cannot hold it at all (a minute but steady fall, say a
 * logged peak creeping up by microvolts, is significant and would be dated there, and formatting that date throws).
 */
export const PROJECTION_HORIZON_DAYS = 365_250;

export interface MarginCrossing extends CrossingWords {
  /** The fitted value at the projection's start (now, or the last session if later). */
  fittedNow: number;
}

export interface MarginHealth {
  margin: "voltage" | "current" | "thermal";
  /** Minimum headroom fraction. */
  threshold: number;
  observations: number;
  latest: DatedValue | null;
  /**
   * Null with fewer than MIN_OBSERVATIONS_FOR_TREND readings, and in "verdict" detail when the trend is not
   * significant (it raises no finding then). Rates are headroom fractions per 30 days.
   */
  trend: DriftTrend | null;
  /** Significant and falling (Mann–Kendall p < 1 − confidence, slope < 0). */
  falling: boolean;
  /** Where a falling trend meets the threshold; null when it is not falling, or meets it only beyond PROJECTION_HORIZON_DAYS. */
  crossing: MarginCrossing | null;
  findings: HealthFinding[];
}

/** Latest reading, trend and projected crossing of one margin, with findings (straight-line projection, robust-trend.ts). */
export function assessMarginDrift(args: {
  name: MarginHealth["margin"];
  threshold: number;
  series: readonly DatedValue[];
  confidence: number;
  now: Date;
  thresholds: HealthThresholds;
  sessionsPerDay: number | null;
  /** Default "full" (health-thresholds.ts AssessmentDetail). */
  detail?: AssessmentDetail;
}): MarginHealth {
  const { name, threshold, series, thresholds } = args;
  const label = `${name} headroom`;
  const findings: HealthFinding[] = [];
  const add = (severity: FindingSeverity, text: string, daysAway?: number) =>
    findings.push({ severity, subject: label, text, ...(daysAway === undefined ? {} : { daysAway }) });
  const latest = series[series.length - 1] ?? null;

  if (latest !== null && latest.value < threshold - HEADROOM_TOLERANCE) {
    add("hold", describeMarginBelowLimit(label, latest.value, threshold, latest.at), 0);
  } else if (latest !== null && latest.value < threshold + thresholds.nearMargin) {
    add("watch", describeMarginNearLimit(label, latest.value, threshold, thresholds.nearMargin), 0);
  }

  if (series.length < MIN_OBSERVATIONS_FOR_TREND) {
    if (series.length > 0) add("info", describeNotEnoughData(`a ${label} trend`, series.length, MIN_OBSERVATIONS_FOR_TREND));
    return { margin: name, threshold, observations: series.length, latest, trend: null, falling: false, crossing: null, findings };
  }

  // Only a significant trend can raise a finding; the verdict tests that first and fits only those (a fit's slopes are
  // most of its cost, and most margins hold steady).
  const fitted = args.detail !== "verdict" || isDriftTrendSignificant(series, args.confidence);
  const trend = fitted ? fitDriftTrend(series, args.confidence) : null;
  const falling = trend !== null && trend.significant && trend.fit.slope < 0;
  const crossing = falling && latest !== null ? forecastCrossing(trend, threshold, latest.at, args) : null;
  if (falling) {
    const daysAway = crossing?.daysAway ?? Number.POSITIVE_INFINITY;
    const severity: FindingSeverity =
      daysAway <= thresholds.holdWithinDays ? "hold" : daysAway <= thresholds.watchWithinDays ? "watch" : "info";
    add(
      severity,
      describeFallingMargin({
        label,
        perMonth: trend.perMonth,
        perMonthLow: trend.perMonthLow,
        perMonthHigh: trend.perMonthHigh,
        confidence: args.confidence,
        pValue: trend.fit.pValue,
        threshold,
        crossing,
      }),
      Number.isFinite(daysAway) ? daysAway : undefined,
    );
  }
  return { margin: name, threshold, observations: series.length, latest, trend, falling, crossing, findings };
}

function forecastCrossing(
  trend: DriftTrend,
  threshold: number,
  lastAt: Date,
  args: { now: Date; sessionsPerDay: number | null },
): MarginCrossing | null {
  const fromX = Math.max(daysBetween(trend.origin, args.now), daysBetween(trend.origin, lastAt));
  const start = addDays(trend.origin, fromX);
  const fittedNow = trend.fit.intercept + trend.fit.slope * fromX;
  const sessionsIn = (days: number) => (args.sessionsPerDay === null ? null : Math.round(days * args.sessionsPerDay));
  if (fittedNow <= threshold) {
    return { at: start, earliest: start, latest: start, daysAway: 0, sessionsAway: 0, alreadyReached: true, fittedNow };
  }
  const crossing = projectCrossing(trend.fit, threshold, { fromX });
  if (crossing === null) return null;
  const daysAway = crossing.x - fromX;
  if (!(daysAway <= PROJECTION_HORIZON_DAYS)) return null;
  return {
    at: addDays(trend.origin, crossing.x),
    earliest: addDays(trend.origin, crossing.xEarliest),
    latest: crossing.xLatest - fromX <= PROJECTION_HORIZON_DAYS ? addDays(trend.origin, crossing.xLatest) : null,
    daysAway,
    sessionsAway: sessionsIn(daysAway),
    alreadyReached: false,
    fittedNow,
  };
}
