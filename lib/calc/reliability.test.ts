import chisquareQuantile from "@stdlib/stats-base-dists-chisquare-quantile";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { partReliability, sumOperatingHours } from "./reliability";

describe("χ² quantiles used for the bounds", () => {
  it("match the standard χ² table", () => {
    // Standard χ² table, upper-tail critical values (from memory): χ²₀.₉₅ with 2 and 4 d.o.f.,
    // χ²₀.₉₇₅ with 6 d.o.f., and the lower-tail χ²₀.₀₂₅ with 4 d.o.f.
    expect(chisquareQuantile(0.95, 2)).toBeCloseTo(5.991, 3);
    expect(chisquareQuantile(0.95, 4)).toBeCloseTo(9.488, 3);
    expect(chisquareQuantile(0.975, 6)).toBeCloseTo(14.449, 3);
    expect(chisquareQuantile(0.025, 4)).toBeCloseTo(0.484, 3);
  });

  it("match the closed forms for 2 and 4 degrees of freedom", () => {
    // derived: χ²₂ is exponential with mean 2, so its quantile is −2 ln(1 − p);
    // the χ²₄ CDF is 1 − e^(−x/2)(1 + x/2)
    for (const p of [0.025, 0.5, 0.975]) {
      expect(chisquareQuantile(p, 2)).toBeCloseTo(-2 * Math.log(1 - p), 12);
      const x = chisquareQuantile(p, 4);
      expect(1 - Math.exp(-x / 2) * (1 + x / 2)).toBeCloseTo(p, 12);
    }
  });
});

describe("partReliability", () => {
  it("gives MTBF T/r with the time-terminated two-sided interval, worked by hand", () => {
    // Worked example: T = 5 000 h, r = 2, 95 % two-sided.
    // lower = 2T/χ²(0.975; 6) = 10 000/14.449 = 692.1 h; upper = 2T/χ²(0.025; 4) = 10 000/0.4844 = 20 644 h
    // (14.449 from the standard χ² table, from memory; 0.4844 solves the χ²₄ closed-form CDF = 0.025: e^(−0.2422)·1.2422 = 0.9750).
    const [part] = partReliability([
      { partKey: "FGH40N60", operatingHours: 3_000, failures: 1 },
      { partKey: "FGH40N60", operatingHours: 2_000, failures: 1 },
    ]);
    expect(part).toMatchObject({ partKey: "FGH40N60", records: 2, operatingHours: 5_000, failures: 2, mtbfHours: 2_500 });
    expect(part!.mtbfLowHours).toBeCloseTo(10_000 / 14.449, 1);
    expect(part!.mtbfHighHours / (10_000 / 0.4844)).toBeCloseTo(1, 3);
  });

  it("gives an infinite upper bound and a finite lower bound when nothing has failed", () => {
    // derived: r = 0 → lower = 2T/χ²(0.975; 2) = 2T/(−2 ln 0.025) = 1 000/3.6889 = 271.1 h for T = 1 000 h
    const [part] = partReliability([{ partKey: "IRFP460", operatingHours: 1_000, failures: 0 }]);
    expect(part!.mtbfHours).toBeNull();
    expect(part!.mtbfHighHours).toBe(Number.POSITIVE_INFINITY);
    expect(part!.mtbfLowHours).toBeCloseTo(1_000 / -Math.log(0.025), 9);
    expect(part!.mtbfLowHours).toBeCloseTo(271.1, 1);
  });

  it("narrows the interval as confidence drops and keeps the point estimate inside it", () => {
    const records = [{ partKey: "A", operatingHours: 800, failures: 4 }];
    const [wide] = partReliability(records, { confidence: 0.95 });
    const [narrow] = partReliability(records, { confidence: 0.8 });
    expect(narrow!.mtbfLowHours).toBeGreaterThan(wide!.mtbfLowHours);
    expect(narrow!.mtbfHighHours).toBeLessThan(wide!.mtbfHighHours);
    expect(narrow!.mtbfLowHours).toBeLessThan(200);
    expect(narrow!.mtbfHighHours).toBeGreaterThan(200);
  });

  it("pools by part key, sorted, trimming stray spaces", () => {
    const result = partReliability([
      { partKey: "b", operatingHours: 10, failures: 0 },
      { partKey: "a ", operatingHours: 5, failures: 1 },
      { partKey: "a", operatingHours: 7, failures: 0 },
    ]);
    expect(result.map((p) => [p.partKey, p.operatingHours, p.failures, p.records])).toEqual([
      ["a", 12, 1, 2],
      ["b", 10, 0, 1],
    ]);
  });

  it("names the offending record", () => {
    expect(() => partReliability([{ partKey: "", operatingHours: 1, failures: 0 }])).toThrow(/records\[0\]\.partKey/);
    expect(() => partReliability([{ partKey: "x", operatingHours: -1, failures: 0 }])).toThrowError(CalcInputError);
    expect(() =>
      partReliability([
        { partKey: "x", operatingHours: 1, failures: 0 },
        { partKey: "x", operatingHours: 1, failures: 1.5 },
      ]),
    ).toThrow(/records\[1\]\.failures/);
    expect(() => partReliability([], { confidence: 0 })).toThrow(/confidence/);
  });
});

describe("sumOperatingHours", () => {
  it("adds session durations and converts seconds to hours", () => {
    expect(sumOperatingHours([{ durationS: 3_600 }, { durationS: 1_800 }, { durationS: 0 }])).toBe(1.5);
    expect(sumOperatingHours([])).toBe(0);
    expect(() => sumOperatingHours([{ durationS: 60 }, { durationS: Number.NaN }])).toThrow(/sessions\[1\]\.durationS/);
  });
});
