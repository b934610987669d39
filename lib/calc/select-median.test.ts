import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { selectMedianInPlace } from "./select-median";

/** Reference: the median by full sort (definition of the sample median). */
function sortedMedian(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const n = s.length;
  return n % 2 === 1 ? (s[n >> 1] as number) : ((s[n / 2 - 1] as number) + (s[n / 2] as number)) / 2;
}

describe("selectMedianInPlace", () => {
  it("equals the median of the sorted values, ties and duplicates included", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -5, max: 5 }).map((v) => v / 2), { minLength: 1, maxLength: 60 }), (values) => {
        expect(selectMedianInPlace(Float64Array.from(values))).toBe(sortedMedian(values));
      }),
    );
    fc.assert(
      fc.property(fc.array(fc.double({ noNaN: true, noDefaultInfinity: true }), { minLength: 1, maxLength: 200 }), (values) => {
        // === so that −0 and +0, which sort as equals, count as the same median
        expect(selectMedianInPlace(Float64Array.from(values)) === sortedMedian(values)).toBe(true);
      }),
    );
  });

  it("uses only the first `length` values", () => {
    const a = Float64Array.from([9, 1, 5, 100, -100]);
    expect(selectMedianInPlace(a, 3)).toBe(5);
    expect(selectMedianInPlace(Float64Array.from([4, 2, 1000]), 2)).toBe(3);
  });

  it("handles sorted, reversed and constant inputs of some size", () => {
    const n = 10_001;
    const up = Float64Array.from({ length: n }, (_, i) => i);
    const down = Float64Array.from({ length: n }, (_, i) => n - i);
    expect(selectMedianInPlace(up)).toBe(5_000);
    expect(selectMedianInPlace(down)).toBe(5_001);
    expect(selectMedianInPlace(new Float64Array(n).fill(3))).toBe(3);
  });

  it("refuses an impossible length", () => {
    expect(() => selectMedianInPlace(new Float64Array(3), 0)).toThrowError(CalcInputError);
    expect(() => selectMedianInPlace(new Float64Array(3), 4)).toThrow(/length/);
  });
});
