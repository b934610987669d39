import { describe, expect, it } from "vitest";
import { estimateRunningOffset, estimateRunningOffsetFromMoments, predictRunningFrequency, ratioMoments, RUNNING_OFFSET_PRIOR } from "./running-frequency";

describe("estimateRunningOffset", () => {
  it("falls back to the common-practice prior, 1 ± 5 % rectangular (u = 0.05/√3, JCGM 100:2008 §4.3.7)", () => {
    const prior = estimateRunningOffset([1.03], [0.98]);
    expect(prior).toEqual({ ratio: 1, standardUncertainty: 0.05 / Math.sqrt(3), source: "prior", count: 0 });
    expect(RUNNING_OFFSET_PRIOR.standardUncertainty).toBeCloseTo(0.028868, 6);
  });

  it("prefers the coil's own sessions over the fleet's once it has two", () => {
    // Hand-worked: mean of 1.02 and 1.04 is 1.03, s = 0.014142, predictive s·√(1 + 1/2) = 0.017321.
    const own = estimateRunningOffset([1.02, 1.04], [0.9, 0.92, 0.94]);
    expect(own.source).toBe("coil");
    expect(own.ratio).toBeCloseTo(1.03, 12);
    expect(own.standardUncertainty).toBeCloseTo(0.017321, 6);
  });

  it("uses the fleet's sessions when the coil has fewer than two", () => {
    const fleet = estimateRunningOffset([1.1], [0.99, 1.01, 1.03]);
    expect(fleet).toMatchObject({ source: "fleet", count: 3 });
    expect(fleet.ratio).toBeCloseTo(1.01, 12);
  });

  it("gives the same estimate from running totals as from the list", () => {
    const ratios = [1.021, 1.034, 1.027, 1.04];
    expect(estimateRunningOffsetFromMoments(ratioMoments(ratios), ratioMoments([]))).toEqual(estimateRunningOffset(ratios));
    expect(() => estimateRunningOffsetFromMoments({ count: -1, sum: 0, sumOfSquares: 0 }, ratioMoments([]))).toThrow(/^own\.count:/);
  });

  it("refuses a ratio that is not positive, naming it", () => {
    expect(() => estimateRunningOffset([1, 0])).toThrow(/^ownRatios\[1\]:/);
  });
});

describe("predictRunningFrequency", () => {
  it("scales the swept resonance and its uncertainty by the ratio (GUM eq. 10, one input)", () => {
    const prediction = predictRunningFrequency(200_000, { ratio: 1.03, standardUncertainty: 0.01, source: "coil", count: 4 });
    expect(prediction.frequency).toBeCloseTo(206_000, 6);
    expect(prediction.standardUncertainty).toBeCloseTo(2_000, 6);
    expect(() => predictRunningFrequency(0, RUNNING_OFFSET_PRIOR as never)).toThrow(/^sweptFirstResonanceHz:/);
  });
});
