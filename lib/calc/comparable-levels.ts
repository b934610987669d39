/**
 * Levels compared only across sessions run under like conditions: supply current near the most common supply
 * voltage, heat-sink rise per watt over runs of the most common length. A change of set-up then reads as what
 * it is, not as drift.
 */
import type { CoilSession, ValidBaseline } from "./coil-logbook";
import { findModalBand, type DatedValue } from "./drift-series";
import { formatFigure } from "./health-reasons";
import type { AssessmentDetail, HealthThresholds } from "./health-thresholds";
import { assessLevelDrift } from "./level-drift";

/** What both comparisons need from the assessment: its confidence level and tolerances. */
export interface ComparisonContext {
  confidence: number;
  thresholds: HealthThresholds;
  detail?: AssessmentDetail;
}

/**
 * Supply current over sessions within ±voltageBand of the most common supply voltage, scaled to that voltage
 * as I·V_ref/V. To first order a driver into an unchanged resonant load draws current in proportion to its
 * supply (input power ∝ V², derived); the band keeps that assumption local, so sessions run at another
 * voltage — a variac turned down for a demonstration — neither count as drift nor hide it.
 */
export function assessComparableCurrent(sessions: readonly CoilSession[], baseline: ValidBaseline, common: ComparisonContext) {
  const band = findModalBand(
    sessions.map((s) => s.supplyVoltageV),
    common.thresholds.voltageBand,
  );
  const reference = band?.reference ?? null;
  const series: DatedValue[] =
    band === null
      ? []
      : band.members.map((i) => {
          const s = sessions[i]!;
          return { at: s.startedAt, value: (s.supplyCurrentA * band.reference) / s.supplyVoltageV };
        });
  const explicit = baseline.supplyCurrent;
  const level = assessLevelDrift({
    subject:
      reference === null
        ? "supply current at comparable supply voltage"
        : `supply current at comparable supply voltage (${formatFigure(reference)} V ± ${formatFigure(common.thresholds.voltageBand * 100)} %)`,
    unit: "sessions",
    series,
    count: baseline.sessionCount,
    explicitBaseline:
      explicit && reference !== null ? (explicit.supplyCurrentA * reference) / explicit.supplyVoltageV : undefined,
    tolerance: common.thresholds.currentShift,
    confidence: common.confidence,
    detail: common.detail,
    formatValue: (a) => `${formatFigure(a)} A`,
  });
  return { ...level, referenceVoltageV: reference };
}

/**
 * Heat-sink rise per watt of DC input, K/W, over runs within ±durationBand of the most common run length: a
 * sink that warms more for the same power and time points to a clogged fin, a failing fan or dried grease.
 * Length matters because a short run stops before the sink settles (first-order warm-up, Incropera & DeWitt, from memory).
 */
export function assessHeatRise(sessions: readonly CoilSession[], baseline: ValidBaseline, common: ComparisonContext) {
  const eligible = sessions.filter((s) => s.heatSinkRiseK != null && s.supplyCurrentA > 0 && s.durationS > 0);
  const band = findModalBand(
    eligible.map((s) => s.durationS),
    common.thresholds.durationBand,
  );
  const series: DatedValue[] =
    band === null
      ? []
      : band.members.map((i) => {
          const s = eligible[i]!;
          return { at: s.startedAt, value: s.heatSinkRiseK! / (s.supplyVoltageV * s.supplyCurrentA) };
        });
  const reference = band?.reference ?? null;
  const level = assessLevelDrift({
    subject:
      reference === null
        ? "heat-sink rise per watt of input"
        : `heat-sink rise per watt of input (runs of ${formatFigure(reference / 60)} min ± ${formatFigure(common.thresholds.durationBand * 100)} %)`,
    unit: "sessions",
    series,
    count: baseline.sessionCount,
    explicitBaseline: baseline.heatSinkRisePerWattKPerW,
    tolerance: common.thresholds.heatRiseShift,
    confidence: common.confidence,
    detail: common.detail,
    formatValue: (kPerW) => `${formatFigure(kPerW)} K/W`,
  });
  // Only a rise is a warning sign; a sink that now runs cooler per watt is not.
  const flagged = level.flagged && level.shift !== null && level.shift.shiftFraction > 0;
  return {
    ...level,
    flagged,
    findings: flagged ? level.findings : level.findings.filter((f) => f.severity !== "watch"),
    referenceDurationS: reference,
  };
}

