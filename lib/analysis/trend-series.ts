/**
 * Chart-ready series for one coil's trends: each margin with its threshold, its fitted trend and the
 * projected crossing (from lib/calc's health assessment), supply current at comparable supply voltage,
 * running frequency and first series resonance against their baselines. x values are epoch milliseconds.
 */
import type { CoilHealth } from "../calc/coil-health";
import type { MarginHealth } from "../calc/margin-drift";
import type { LevelHealth } from "../calc/level-drift";
import { addDays, daysBetween, findModalBand } from "../calc/drift-series";
import { DEFAULT_HEALTH_THRESHOLDS } from "../calc/health-thresholds";
import type { AnalyzedSession } from "./coil-health-input";
import type { SweepRecord } from "./records";

export interface TrendPoint {
  x: number;
  y: number;
}

export interface TrendChart {
  readings: TrendPoint[];
  threshold: TrendPoint[];
  trend: TrendPoint[];
  crossing: TrendPoint[];
}

/** A margin's readings, threshold line, fitted trend (to the projected crossing when falling) and crossing marker. */
export function buildMarginChart(margin: MarginHealth, analyzed: readonly AnalyzedSession[], now: Date): TrendChart {
  const readings = analyzed.flatMap(({ session, analysis }) => {
    const h = analysis.margins[margin.margin].headroom;
    return h === null ? [] : [{ x: session.startedAt.getTime(), y: h }];
  });
  if (readings.length === 0) return { readings, threshold: [], trend: [], crossing: [] };
  const firstX = readings[0]!.x;
  const crossingAt = margin.crossing?.at ?? null;
  const endX = Math.max(readings.at(-1)!.x, now.getTime(), crossingAt?.getTime() ?? 0);
  const threshold = [
    { x: firstX, y: margin.threshold },
    { x: endX, y: margin.threshold },
  ];
  let trend: TrendPoint[] = [];
  if (margin.trend) {
    const { origin, fit } = margin.trend;
    const at = (d: Date) => ({ x: d.getTime(), y: fit.intercept + fit.slope * daysBetween(origin, d) });
    trend = [at(origin), at(crossingAt && !margin.crossing?.alreadyReached ? crossingAt : addDays(origin, daysBetween(origin, new Date(endX))))];
  }
  const crossing = crossingAt ? [{ x: crossingAt.getTime(), y: margin.threshold }] : [];
  return { readings, threshold, trend, crossing };
}

/** Supply current scaled to the most common supply voltage, over the sessions run near it (as coil-health compares them). */
export function buildComparableCurrent(analyzed: readonly AnalyzedSession[]): { referenceVoltageV: number | null; points: TrendPoint[] } {
  const sessions = analyzed.map((a) => a.session);
  const band = findModalBand(
    sessions.map((s) => s.supplyVoltageV),
    DEFAULT_HEALTH_THRESHOLDS.voltageBand,
  );
  if (!band) return { referenceVoltageV: null, points: [] };
  return {
    referenceVoltageV: band.reference,
    points: band.members.map((i) => {
      const s = sessions[i]!;
      return { x: s.startedAt.getTime(), y: (s.supplyCurrentA * band.reference) / s.supplyVoltageV };
    }),
  };
}

/** A horizontal baseline across the readings, when the level has one. */
export function buildBaseline(level: LevelHealth, points: readonly TrendPoint[]): TrendPoint[] {
  if (!level.shift || points.length === 0) return [];
  return [
    { x: points[0]!.x, y: level.shift.baseline },
    { x: points.at(-1)!.x, y: level.shift.baseline },
  ];
}

/** Frequencies with the top load fitted last only (a top-load change moves them by design), as assessCoil compares them. */
export function buildFrequencySeries(analyzed: readonly AnalyzedSession[], allSweeps: readonly SweepRecord[], health: CoilHealth) {
  const sessionTopLoad = analyzed.at(-1)?.session.topLoadId ?? null;
  const sweepTopLoad = allSweeps.at(-1)?.topLoadId ?? null;
  const sweeps = allSweeps.filter((s) => (s.topLoadId ?? null) === sweepTopLoad);
  const running = analyzed.filter((a) => (a.session.topLoadId ?? null) === sessionTopLoad).flatMap(({ session }) => (session.runningFrequencyHz == null ? [] : [{ x: session.startedAt.getTime(), y: session.runningFrequencyHz }]));
  const resonance = sweeps.flatMap((s) => (s.firstSeriesResonanceHz == null ? [] : [{ x: s.takenAt.getTime(), y: s.firstSeriesResonanceHz }]));
  return {
    running,
    runningBaseline: buildBaseline(health.runningFrequency, running),
    resonance,
    resonanceBaseline: buildBaseline(health.firstSeriesResonance, resonance),
  };
}
