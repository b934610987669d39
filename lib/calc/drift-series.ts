/**
 * Turning one coil's logbook into drift series: a dated value per session or sweep, fitted against time in
 * days, compared with a baseline, and restricted to comparable conditions where the value depends on them.
 *
 * Time, not session index, is the x-axis: stewards plan in dates and months, sessions come in bursts with long
 * gaps (term breaks), and Theil–Sen copes with uneven spacing, whereas an index would squeeze a summer's idle
 * ageing into one step. Session counts are derived from the coil's average session rate where wanted.
 */
import { CalcInputError } from "./errors";
import { checkTrendInput, computeMedian, testTrend, theilSenTrend, type TheilSenTrend, type TrendPoint } from "./robust-trend";

export const MS_PER_DAY = 86_400_000;
/** "A month" in every rate this library reports. */
export const DAYS_PER_MONTH = 30;

export interface DatedValue {
  at: Date;
  value: number;
}

export interface DriftTrend {
  /** The fit of value against days since `origin`. */
  fit: TheilSenTrend;
  /** Date of x = 0: the series' first observation. */
  origin: Date;
  /** Slope and its confidence bounds in value-units per 30 days. */
  perMonth: number;
  perMonthLow: number;
  perMonthHigh: number;
  /** Mann–Kendall p-value below 1 − confidence. */
  significant: boolean;
}

/** Days from `from` to `to`, fractional, UTC instants (time zones cannot enter). */
export function daysBetween(from: Date, to: Date): number {
  return (to.getTime() - from.getTime()) / MS_PER_DAY;
}

/** The instant `days` after `origin`. */
export function addDays(origin: Date, days: number): Date {
  return new Date(origin.getTime() + days * MS_PER_DAY);
}

/** A series as its trend reads it: days since its first observation against the value. */
function trendPointsOf(series: readonly DatedValue[]): { origin: Date; points: TrendPoint[] } {
  const origin = series[0]?.at;
  if (origin === undefined) throw new CalcInputError("series", "at least one observation", 0);
  return { origin, points: series.map((p) => ({ x: daysBetween(origin, p.at), y: p.value })) };
}

/** Theil–Sen trend of a chronological series against days since its first point. */
export function fitDriftTrend(series: readonly DatedValue[], confidence: number): DriftTrend {
  const { origin, points } = trendPointsOf(series);
  return driftTrendOf(theilSenTrend(points, { confidence }), origin);
}

function driftTrendOf(fit: TheilSenTrend, origin: Date): DriftTrend {
  return {
    fit,
    origin,
    perMonth: fit.slope * DAYS_PER_MONTH,
    perMonthLow: fit.slopeLow * DAYS_PER_MONTH,
    perMonthHigh: fit.slopeHigh * DAYS_PER_MONTH,
    significant: fit.pValue < 1 - fit.confidence,
  };
}

/** Whether fitDriftTrend would call the series' trend significant, without fitting it; throws where it throws (robust-trend.ts testTrend). */
export function isDriftTrendSignificant(series: readonly DatedValue[], confidence: number): boolean {
  return testTrend(trendPointsOf(series).points, { confidence }).pValue < 1 - confidence;
}

/** Throws where fitDriftTrend throws on the series, fitting it only when that is the way to tell (robust-trend.ts checkTrendInput). */
export function checkDriftTrendInput(series: readonly DatedValue[], confidence: number): void {
  checkTrendInput(trendPointsOf(series).points, { confidence });
}

/**
 * The most common operating condition: the band of ±bandFraction around some observed value that holds the most
 * observations (ties go to the later value), its members' indices, and their median as the reference. Used to
 * compare sessions run at like supply voltage or like run length, so a change of set-up is not read as drift.
 */
export function findModalBand(
  values: readonly number[],
  bandFraction: number,
): { reference: number; members: number[] } | null {
  // A centre's band holds the values v with |v − centre| ≤ bandFraction·centre as floating point computes them. The
  // rounded difference v − centre never decreases as v grows, so those values sit side by side once sorted, and two
  // binary searches count them: O(n log n) where comparing every pair was O(n²), with the same counts (it runs twice
  // per coil on every dashboard judgement). drift-series.test.ts holds it to the pairwise count.
  const n = values.length;
  const sorted = Float64Array.from(values).sort();
  let bestCentre = -1;
  let bestCount = 0;
  for (let c = 0; c < n; c++) {
    const centre = values[c]!;
    const halfWidth = bandFraction * centre;
    // first sorted index with v − centre ≥ −halfWidth, and first with v − centre > halfWidth
    let from = 0;
    for (let hi = n; from < hi; ) {
      const mid = (from + hi) >>> 1;
      if (sorted[mid]! - centre >= -halfWidth) hi = mid;
      else from = mid + 1;
    }
    let to = 0;
    for (let hi = n; to < hi; ) {
      const mid = (to + hi) >>> 1;
      if (sorted[mid]! - centre > halfWidth) hi = mid;
      else to = mid + 1;
    }
    const count = Math.max(0, to - from);
    if (count >= bestCount) {
      bestCount = count;
      bestCentre = c;
    }
  }
  if (bestCount === 0) return null;
  const centre = values[bestCentre]!;
  const best: number[] = [];
  for (let i = 0; i < n; i++) if (Math.abs(values[i]! - centre) <= bandFraction * centre) best.push(i);
  return { reference: computeMedian(best.map((i) => values[i]!)), members: best };
}

export interface LevelShift {
  baseline: number;
  baselineSource: "explicit" | "first observations";
  /** Observations the baseline median was taken over (0 for an explicit baseline). */
  baselineCount: number;
  /** Median of the most recent `recentCount` observations. */
  recent: number;
  recentCount: number;
  /** recent/baseline − 1. */
  shiftFraction: number;
}

/**
 * Recent level against the baseline, both as medians of `count` observations so a single odd session moves
 * neither. Without an explicit baseline it needs 2·count observations, so the two groups never overlap;
 * returns null when there are fewer.
 */
export function measureLevelShift(
  values: readonly number[],
  { count, explicitBaseline }: { count: number; explicitBaseline?: number },
): LevelShift | null {
  const explicit = explicitBaseline !== undefined;
  if (values.length === 0 || (!explicit && values.length < 2 * count)) return null;
  const baseline = explicit ? explicitBaseline : computeMedian(values.slice(0, count));
  const recentValues = values.slice(-count);
  const recent = computeMedian(recentValues);
  return {
    baseline,
    baselineSource: explicit ? "explicit" : "first observations",
    baselineCount: explicit ? 0 : count,
    recent,
    recentCount: recentValues.length,
    shiftFraction: recent / baseline - 1,
  };
}
