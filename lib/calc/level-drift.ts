/**
 * A level that should stay put — supply current at like voltage, running frequency, measured first resonance,
 * heat-sink rise per watt — against its baseline: the relative shift, its trend, and whether the shift is past
 * tolerance. A resonant frequency that wanders means the coil or its surroundings changed; a current that
 * creeps up at the same voltage means losses grew.
 */
import { checkDriftTrendInput, fitDriftTrend, measureLevelShift, type DatedValue, type DriftTrend, type LevelShift } from "./drift-series";
import { describeBaseline, describeNotEnoughData, describeShift } from "./health-reasons";
import { MIN_OBSERVATIONS_FOR_TREND, type AssessmentDetail, type HealthFinding } from "./health-thresholds";

export interface LevelHealth {
  observations: number;
  /** Recent median against baseline; null when there are too few observations to form both. */
  shift: LevelShift | null;
  /**
   * Trend of value/baseline − 1, so its rates are fractions of the baseline per 30 days. Null with fewer than
   * MIN_OBSERVATIONS_FOR_TREND observations, and in "verdict" detail unless the level is flagged (only a flagged
   * level's finding quotes it).
   */
  trend: DriftTrend | null;
  /** Shift beyond which the level is flagged, as a fraction of the baseline. */
  tolerance: number;
  flagged: boolean;
  findings: HealthFinding[];
}

/** Relative shift from baseline and its Theil–Sen trend (robust-trend.ts), flagged past `tolerance`. */
export function assessLevelDrift(args: {
  /** Lower-case noun phrase for sentences, e.g. "running frequency". */
  subject: string;
  /** What one observation is. */
  unit: "sessions" | "sweeps";
  series: readonly DatedValue[];
  /** Observations in the baseline and in the recent level. */
  count: number;
  explicitBaseline?: number;
  tolerance: number;
  confidence: number;
  formatValue: (value: number) => string;
  /** Default "full" (health-thresholds.ts AssessmentDetail). */
  detail?: AssessmentDetail;
}): LevelHealth {
  const { subject, series, count, tolerance } = args;
  const findings: HealthFinding[] = [];
  const shift = measureLevelShift(
    series.map((p) => p.value),
    { count, explicitBaseline: args.explicitBaseline },
  );
  if (shift === null) {
    if (series.length > 0) {
      findings.push({
        severity: "info",
        subject,
        text: describeNotEnoughData(`a ${subject} baseline comparison`, series.length, 2 * count),
      });
    }
    return { observations: series.length, shift, trend: null, tolerance, flagged: false, findings };
  }
  const flagged = Math.abs(shift.shiftFraction) > tolerance;
  const relative = () => series.map((p) => ({ at: p.at, value: p.value / shift.baseline - 1 }));
  let trend: DriftTrend | null = null;
  if (series.length >= MIN_OBSERVATIONS_FOR_TREND) {
    if (flagged || args.detail !== "verdict") trend = fitDriftTrend(relative(), args.confidence);
    else checkDriftTrendInput(relative(), args.confidence);
  }
  if (flagged) {
    const baselineWords =
      `${describeBaseline(shift.baselineSource, shift.baselineCount, shift.recentCount, args.unit)}: ` +
      `${args.formatValue(shift.recent)} against ${args.formatValue(shift.baseline)}`;
    findings.push({
      severity: "watch",
      subject,
      text: describeShift({
        subject,
        shiftFraction: shift.shiftFraction,
        baselineWords,
        trend: trend && { ...trend, confidence: args.confidence },
      }),
    });
  }
  return { observations: series.length, shift, trend, tolerance, flagged, findings };
}
