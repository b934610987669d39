import { DEFAULT_MARGIN_THRESHOLDS } from "./margin";

/**
 * The tunables of a coil's health assessment and the vocabulary of its findings, shared by coil-health.ts
 * (which applies the status rule) and the per-quantity assessments it draws on.
 */

export interface HealthThresholds {
  /** Minimum headroom fractions (1 − stressed/limit). */
  voltageHeadroom: number;
  currentHeadroom: number;
  thermalHeadroom: number;
  /** A latest margin less than this far (headroom fraction) above its threshold is "near". */
  nearMargin: number;
  /** A significant falling margin reaching its threshold within this many days holds the coil… */
  holdWithinDays: number;
  /** …and within this many days puts it on watch; further out it is only reported. */
  watchWithinDays: number;
  /** Tolerated fractional shifts from baseline before "watch". */
  currentShift: number;
  frequencyShift: number;
  heatRiseShift: number;
  /** ±fraction around the most common supply voltage within which sessions count as comparable. */
  voltageBand: number;
  /** ±fraction around the most common run length within which heat-sink rises are compared. */
  durationBand: number;
}

export const DEFAULT_HEALTH_THRESHOLDS: Readonly<HealthThresholds> = {
  // The margin thresholds are the lending policy's (every caller passes the current policy's, coil-health-input.ts);
  // these defaults are the same table the default policy starts from (margin.ts), never a second set of numbers.
  voltageHeadroom: DEFAULT_MARGIN_THRESHOLDS.voltage,
  currentHeadroom: DEFAULT_MARGIN_THRESHOLDS.current,
  thermalHeadroom: DEFAULT_MARGIN_THRESHOLDS.thermal,
  nearMargin: 0.05, // common practice
  holdWithinDays: 30, // common practice
  watchWithinDays: 365, // common practice
  currentShift: 0.1, // common practice
  frequencyShift: 0.03, // common practice
  heatRiseShift: 0.25, // common practice
  voltageBand: 0.1, // common practice
  durationBand: 0.25, // common practice
};

/**
 * Fewest readings for a trend. Below six, Mann–Kendall can hardly reach 5 % significance (at n = 5 the exact
 * two-sided minimum p is 2/120) and one odd session dominates the slope.
 */
export const MIN_OBSERVATIONS_FOR_TREND = 6;

/**
 * How much of a health assessment to work out. "full": every trend is fitted, for the pages that draw and quote them.
 * "verdict": what the status, the reasons and how long they hold read (coil-health.ts assessCoilVerdict). A trend is
 * then fitted only where it can raise a finding (a significant margin trend, a level past its tolerance); elsewhere
 * only the checks its fit makes are run, so both refuse the same logbooks with the same words.
 */
export type AssessmentDetail = "full" | "verdict";

export type FindingSeverity = "hold" | "watch" | "info";

export interface HealthFinding {
  severity: FindingSeverity;
  /** What the finding is about, e.g. "voltage headroom", "supply current at comparable supply voltage". */
  subject: string;
  /** The sentence for the steward, with its figures. */
  text: string;
  /**
   * How many days until the margin is at its limit: 0 for a reading already below or near it, the projected crossing
   * for a falling trend; absent for findings that are not about a margin's limit. Orders findings of one severity.
   */
  daysAway?: number;
}
