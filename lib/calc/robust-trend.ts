/**
 * Robust straight-line trends for logbook series (margins, currents, frequencies over time): the Theil–Sen
 * slope, Sen's distribution-free confidence interval, and the Mann–Kendall test, plus where such a line meets
 * a limit. One bad reading moves a least-squares line a long way; it moves a median of slopes hardly at all.
 *
 * Size: up to about n = 2 100 points every pairwise slope is stored (≈ 18 MB at the top end); above that the
 * slopes are found by sample-select in O(n²) time and a few MB (pairwise-slopes.ts). Kendall's S is an O(n²)
 * count either way, so n = 5 000 takes a fraction of a second; logbook series are far shorter.
 */
import quantile from "@stdlib/stats-base-dists-normal-quantile";
import { CalcInputError, requireFinite } from "./errors";
import { computeMannKendall, measureSortedTies, type TieSums } from "./mann-kendall";
import { selectPairwiseSlopes } from "./pairwise-slopes";

export interface TrendPoint {
  x: number;
  y: number;
}

export interface TheilSenTrend {
  /** Median of the pairwise slopes, y-units per x-unit. */
  slope: number;
  /** Median of yᵢ − slope·xᵢ, so the line is y = intercept + slope·x. */
  intercept: number;
  /** Median of x: where the fitted line is best determined, and the pivot for the slope bounds' lines. */
  xMedian: number;
  /** Sen's confidence bounds on the slope; ±Infinity when the data are too few to bound that side. */
  slopeLow: number;
  slopeHigh: number;
  /** The two-sided confidence level the bounds were built for. */
  confidence: number;
  n: number;
  /** Number of pairs with distinct x, i.e. of slopes the median is taken over. */
  pairCount: number;
  /** Kendall's S between x and y, its tie-corrected variance, and the Mann–Kendall z and two-sided p-value. */
  kendallS: number;
  varianceS: number;
  z: number;
  pValue: number;
  /** Kendall's τ-b (0 when every y is equal). */
  kendallTau: number;
}

/** The points as theilSenTrend reads them, after its input checks. */
interface TrendInput {
  xs: Float64Array;
  ys: Float64Array;
  /** xs in ascending order (xs itself when it already is; neither is changed), and its groups of tied values (Kendall's variance needs them). */
  sortedXs: Float64Array;
  xTies: TieSums;
  /** Pairs with distinct x: all pairs but those inside a group of tied x (pairwise-slopes.ts countDistinctXPairs); at least one. */
  pairCount: number;
  confidence: number;
}

/**
 * theilSenTrend's input checks, in its order: the confidence, at least 3 points, each x then y finite, two different
 * x. Every trend function here starts with it, so they throw the same error for the same points.
 */
function readTrendInput(points: readonly TrendPoint[], confidence: number): TrendInput {
  if (!Number.isFinite(confidence) || confidence <= 0 || confidence >= 1) {
    throw new CalcInputError("confidence", "a fraction strictly between 0 and 1, e.g. 0.95", confidence);
  }
  if (points.length < 3) throw new CalcInputError("points", "at least 3 points", points.length);
  const n = points.length;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const { x, y } = points[i]!;
    // The field's name is spelled out only for a value that fails: two strings per point were a tenth of a cold
    // dashboard's judgement.
    xs[i] = Number.isFinite(x) ? x : requireFinite(`points[${i}].x`, x);
    ys[i] = Number.isFinite(y) ? y : requireFinite(`points[${i}].y`, y);
  }
  // A logbook's series come in time order: x already ascending needs no sorted copy (−0 would sort before 0, so a
  // series holding one is sorted all the same).
  let ascending = true;
  for (let i = 0; i < n && ascending; i++) ascending = (i === 0 || xs[i - 1]! <= xs[i]!) && !Object.is(xs[i], -0);
  const sortedXs = ascending ? xs : Float64Array.from(xs).sort();
  const xTies = measureSortedTies(sortedXs);
  const pairCount = (n * (n - 1)) / 2 - xTies.pairs;
  if (pairCount === 0) throw new CalcInputError("points", "at least two different x values", "all x equal");
  return { xs, ys, sortedXs, xTies, pairCount, confidence };
}

/**
 * Theil–Sen slope (Theil, Proc. KNAW 53, 1950; Sen, JASA 63, 1968) with Sen's 1968 interval from the normal
 * approximation to Kendall's S; intercept as the median of y − slope·x (Conover, Practical Nonparametric
 * Statistics, 1980).
 */
export function theilSenTrend(
  points: readonly TrendPoint[],
  { confidence = 0.95 }: { confidence?: number } = {},
): TheilSenTrend {
  return fitTrend(readTrendInput(points, confidence));
}

function fitTrend({ xs, ys, sortedXs, xTies, pairCount, confidence }: TrendInput): TheilSenTrend {
  const n = xs.length;
  const mk = computeMannKendall(xs, ys, xTies);
  // Sen (1968): C = z₁₋α/₂·√Var(S); the bounds are the M₁-th and (M₂+1)-th ordered slopes with
  // M₁ = (N − C)/2 and M₂ = (N + C)/2, rounded to the nearest rank (Gilbert, Statistical Methods for
  // Environmental Pollution Monitoring, 1987, ch. 16, from memory).
  const c = quantile(1 - (1 - confidence) / 2, 0, 1) * Math.sqrt(mk.varianceS);
  const lowRank = Math.round((pairCount - c) / 2);
  const highRank = Math.round((pairCount + c) / 2) + 1;
  const middle = pairCount % 2 === 1 ? [(pairCount + 1) / 2] : [pairCount / 2, pairCount / 2 + 1];
  const wanted = [...middle];
  if (lowRank >= 1) wanted.push(lowRank);
  if (highRank <= pairCount) wanted.push(highRank);
  const picked = selectPairwiseSlopes(xs, ys, wanted, { pairCount });
  const slope = middle.length === 1 ? picked[0]! : (picked[0]! + picked[1]!) / 2;
  if (!Number.isFinite(slope)) {
    throw new CalcInputError("points", "x and y differences within floating-point range", slope);
  }
  const slopeLow = lowRank >= 1 ? picked[middle.length]! : Number.NEGATIVE_INFINITY;
  const slopeHigh = highRank <= pairCount ? picked[picked.length - 1]! : Number.POSITIVE_INFINITY;

  const residuals = new Float64Array(n);
  for (let i = 0; i < n; i++) residuals[i] = ys[i]! - slope * xs[i]!;
  return {
    slope,
    intercept: medianInPlace(residuals),
    xMedian: medianOfSorted(sortedXs),
    slopeLow,
    slopeHigh,
    confidence,
    n,
    pairCount,
    kendallS: mk.s,
    varianceS: mk.varianceS,
    z: mk.z,
    pValue: mk.pValue,
    kendallTau: mk.kendallTau,
  };
}

/** theilSenTrend's Mann–Kendall test alone. */
export type TrendTest = Pick<TheilSenTrend, "n" | "pairCount" | "kendallS" | "varianceS" | "z" | "pValue" | "kendallTau" | "confidence">;

/**
 * Throws exactly where theilSenTrend throws on the same points, without working out a slope where it can help it: for a
 * caller that needs the fit only in some cases (a trend that is significant, a level already past its tolerance) and
 * must still refuse the points the fit would refuse. Returns the fit when it had to make it.
 *
 * Beyond readTrendInput's checks the fit throws only when its median slope is not finite. Every pairwise slope is
 * |Δy|/|Δx| ≤ (max y − min y)/(smallest gap between distinct x), and rounding keeps that order, so when twice that
 * bound is finite no slope, nor the mean of the middle two, can overflow; only when it is not is the fit made to tell.
 */
export function checkTrendInput(points: readonly TrendPoint[], { confidence = 0.95 }: { confidence?: number } = {}): TheilSenTrend | null {
  const input = readTrendInput(points, confidence);
  return slopesBoundedFinite(input) ? null : fitTrend(input);
}

/**
 * theilSenTrend's Mann–Kendall test (the same S, variance and p-value) after the same input checks, without the
 * slopes: the O(n²) slopes and their selection are most of a fit's cost, and a trend that is not significant raises no
 * finding. Throws exactly where theilSenTrend throws (checkTrendInput).
 */
export function testTrend(points: readonly TrendPoint[], { confidence = 0.95 }: { confidence?: number } = {}): TrendTest {
  const input = readTrendInput(points, confidence);
  if (!slopesBoundedFinite(input)) {
    const { n, pairCount, kendallS, varianceS, z, pValue, kendallTau } = fitTrend(input);
    return { n, pairCount, kendallS, varianceS, z, pValue, kendallTau, confidence };
  }
  const mk = computeMannKendall(input.xs, input.ys, input.xTies);
  return { n: input.xs.length, pairCount: input.pairCount, kendallS: mk.s, varianceS: mk.varianceS, z: mk.z, pValue: mk.pValue, kendallTau: mk.kendallTau, confidence };
}

/** True when 2·(max y − min y)/(smallest gap between distinct x) is finite (checkTrendInput says why that suffices). */
function slopesBoundedFinite({ sortedXs, ys }: TrendInput): boolean {
  let yMin = Number.POSITIVE_INFINITY;
  let yMax = Number.NEGATIVE_INFINITY;
  for (const y of ys) {
    if (y < yMin) yMin = y;
    if (y > yMax) yMax = y;
  }
  let smallestGap = Number.POSITIVE_INFINITY;
  for (let i = 1; i < sortedXs.length; i++) {
    const gap = sortedXs[i]! - sortedXs[i - 1]!;
    if (gap > 0 && gap < smallestGap) smallestGap = gap;
  }
  return Number.isFinite((2 * (yMax - yMin)) / smallestGap);
}

export interface ThresholdCrossing {
  /** Where the fitted line reaches the threshold, ≥ fromX. */
  x: number;
  /**
   * The same with the slope at each confidence bound, the bound lines pivoting on the fit at xMedian (where
   * the line is best determined), so the range widens the further the projection runs beyond the data.
   * xEarliest is fromX when a bound line is already at the threshold; xLatest is Infinity when a bound line
   * is flat or heads away: at that plausible rate the threshold is never reached.
   */
  xEarliest: number;
  xLatest: number;
}

/**
 * Where y = intercept + slope·x reaches `threshold`, looking forward from fromX (straight-line algebra).
 * Returns null when the line is flat, or when it reached the threshold before fromX and is moving away from it.
 */
export function projectCrossing(
  trend: Pick<TheilSenTrend, "slope" | "intercept" | "slopeLow" | "slopeHigh" | "xMedian">,
  threshold: number,
  { fromX }: { fromX: number },
): ThresholdCrossing | null {
  requireFinite("threshold", threshold);
  requireFinite("fromX", fromX);
  const { slope, intercept, xMedian } = trend;
  if (slope === 0) return intercept === threshold ? { x: fromX, xEarliest: fromX, xLatest: fromX } : null;
  const x = (threshold - intercept) / slope;
  if (x < fromX) return null;
  const direction = Math.sign(slope);
  const pivotY = intercept + slope * xMedian;
  const reachAt = (bound: number): number => {
    if (!Number.isFinite(bound)) return bound * direction > 0 ? fromX : Number.POSITIVE_INFINITY;
    if ((pivotY + bound * (fromX - xMedian) - threshold) * direction >= 0) return fromX; // already there
    if (bound * direction <= 0) return Number.POSITIVE_INFINITY;
    return xMedian + (threshold - pivotY) / bound;
  };
  const a = reachAt(trend.slopeLow);
  const b = reachAt(trend.slopeHigh);
  return { x, xEarliest: Math.min(a, b, x), xLatest: Math.max(a, b, x) };
}

/** Median of a non-empty list (the middle value, or the mean of the middle two). */
export function computeMedian(values: readonly number[]): number {
  if (values.length === 0) throw new CalcInputError("values", "at least one value", 0);
  return medianInPlace(Float64Array.from(values));
}

/** computeMedian of an array of our own, sorted in place (no copy). */
function medianInPlace(values: Float64Array): number {
  return medianOfSorted(values.sort());
}

function medianOfSorted(sorted: Float64Array): number {
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}
