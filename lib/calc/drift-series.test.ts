import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { addDays, daysBetween, findModalBand, fitDriftTrend, measureLevelShift } from "./drift-series";

const day = (iso: string) => new Date(`${iso}T12:00:00Z`);

describe("daysBetween / addDays", () => {
  it("count whole UTC days across a local daylight-saving change", () => {
    // Newfoundland springs forward on 2026-03-08; tests run with TZ=America/St_Johns, and the count must not see it
    expect(daysBetween(day("2026-03-07"), day("2026-03-09"))).toBe(2);
    expect(addDays(day("2026-03-07"), 2).toISOString()).toBe("2026-03-09T12:00:00.000Z");
  });
});

describe("fitDriftTrend", () => {
  it("fits against days since the first point and reports rates per 30 days", () => {
    // derived: an exact line falling 0.002 a day falls 0.06 per 30 days
    const series = [0, 3, 7, 20, 21, 40].map((d) => ({ at: addDays(day("2026-01-01"), d), value: 0.5 - 0.002 * d }));
    const trend = fitDriftTrend(series, 0.95);
    expect(trend.origin).toEqual(day("2026-01-01"));
    expect(trend.perMonth).toBeCloseTo(-0.06, 12);
    expect(trend.fit.intercept).toBeCloseTo(0.5, 12);
    expect(trend.significant).toBe(true);
  });
});

describe("findModalBand", () => {
  it("picks the band holding most observations, ties to the later centre, referenced at its members' median", () => {
    // derived: the bands around 170, 168, 172 and 175 each hold those four values; the tie goes to 175's band,
    // and the median of 168, 170, 172, 175 is 171
    expect(findModalBand([120, 170, 168, 172, 121, 175], 0.1)).toEqual({ reference: 171, members: [1, 2, 3, 5] });
    expect(findModalBand([100, 200], 0.1)).toEqual({ reference: 200, members: [1] });
    expect(findModalBand([], 0.1)).toBeNull();
  });

  it("counts each band as comparing every pair would (property)", () => {
    // The definition, written out: every value against every centre, ties to the later centre.
    const pairwise = (values: number[], fraction: number) => {
      let best = -1;
      let bestCount = 0;
      values.forEach((centre, c) => {
        const count = values.filter((v) => Math.abs(v - centre) <= fraction * centre).length;
        if (count >= bestCount) [best, bestCount] = [c, count];
      });
      return bestCount === 0 ? null : values.flatMap((v, i) => (Math.abs(v - values[best]!) <= fraction * values[best]! ? [i] : []));
    };
    fc.assert(
      fc.property(
        fc.oneof(
          fc.array(fc.constantFrom(0, 100, 110, 121, 90, 99.99999999999999, 110.00000000000001, 120, 170, 187), { maxLength: 40 }),
          fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { maxLength: 40 }),
        ),
        fc.constantFrom(0.1, 0.25, 0.001, 0),
        (values, fraction) => {
          const band = findModalBand(values, fraction);
          expect(band?.members ?? null).toEqual(pairwise(values, fraction));
        },
      ),
      { numRuns: 2000 },
    );
  });
});

describe("measureLevelShift", () => {
  it("compares the median of the last `count` with the median of the first `count`", () => {
    const shift = measureLevelShift([10, 11, 9, 50, 12, 12, 13, 12], { count: 3 });
    // derived: first three median 10, last three median 12 → +20 %; the 50 is in neither group
    expect(shift).toMatchObject({ baseline: 10, recent: 12, baselineSource: "first observations" });
    expect(shift!.shiftFraction).toBeCloseTo(0.2, 12);
  });

  it("needs 2·count observations without an explicit baseline, one with it", () => {
    expect(measureLevelShift([1, 2, 3, 4, 5], { count: 3 })).toBeNull();
    expect(measureLevelShift([4], { count: 3, explicitBaseline: 5 })).toMatchObject({
      baseline: 5,
      recent: 4,
      baselineSource: "explicit",
      shiftFraction: -0.19999999999999996,
    });
  });
});
