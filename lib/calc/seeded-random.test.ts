import normalCdf from "@stdlib/stats-base-dists-normal-cdf";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { createSeededRandom } from "./seeded-random";

/** Kolmogorov–Smirnov statistic of `values` against the continuous CDF `cdf`. */
function ksStatistic(values: number[], cdf: (x: number) => number): number {
  const sorted = [...values].sort((a, b) => a - b);
  const n = sorted.length;
  let d = 0;
  sorted.forEach((x, i) => {
    const f = cdf(x);
    d = Math.max(d, (i + 1) / n - f, f - i / n);
  });
  return d;
}

// Large-sample KS critical value at α = 0.001 is 1.95/√n (Kolmogorov distribution; Massey,
// J. Amer. Statist. Assoc. 46, 1951, table — from memory).
const ksCritical = (n: number) => 1.95 / Math.sqrt(n);

describe("createSeededRandom", () => {
  it("repeats exactly for the same seed and differs between seeds", () => {
    const a = createSeededRandom(42);
    const b = createSeededRandom(42);
    const c = createSeededRandom(43);
    const seqA = Array.from({ length: 50 }, () => a.uniform());
    const seqB = Array.from({ length: 50 }, () => b.uniform());
    const seqC = Array.from({ length: 50 }, () => c.uniform());
    expect(seqA).toEqual(seqB);
    expect(seqA).not.toEqual(seqC);
    expect(Array.from({ length: 7 }, () => a.normal())).toEqual(Array.from({ length: 7 }, () => b.normal()));
  });

  it("draws uniforms on [0, 1) that pass a Kolmogorov–Smirnov test", () => {
    for (const seed of [1, 2024, 4_294_967_295]) {
      const rng = createSeededRandom(seed);
      const values = Array.from({ length: 20_000 }, () => rng.uniform());
      expect(Math.min(...values)).toBeGreaterThanOrEqual(0);
      expect(Math.max(...values)).toBeLessThan(1);
      expect(ksStatistic(values, (x) => x)).toBeLessThan(ksCritical(values.length));
    }
  });

  it("draws normals that pass a Kolmogorov–Smirnov test against the normal CDF", () => {
    // reference library: @stdlib/stats-base-dists-normal-cdf
    for (const seed of [7, 99]) {
      const rng = createSeededRandom(seed);
      const values = Array.from({ length: 20_000 }, () => rng.normal());
      expect(ksStatistic(values, (x) => normalCdf(x, 0, 1))).toBeLessThan(ksCritical(values.length));
      const mean = values.reduce((s, v) => s + v, 0) / values.length;
      const variance = values.reduce((s, v) => s + (v - mean) ** 2, 0) / (values.length - 1);
      // sampling error of the mean is 1/√n ≈ 0.007; of the variance √(2/n) ≈ 0.01
      expect(Math.abs(mean)).toBeLessThan(0.035);
      expect(Math.abs(variance - 1)).toBeLessThan(0.05);
    }
  });

  it("refuses seeds that are not integers", () => {
    expect(() => createSeededRandom(1.5)).toThrowError(CalcInputError);
    expect(() => createSeededRandom(Number.NaN)).toThrow(/seed/);
  });
});
