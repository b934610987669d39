import { describe, expect, it } from "vitest";
import { quantileOfSorted, summarizeDeviations } from "./deviation-summary";

describe("quantileOfSorted", () => {
  it("matches definition 7 of Hyndman & Fan 1996 (the default of R's quantile, from memory) on 1…5", () => {
    expect(quantileOfSorted([1, 2, 3, 4, 5], 0.25)).toBe(2);
    expect(quantileOfSorted([1, 2, 3, 4], 0.5)).toBe(2.5);
    expect(quantileOfSorted([1, 2, 3, 4], 0.25)).toBe(1.75);
    expect(() => quantileOfSorted([], 0.5)).toThrow(/^sorted:/);
  });
});

describe("summarizeDeviations", () => {
  it("gives count, median, quartiles and the worst by size with its label", () => {
    const summary = summarizeDeviations([
      { deviation: 0.01, label: "a" },
      { deviation: -0.04, label: "b" },
      { deviation: 0.02, label: "c" },
    ]);
    expect(summary).toEqual({ count: 3, median: 0.01, lowerQuartile: -0.015, upperQuartile: 0.015, worst: { deviation: -0.04, label: "b" } });
    expect(summarizeDeviations([])).toBeNull();
  });
});
