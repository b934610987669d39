import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { countDistinctXPairs, selectPairwiseSlopes, STORED_SLOPES_LIMIT } from "./pairwise-slopes";
import { createSeededRandom } from "./seeded-random";

/** Every distinct-x slope, sorted: the direct definition the selection must reproduce. */
function sortAllSlopes(xs: number[], ys: number[]): Float64Array {
  const slopes: number[] = [];
  for (let i = 0; i < xs.length; i++) {
    for (let j = i + 1; j < xs.length; j++) {
      if (xs[j] !== xs[i]) slopes.push((ys[j]! - ys[i]!) / (xs[j]! - xs[i]!));
    }
  }
  // −0 and 0 are the same slope; the selection reports 0
  return Float64Array.from(slopes, (s) => s + 0).sort();
}

// Small integers make tied x, tied y and many equal slopes likely, the cases a selection gets wrong.
const smallSeries = fc
  .array(fc.tuple(fc.integer({ min: -6, max: 6 }), fc.integer({ min: -9, max: 9 })), { minLength: 3, maxLength: 40 })
  .filter((pts) => new Set(pts.map(([x]) => x)).size > 1);

describe("countDistinctXPairs", () => {
  it("counts the pairs with different x", () => {
    fc.assert(
      fc.property(smallSeries, (pts) => {
        const xs = pts.map(([x]) => x);
        let direct = 0;
        for (let i = 0; i < xs.length; i++) for (let j = i + 1; j < xs.length; j++) if (xs[i] !== xs[j]) direct++;
        expect(countDistinctXPairs(xs)).toBe(direct);
      }),
    );
  });
});

describe("selectPairwiseSlopes", () => {
  it("returns exactly the ranked slopes of the sorted list, on both the stored and the sampled path", () => {
    fc.assert(
      fc.property(smallSeries, fc.nat(), (pts, pick) => {
        const xs = pts.map(([x]) => x);
        const ys = pts.map(([, y]) => y);
        const sorted = sortAllSlopes(xs, ys);
        const n = sorted.length;
        const ranks = [1, n, Math.ceil(n / 2), (pick % n) + 1];
        const expected = ranks.map((r) => sorted[r - 1]);
        expect(selectPairwiseSlopes(xs, ys, ranks)).toEqual(expected);
        // storedLimit 0 forces the sample-select path even on tiny inputs
        expect(selectPairwiseSlopes(xs, ys, ranks, { storedLimit: 0 })).toEqual(expected);
      }),
      { numRuns: 300 },
    );
  });

  it("handles a series past the storage limit without storing every slope, and still agrees exactly", () => {
    const random = createSeededRandom(11);
    const n = 2_200; // 2.4 M pairs > STORED_SLOPES_LIMIT
    const xs = Array.from({ length: n }, (_, i) => i + Math.floor(random.uniform() * 3)); // some tied x
    const ys = xs.map((x) => 0.3 * x + 5 * random.normal());
    const sorted = sortAllSlopes(xs, ys);
    expect(sorted.length).toBeGreaterThan(STORED_SLOPES_LIMIT);
    const ranks = [1, 1_000, Math.ceil(sorted.length / 2), sorted.length - 7];
    expect(selectPairwiseSlopes(xs, ys, ranks)).toEqual(ranks.map((r) => sorted[r - 1]));
  });

  it("resolves ranks inside a block of identical slopes (a noiseless line) on the sampled path", () => {
    const xs = Array.from({ length: 300 }, (_, i) => i);
    const ys = xs.map((x) => 2 * x + 1);
    expect(selectPairwiseSlopes(xs, ys, [1, 20_000, 44_850], { storedLimit: 0 })).toEqual([2, 2, 2]);
  });

  it("refuses ranks outside 1…N", () => {
    expect(() => selectPairwiseSlopes([0, 1, 2], [0, 1, 2], [0])).toThrowError(CalcInputError);
    expect(() => selectPairwiseSlopes([0, 1, 2], [0, 1, 2], [4])).toThrow(/ranks/);
  });
});
