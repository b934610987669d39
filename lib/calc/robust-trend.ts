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
import { computeMannKendall } from "./mann-kendall";
import { countDistinctXPairs, selectPairwiseSlopes } from "./pairwise-slopes";

export interface TrendPoint {
  x: number;
  y: number;
}

export interface TheilSenTrend {
  /** Median of the pairwise slopes, y-units per x-unit. */
  slope: number;
  /** Median of yᵢ − slope·xᵢ, so the line is y = intercept + slope·x. */
  intercept: number;
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

/**
 * Theil–Sen slope (Theil, Proc. KNAW 53, 1950; Sen, JASA 63, 1968) with Sen's 1968 interval from the normal
 * approximation to Kendall's S; intercept as the median of y − slope·x (Conover, Practical Nonparametric
 * Statistics, 1980).
 */
export function theilSenTrend(
  points: readonly TrendPoint[],
  { confidence = 0.95 }: { confidence?: number } = {},
): TheilSenTrend {
  if (!Number.isFinite(confidence) || confidence <= 0 || confidence >= 1) {
    throw new CalcInputError("confidence", "a fraction strictly between 0 and 1, e.g. 0.95", confidence);
  }
  if (points.length < 3) throw new CalcInputError("points", "at least 3 points", points.length);
  const n = points.length;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  points.forEach((p, i) => {
    xs[i] = requireFinite(`points[${i}].x`, p.x);
    ys[i] = requireFinite(`points[${i}].y`, p.y);
  });
  const pairCount = countDistinctXPairs(xs);
  if (pairCount === 0) throw new CalcInputError("points", "at least two different x values", "all x equal");

  const mk = computeMannKendall(xs, ys);
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
  const picked = selectPairwiseSlopes(xs, ys, wanted);
  const slope = middle.length === 1 ? picked[0]! : (picked[0]! + picked[1]!) / 2;
  if (!Number.isFinite(slope)) {
    throw new CalcInputError("points", "x and y differences within floating-point range", slope);
  }
  const slopeLow = lowRank >= 1 ? picked[middle.length]! : Number.NEGATIVE_INFINITY;
  const slopeHigh = highRank <= pairCount ? picked[picked.length - 1]! : Number.POSITIVE_INFINITY;

  const residuals = points.map((p) => p.y - slope * p.x);
  return {
    slope,
    intercept: medianOf(residuals),
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

export interface ThresholdCrossing {
  /** Where the fitted line reaches the threshold, ≥ fromX. */
  x: number;
  /**
   * The same projection with the slope at each confidence bound, pivoting on the fitted value at fromX (so the
   * range reflects the uncertainty of the rate, not of today's level). xLatest is Infinity when the slower
   * bound is flat or heads away: at that plausible rate the threshold is never reached.
   */
  xEarliest: number;
  xLatest: number;
}

/**
 * Where y = intercept + slope·x reaches `threshold`, looking forward from fromX (straight-line algebra).
 * Returns null when the line is flat, or when it reached the threshold before fromX and is moving away from it.
 */
export function projectCrossing(
  trend: Pick<TheilSenTrend, "slope" | "intercept" | "slopeLow" | "slopeHigh">,
  threshold: number,
  { fromX }: { fromX: number },
): ThresholdCrossing | null {
  requireFinite("threshold", threshold);
  requireFinite("fromX", fromX);
  const gap = threshold - (trend.intercept + trend.slope * fromX);
  if (trend.slope === 0) return gap === 0 ? { x: fromX, xEarliest: fromX, xLatest: fromX } : null;
  const dx = gap / trend.slope;
  if (dx < 0) return null;
  const reachAt = (slope: number): number => {
    if (gap === 0) return 0;
    if (slope === 0 || Math.sign(slope) !== Math.sign(gap)) return Number.POSITIVE_INFINITY;
    return gap / slope; // 0 for an infinite bound: at that rate it is reached at once
  };
  const a = reachAt(trend.slopeLow);
  const b = reachAt(trend.slopeHigh);
  return { x: fromX + dx, xEarliest: fromX + Math.min(a, b, dx), xLatest: fromX + Math.max(a, b, dx) };
}

function medianOf(values: readonly number[]): number {
  const sorted = Float64Array.from(values).sort();
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}
