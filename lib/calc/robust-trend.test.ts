import quantile from "@stdlib/stats-base-dists-normal-quantile";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { checkTrendInput, projectCrossing, testTrend, theilSenTrend, type TrendPoint } from "./robust-trend";
import { createSeededRandom } from "./seeded-random";

/** Ordinary least-squares slope, for the contrast with Theil–Sen (textbook normal equations). */
function leastSquaresSlope(points: TrendPoint[]): number {
  const mx = points.reduce((s, p) => s + p.x, 0) / points.length;
  const my = points.reduce((s, p) => s + p.y, 0) / points.length;
  const sxy = points.reduce((s, p) => s + (p.x - mx) * (p.y - my), 0);
  const sxx = points.reduce((s, p) => s + (p.x - mx) ** 2, 0);
  return sxy / sxx;
}

/** All distinct-x pairwise slopes, sorted: the brute-force definition (Sen 1968). */
function sortedSlopes(points: TrendPoint[]): number[] {
  const slopes: number[] = [];
  points.forEach((a, i) =>
    points.slice(i + 1).forEach((b) => {
      if (b.x !== a.x) slopes.push((b.y - a.y) / (b.x - a.x));
    }),
  );
  return slopes.sort((p, q) => p - q);
}

function noisyLine(seed: number, n: number, slope: number, intercept: number, sigma: number): TrendPoint[] {
  const random = createSeededRandom(seed);
  return Array.from({ length: n }, (_, i) => ({ x: i, y: intercept + slope * i + sigma * random.normal() }));
}

describe("theilSenTrend", () => {
  it("recovers a noiseless line exactly, with a zero-width interval", () => {
    // derived: every pairwise slope of an exact line is the line's slope
    const points = [0, 1, 2, 3, 5, 8, 13].map((x) => ({ x, y: 3 - 0.25 * x }));
    const trend = theilSenTrend(points);
    expect(trend.slope).toBe(-0.25);
    expect(trend.intercept).toBe(3);
    expect([trend.slopeLow, trend.slopeHigh]).toEqual([-0.25, -0.25]);
    expect(trend.kendallTau).toBe(-1);
    expect(trend.pValue).toBeLessThan(0.01);
  });

  it("matches a brute-force median of all slopes and Sen's interval ranks worked by hand (n = 10)", () => {
    // Hand working (Sen 1968 with Var(S) = n(n−1)(2n+5)/18, no ties): N = 45, Var(S) = 125,
    // C = 1.959964·√125 = 21.913, M₁ = (45 − 21.913)/2 = 11.54 → rank 12, M₂ + 1 = 34.46 → rank 34.
    // 1.959964 is z₀.₉₇₅ from the standard normal table (from memory).
    expect(quantile(0.975, 0, 1)).toBeCloseTo(1.959964, 6);
    const points = noisyLine(3, 10, 0.8, 2, 1.5);
    const slopes = sortedSlopes(points);
    expect(slopes).toHaveLength(45);
    const trend = theilSenTrend(points);
    expect(trend.slope).toBe(slopes[22]);
    expect(trend.slopeLow).toBe(slopes[11]);
    expect(trend.slopeHigh).toBe(slopes[33]);
    const residuals = points.map((p) => p.y - trend.slope * p.x).sort((a, b) => a - b);
    expect(trend.intercept).toBeCloseTo((residuals[4]! + residuals[5]!) / 2, 12);
  });

  it("averages the two middle slopes when their count is even, and skips pairs with equal x", () => {
    const points = [
      { x: 0, y: 0 },
      { x: 0, y: 4 },
      { x: 1, y: 1 },
      { x: 3, y: 0 },
    ];
    const slopes = sortedSlopes(points); // 5 pairs with distinct x
    expect(slopes).toHaveLength(5);
    expect(theilSenTrend(points).slope).toBe(slopes[2]);
    const even = [...points, { x: 4, y: 9 }];
    const evenSlopes = sortedSlopes(even);
    expect(evenSlopes).toHaveLength(9);
    expect(theilSenTrend(even).slope).toBe(evenSlopes[4]);
    const six = [...even, { x: 5, y: -2 }];
    const sixSlopes = sortedSlopes(six);
    expect(sixSlopes).toHaveLength(14);
    expect(theilSenTrend(six).slope).toBe((sixSlopes[6]! + sixSlopes[7]!) / 2);
  });

  it("hardly moves for one gross outlier, while least squares swings", () => {
    // Breakdown argument (Sen 1968): one point changes at most n − 1 of the N slopes, so the median stays
    // between the clean slopes of ranks N/2 − (n − 1) and N/2 + (n − 1). Least squares has no such bound.
    fc.assert(
      fc.property(
        fc.integer({ min: 12, max: 40 }),
        fc.double({ min: -2, max: 2, noNaN: true }),
        fc.integer({ min: 0, max: 1_000_000 }),
        fc.nat(),
        fc.constantFrom(-1, 1),
        (n, slope, seed, at, sign) => {
          const clean = noisyLine(seed, n, slope, 10, 0.05);
          const dirty = clean.map((p, i) => (i === at % n ? { x: p.x, y: p.y + sign * 1000 } : p));
          const slopes = sortedSlopes(clean);
          const mid = Math.floor(slopes.length / 2);
          const lo = slopes[Math.max(0, mid - n)]!;
          const hi = slopes[Math.min(slopes.length - 1, mid + n)]!;
          const robust = theilSenTrend(dirty).slope;
          expect(robust).toBeGreaterThanOrEqual(lo);
          expect(robust).toBeLessThanOrEqual(hi);
        },
      ),
      { numRuns: 200 },
    );
  });

  it("shows the contrast on one example: the outlier moves least squares far more than Theil–Sen", () => {
    const clean = noisyLine(8, 20, -0.5, 30, 0.3);
    const dirty = clean.map((p, i) => (i === 17 ? { x: p.x, y: p.y + 60 } : p));
    const robustShift = Math.abs(theilSenTrend(dirty).slope - theilSenTrend(clean).slope);
    const olsShift = Math.abs(leastSquaresSlope(dirty) - leastSquaresSlope(clean));
    // derived: OLS moves by 60·(x₁₇ − x̄)/Σ(x − x̄)² = 60·7.5/665 ≈ 0.68, more than the slope itself
    expect(olsShift).toBeCloseTo((60 * 7.5) / 665, 9);
    expect(robustShift).toBeLessThan(0.05);
    expect(olsShift).toBeGreaterThan(10 * robustShift);
  });

  it("covers the true slope in about the stated share of simulated series", () => {
    // 200 seeded series, n = 25, Gaussian noise. If coverage is truly 95 %, the count covered is
    // Binomial(200, 0.95) with sd = √(200·0.95·0.05) ≈ 3.1: below 180 (−3.2 sd) would mean the interval
    // is too narrow; 199 or 200 (P ≈ 4e-4 together if it were right) would mean it is too wide.
    const trueSlope = 0.12;
    let covered = 0;
    for (let seed = 1; seed <= 200; seed++) {
      const trend = theilSenTrend(noisyLine(seed, 25, trueSlope, 1, 0.4));
      if (trend.slopeLow <= trueSlope && trueSlope <= trend.slopeHigh) covered++;
    }
    expect(covered).toBeGreaterThanOrEqual(180);
    expect(covered).toBeLessThanOrEqual(198);
  });

  it("leaves the interval open when the points are too few to bound it", () => {
    // derived: n = 3 gives N = 3 and C = 1.96·√(3·2·11/18) = 3.75 > N, so neither bound has a rank
    const trend = theilSenTrend([
      { x: 0, y: 1 },
      { x: 1, y: 2 },
      { x: 2, y: 2.5 },
    ]);
    expect(trend.slopeLow).toBe(Number.NEGATIVE_INFINITY);
    expect(trend.slopeHigh).toBe(Number.POSITIVE_INFINITY);
    expect(trend.slope).toBe(0.75);
  });

  it("handles a few thousand points", () => {
    const trend = theilSenTrend(noisyLine(5, 3_000, 0.002, 4, 0.5));
    // the slope's sampling sd is about 0.5·√12/3000^1.5 ≈ 1e-5 (least squares; Theil–Sen's efficiency under
    // normal noise is 3/π of it, so ~2 % wider — Sen 1968, from memory); 5e-5 is about 5 sd
    expect(trend.slope).toBeCloseTo(0.002, 4);
    expect(trend.slopeLow).toBeLessThan(trend.slope);
    expect(trend.slopeHigh).toBeGreaterThan(trend.slope);
  });

  it("refuses fewer than 3 points, all-equal x, non-finite values and a bad confidence", () => {
    expect(() => theilSenTrend([{ x: 0, y: 0 }, { x: 1, y: 1 }])).toThrowError(CalcInputError);
    expect(() => theilSenTrend([0, 1, 2].map((y) => ({ x: 5, y })))).toThrow(/different x/);
    expect(() => theilSenTrend([{ x: 0, y: 0 }, { x: 1, y: Number.NaN }, { x: 2, y: 1 }])).toThrow(/points\[1\]\.y/);
    const ok = [0, 1, 2].map((x) => ({ x, y: x }));
    expect(() => theilSenTrend(ok, { confidence: 1 })).toThrow(/confidence/);
  });
});

/** What a call returned or threw (the error's class and message), so two calls can be compared whole. */
function outcome<T>(call: () => T): { value: T } | { error: string } {
  try {
    return { value: call() };
  } catch (error) {
    if (!(error instanceof CalcInputError)) throw error;
    return { error: `${error.name}: ${error.message}` };
  }
}

/**
 * Points that reach every refusal of theilSenTrend: too few, repeated or all-equal x, non-finite values, and
 * magnitudes whose slopes or whose middle slopes' mean overflow, next to ordinary series.
 */
const awkwardPoints = fc.oneof(
  fc.array(fc.record({ x: fc.integer({ min: 0, max: 40 }), y: fc.double({ min: -2, max: 2, noNaN: true }) }), { maxLength: 40 }),
  fc.array(fc.record({ x: fc.constantFrom(0, 1e-300, 5e-324, 1, 2, 1e308), y: fc.constantFrom(-1.7e308, -1e300, 0, 1, 1e300, 1.7e308, Number.NaN, Number.POSITIVE_INFINITY) }), { maxLength: 12 }),
  fc.array(fc.record({ x: fc.double({ noNaN: false }), y: fc.double({ noNaN: false }) }), { maxLength: 12 }),
);

describe("testTrend and checkTrendInput (theilSenTrend's test and refusals without its slopes)", () => {
  it("throw exactly where theilSenTrend throws, and testTrend's test is theilSenTrend's (property)", () => {
    let refused = 0;
    let fellBack = 0;
    fc.assert(
      fc.property(awkwardPoints, fc.constantFrom(0.95, 0.9, 1.2), (points, confidence) => {
        const full = outcome(() => theilSenTrend(points, { confidence }));
        const checked = outcome(() => checkTrendInput(points, { confidence }));
        const tested = outcome(() => testTrend(points, { confidence }));
        if ("error" in full) {
          refused++;
          expect(checked).toEqual(full);
          expect(tested).toEqual(full);
          return;
        }
        expect("value" in checked && "value" in tested).toBe(true);
        if ("value" in checked && checked.value !== null) {
          fellBack++;
          expect(checked.value).toStrictEqual(full.value);
        }
        if ("value" in tested) {
          const { n, pairCount, kendallS, varianceS, z, pValue, kendallTau } = full.value;
          expect(tested.value).toStrictEqual({ n, pairCount, kendallS, varianceS, z, pValue, kendallTau, confidence });
        }
      }),
      { numRuns: 3000 },
    );
    // Both kinds of answer were reached, and the overflow guard had to fall back to the fit at least once.
    expect(refused).toBeGreaterThan(100);
    expect(fellBack).toBeGreaterThan(0);
  });

  it("give the same answer whatever the order of the points: x already ascending is not sorted again (property)", () => {
    // Every figure of a fit is a function of the set of points (the slopes, S, the ties and the medians), so the fit of
    // a time-ordered series, which skips sorting x, must equal the fit of the same points in reverse, which sorts.
    fc.assert(
      fc.property(
        fc.array(fc.record({ x: fc.constantFrom(-0, 0, 1, 2, 2, 3.5, 7, 40), y: fc.double({ min: -5, max: 5, noNaN: true }) }), { minLength: 3, maxLength: 30 }),
        (points) => {
          // ascending as `<=` sees it: a −0 may follow a 0, which a sort of the x values would put first
          const ascending = [...points].sort((a, b) => a.x - b.x);
          const fit = outcome(() => theilSenTrend(ascending));
          expect(outcome(() => theilSenTrend([...ascending].reverse()))).toStrictEqual(fit);
        },
      ),
      { numRuns: 1000 },
    );
  });

  it("refuse slopes that overflow as theilSenTrend does, and leave large but finite ones alone", () => {
    // derived: Δy = 2e300 over Δx = 1e-10 is a slope of 2e310, past the largest double (1.8e308)
    const overflowing = [{ x: 0, y: -1e300 }, { x: 1e-10, y: 1e300 }, { x: 2e-10, y: 3e300 }];
    expect(() => theilSenTrend(overflowing)).toThrow(/floating-point range/);
    expect(() => checkTrendInput(overflowing)).toThrow(/floating-point range/);
    expect(() => testTrend(overflowing)).toThrow(/floating-point range/);
    // derived: four distinct-x pairs, each a slope of 1.2e308 (finite), whose middle two's mean overflows on the way
    const middleMeanOverflows = [0, 1, 0, 1].map((x) => ({ x, y: 1.2e308 * x }));
    expect(() => theilSenTrend(middleMeanOverflows)).toThrow(/floating-point range/);
    expect(() => checkTrendInput(middleMeanOverflows)).toThrow(/floating-point range/);
    // every slope is 1e300: finite, and no fit is needed to know it
    const steep = [0, 1, 2, 3].map((x) => ({ x, y: 1e300 * x }));
    expect(checkTrendInput(steep)).toBeNull();
    expect(testTrend(steep).pValue).toBe(theilSenTrend(steep).pValue);
  });
});

describe("projectCrossing", () => {
  // y = 0.5 − 0.01x; the data's median x is 10, where the line is at 0.4
  const falling = { slope: -0.01, intercept: 0.5, slopeLow: -0.02, slopeHigh: -0.005, xMedian: 10 };

  it("projects the fitted line forward to the threshold, with the range from the slope bounds", () => {
    // derived: 0.2 lies 0.2 below the pivot (10, 0.4): reached 20 on (central), 10 on at −0.02, 40 on at −0.005
    expect(projectCrossing(falling, 0.2, { fromX: 10 })).toEqual({ x: 30, xEarliest: 20, xLatest: 50 });
  });

  it("widens the range the further the projection runs from the data's centre", () => {
    // derived: pivot (5, 0.45), 0.25 above the threshold: 5 + 12.5 = 17.5 at −0.02, 5 + 50 = 55 at −0.005
    expect(projectCrossing({ ...falling, xMedian: 5 }, 0.2, { fromX: 10 })).toEqual({ x: 30, xEarliest: 17.5, xLatest: 55 });
    // pivot (0, 0.5): the steep bound line is already at 0.2 by x = 15, so the earliest is "now"
    expect(projectCrossing({ ...falling, xMedian: 0 }, 0.2, { fromX: 20 })).toEqual({ x: 30, xEarliest: 20, xLatest: 60 });
  });

  it("reports an unbounded latest crossing when the slow bound heads away", () => {
    const crossing = projectCrossing({ ...falling, slopeHigh: 0.001 }, 0.2, { fromX: 10 });
    expect(crossing).toEqual({ x: 30, xEarliest: 20, xLatest: Number.POSITIVE_INFINITY });
    const unbounded = projectCrossing({ ...falling, slopeLow: Number.NEGATIVE_INFINITY }, 0.2, { fromX: 10 });
    expect(unbounded?.xEarliest).toBe(10);
  });

  it("returns null when the line is flat or moving away from the threshold", () => {
    expect(projectCrossing({ ...falling, slope: 0 }, 0.2, { fromX: 10 })).toBeNull();
    expect(projectCrossing({ ...falling, slope: 0.01, slopeLow: 0.005, slopeHigh: 0.02 }, 0.2, { fromX: 10 })).toBeNull();
    // already past the threshold at x = 30 and still going: it was reached, not ahead
    expect(projectCrossing(falling, 0.2, { fromX: 40 })).toBeNull();
  });

  it("works for a rising quantity toward an upper threshold", () => {
    const rising = { slope: 2, intercept: 100, slopeLow: 1, slopeHigh: 4, xMedian: 0 };
    expect(projectCrossing(rising, 140, { fromX: 0 })).toEqual({ x: 20, xEarliest: 10, xLatest: 40 });
  });
});
