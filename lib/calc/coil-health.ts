/**
 * One coil's health across its logbook: are its margins holding, drifting toward their limits, or already
 * past them; has its supply current at like supply voltage, its running frequency or its measured first
 * resonance moved from where it started. The answer is a status a steward acts on, with reasons carrying the
 * figures, and "not enough data" instead of a verdict the logbook cannot support.
 *
 * Status rule (first that applies):
 *  hold   — a margin's latest reading is below its threshold; or a margin has a significant falling trend
 *           (Mann–Kendall p < 1 − confidence) whose fitted line reaches the threshold within holdWithinDays.
 *  watch  — a significant falling margin trend reaching the threshold within watchWithinDays; a latest margin
 *           within nearMargin of its threshold; supply current at comparable voltage shifted more than
 *           currentShift from baseline; running frequency or first resonance shifted more than frequencyShift;
 *           heat-sink rise per watt up more than heatRiseShift.
 *  not enough data — none of the above, and no margin has MIN_OBSERVATIONS_FOR_TREND readings to judge a trend.
 *  fine   — otherwise.
 * A real but slow decline (limit more than watchWithinDays away) is reported without raising the status: with
 * three margins tested at 5 %, flagging every significant slope would raise false alarms on healthy coils.
 */
import {
  requireDate,
  validateLogbook,
  validateThresholds,
  type CoilSession,
  type CoilSweep,
  type HealthBaseline,
} from "./coil-logbook";
import { assessComparableCurrent, assessHeatRise } from "./comparable-levels";
import { CalcInputError } from "./errors";
import { daysBetween, type DatedValue } from "./drift-series";
import { formatFrequency } from "./health-reasons";
import {
  DEFAULT_HEALTH_THRESHOLDS,
  MIN_OBSERVATIONS_FOR_TREND,
  type AssessmentDetail,
  type FindingSeverity,
  type HealthFinding,
  type HealthThresholds,
} from "./health-thresholds";
import { assessLevelDrift, type LevelHealth } from "./level-drift";
import { assessMarginDrift, type MarginHealth } from "./margin-drift";

export type HealthStatus = "fine" | "watch" | "hold" | "not enough data";

export interface CoilHealth {
  status: HealthStatus;
  /** The findings' sentences, most severe first. */
  reasons: string[];
  findings: HealthFinding[];
  margins: { voltage: MarginHealth; current: MarginHealth; thermal: MarginHealth };
  /** Supply current scaled to the reference voltage (I·V_ref/V) over sessions within the voltage band. */
  supplyCurrent: LevelHealth & { referenceVoltageV: number | null };
  runningFrequency: LevelHealth;
  firstSeriesResonance: LevelHealth;
  /** Heat-sink rise per watt of DC input (K/W) over runs within the duration band. */
  heatSinkRisePerWatt: LevelHealth & { referenceDurationS: number | null };
  sessionCount: number;
  /** Average sessions per day over the logged span; null with fewer than two sessions or a span under a day. */
  sessionsPerDay: number | null;
  confidence: number;
}

export interface CoilHealthInput {
  sessions: readonly CoilSession[];
  sweeps: readonly CoilSweep[];
  baseline?: HealthBaseline;
  thresholds?: Partial<HealthThresholds>;
  /** When the assessment is made; projections run from here. */
  now: Date;
  /** Two-sided confidence for trend ranges and the significance test (default 0.95). */
  confidence?: number;
  /** Failures still open (no completed post-mortem): each one holds the coil, whatever its margins say. */
  openFailures?: readonly OpenFailure[];
}

/** A recorded failure whose post-mortem is not complete. `mode` is the failure mode as recorded, e.g. "over_voltage". */
export interface OpenFailure {
  occurredAt: Date;
  mode: string;
}

/** What a coil's status, reasons and their expiry (lib/analysis/health-validity.ts) are made of: a margin without its trend. */
export type MarginVerdict = Omit<MarginHealth, "trend">;

/** assessCoilHealth's status and reasons with what they rest on, without the trends the pages draw (assessCoilVerdict). */
export interface CoilVerdict extends Pick<CoilHealth, "status" | "reasons" | "findings" | "sessionCount" | "sessionsPerDay" | "confidence"> {
  margins: { voltage: MarginVerdict; current: MarginVerdict; thermal: MarginVerdict };
}

/** Assesses one coil (methods: Theil–Sen with Sen's interval and Mann–Kendall, robust-trend.ts). */
export function assessCoilHealth(input: CoilHealthInput): CoilHealth {
  return assessHealth(input, "full");
}

/**
 * assessCoilHealth's verdict, fitting only the trends that can raise a finding (health-thresholds.ts AssessmentDetail):
 * for the dashboard, which stores the status and reasons of every coil and draws no trend. It throws where
 * assessCoilHealth throws, and otherwise equals toCoilVerdict(assessCoilHealth(input)) (coil-health.test.ts checks
 * both on generated logbooks).
 */
export function assessCoilVerdict(input: CoilHealthInput): CoilVerdict {
  return toCoilVerdict(assessHealth(input, "verdict"));
}

/** The verdict part of a full assessment. */
export function toCoilVerdict(health: CoilHealth): CoilVerdict {
  const { status, reasons, findings, sessionCount, sessionsPerDay, confidence } = health;
  const margin = ({ trend: _trend, ...rest }: MarginHealth): MarginVerdict => rest;
  const { voltage, current, thermal } = health.margins;
  return { status, reasons, findings, margins: { voltage: margin(voltage), current: margin(current), thermal: margin(thermal) }, sessionCount, sessionsPerDay, confidence };
}

function assessHealth(input: CoilHealthInput, detail: AssessmentDetail): CoilHealth {
  const confidence = input.confidence ?? 0.95;
  if (!Number.isFinite(confidence) || confidence <= 0 || confidence >= 1) {
    throw new CalcInputError("confidence", "a fraction strictly between 0 and 1, e.g. 0.95", confidence);
  }
  const now = requireDate("now", input.now);
  const thresholds = validateThresholds({ ...DEFAULT_HEALTH_THRESHOLDS, ...input.thresholds });
  const { sessions, sweeps, baseline } = validateLogbook(input);

  const first = sessions[0];
  const last = sessions[sessions.length - 1];
  const spanDays = first && last ? daysBetween(first.startedAt, last.startedAt) : 0;
  const sessionsPerDay = sessions.length >= 2 && spanDays >= 1 ? (sessions.length - 1) / spanDays : null;
  const common = { confidence, now, thresholds, sessionsPerDay, detail };

  const margin = (
    name: MarginHealth["margin"],
    key: "voltageHeadroom" | "currentHeadroom" | "thermalHeadroom",
    threshold: number,
  ) => assessMarginDrift({ ...common, name, threshold, series: datedSeries(sessions, (s) => s[key]) });
  const margins = {
    voltage: margin("voltage", "voltageHeadroom", thresholds.voltageHeadroom),
    current: margin("current", "currentHeadroom", thresholds.currentHeadroom),
    thermal: margin("thermal", "thermalHeadroom", thresholds.thermalHeadroom),
  };

  const supplyCurrent = assessComparableCurrent(sessions, baseline, common);
  const runningFrequency = assessLevelDrift({
    confidence,
    subject: "running frequency",
    unit: "sessions",
    series: datedSeries(sessions, (s) => s.runningFrequencyHz),
    count: baseline.sessionCount,
    explicitBaseline: baseline.runningFrequencyHz,
    tolerance: thresholds.frequencyShift,
    formatValue: formatFrequency,
    detail,
  });
  const firstSeriesResonance = assessLevelDrift({
    confidence,
    subject: "measured first series resonance",
    unit: "sweeps",
    series: sweeps.flatMap((s) => (s.firstSeriesResonanceHz == null ? [] : [{ at: s.takenAt, value: s.firstSeriesResonanceHz }])),
    count: baseline.sweepCount,
    explicitBaseline: baseline.firstSeriesResonanceHz,
    tolerance: thresholds.frequencyShift,
    formatValue: formatFrequency,
    detail,
  });
  const heatSinkRisePerWatt = assessHeatRise(sessions, baseline, common);
  const failureFindings = (input.openFailures ?? []).map((failure, i) => describeOpenFailure(failure, i));

  const findings = [
    ...margins.voltage.findings,
    ...margins.current.findings,
    ...margins.thermal.findings,
    ...supplyCurrent.findings,
    ...runningFrequency.findings,
    ...firstSeriesResonance.findings,
    ...heatSinkRisePerWatt.findings,
  ];
  const severityOrder: Record<FindingSeverity, number> = { hold: 0, watch: 1, info: 2 };
  // Most severe first; within a severity, margins by how soon they reach their limit (already there, then the
  // nearest projected crossing), then the other findings in their usual order, so the first reason (the one a
  // dashboard row shows) is the most urgent. Two projections cannot swap with the clock alone: both count down together.
  const urgency = (f: HealthFinding) => f.daysAway ?? Number.POSITIVE_INFINITY;
  findings.sort((a, b) => severityOrder[a.severity] - severityOrder[b.severity] || Math.sign(urgency(a) - urgency(b)) || 0);
  // An open failure leads: until its post-mortem, it says more about the coil than any margin.
  findings.unshift(...failureFindings);
  // Counted, not read off `trend`: the verdict leaves a margin's trend unfitted when it is not significant.
  const anyTrend = Object.values(margins).some((m) => m.observations >= MIN_OBSERVATIONS_FOR_TREND);
  const status: HealthStatus = findings.some((f) => f.severity === "hold")
    ? "hold"
    : findings.some((f) => f.severity === "watch")
      ? "watch"
      : anyTrend
        ? "fine"
        : "not enough data";
  if (status === "fine") {
    findings.unshift({
      severity: "info",
      subject: "summary",
      text: `Every margin with a trend is above its limit and not heading for it within ${thresholds.watchWithinDays} days (${sessions.length} sessions).`,
    });
  }
  return {
    status,
    reasons: findings.map((f) => f.text),
    findings,
    margins,
    supplyCurrent,
    runningFrequency,
    firstSeriesResonance,
    heatSinkRisePerWatt,
    sessionCount: sessions.length,
    sessionsPerDay,
    confidence,
  };
}

function datedSeries(
  sessions: readonly CoilSession[],
  pick: (s: CoilSession) => number | null | undefined,
): DatedValue[] {
  const series: DatedValue[] = [];
  for (const s of sessions) {
    const value = pick(s);
    if (value != null) series.push({ at: s.startedAt, value });
  }
  return series;
}


/**
 * An open failure holds the coil: until a post-mortem has found the cause and the repair is recorded, no margin
 * or trend describes the coil as it now is (the team's rule; common practice for equipment awaiting investigation).
 */
function describeOpenFailure(failure: OpenFailure, index: number): HealthFinding {
  const at = requireDate(`openFailures[${index}].occurredAt`, failure.occurredAt);
  const mode = failure.mode === "unknown" ? "mode not yet known" : failure.mode.replaceAll("_", " ");
  return {
    severity: "hold",
    subject: "open failure",
    text: `A failure (${mode}) recorded on ${at.toISOString().slice(0, 10)} is still open: the coil is on hold until its post-mortem is complete.`,
  };
}
