import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { createSeededRandom } from "./seeded-random";
import { fitWeightedQuadratic } from "./weighted-quadratic-fit";

describe("fitWeightedQuadratic", () => {
  it("reproduces an exact parabola whatever the weights", () => {
    const u = Float64Array.from([-1, -0.7, -0.1, 0.2, 0.55, 1]);
    const v = u.map((x) => 2 - 3 * x + 4 * x * x);
    const w = Float64Array.from([1, 10, 0.1, 3, 7, 0.5]);
    const fit = fitWeightedQuadratic(u, v, w, u.length);
    expect(fit).not.toBeNull();
    expect(fit?.a).toBeCloseTo(2, 12);
    expect(fit?.b).toBeCloseTo(-3, 12);
    expect(fit?.c).toBeCloseTo(4, 12);
    for (const value of fit?.covariance ?? []) expect(Math.abs(value)).toBeLessThan(1e-20);
  });

  it("reports a covariance that matches the scatter of repeated noisy fits", () => {
    // Monte Carlo check of Cov = s²·(XᵀWX)⁻¹: an independent estimate of the same quantity
    const n = 25;
    const u = Float64Array.from({ length: n }, (_, i) => -1 + (2 * i) / (n - 1));
    const sigma = u.map((x) => 0.05 * (1 + x * x)); // unequal noise, weights 1/σ²
    const w = sigma.map((s) => 1 / (s * s));
    const rng = createSeededRandom(11);
    const cs: number[] = [];
    let reportedVarC = 0;
    const trials = 2_000;
    for (let t = 0; t < trials; t++) {
      const v = u.map((x, i) => 1 + 0.5 * x + 2 * x * x + (sigma[i] as number) * rng.normal());
      const fit = fitWeightedQuadratic(u, v, w, n);
      if (fit === null || fit.covariance === null) throw new Error("fit failed");
      cs.push(fit.c);
      reportedVarC += (fit.covariance[8] as number) / trials;
    }
    const mean = cs.reduce((s, c) => s + c, 0) / trials;
    const empiricalVarC = cs.reduce((s, c) => s + (c - mean) ** 2, 0) / (trials - 1);
    expect(Math.abs(mean - 2)).toBeLessThan(4 * Math.sqrt(empiricalVarC / trials));
    // a variance estimated from 2 000 trials scatters by about √(2/2000) ≈ 3 %
    expect(reportedVarC / empiricalVarC).toBeGreaterThan(0.88);
    expect(reportedVarC / empiricalVarC).toBeLessThan(1.12);
  });

  it("gives no covariance for exactly three points, and null when singular", () => {
    const three = fitWeightedQuadratic(Float64Array.from([0, 1, 2]), Float64Array.from([1, 0, 1]), Float64Array.from([1, 1, 1]), 3);
    expect(three?.c).toBeCloseTo(1, 12);
    expect(three?.covariance).toBeNull();
    const twoDistinct = fitWeightedQuadratic(
      Float64Array.from([0, 0, 1, 1]),
      Float64Array.from([1, 2, 3, 4]),
      Float64Array.from([1, 1, 1, 1]),
      4,
    );
    expect(twoDistinct).toBeNull();
    expect(() => fitWeightedQuadratic(new Float64Array(2), new Float64Array(2), new Float64Array(2), 2)).toThrowError(
      CalcInputError,
    );
  });
});
