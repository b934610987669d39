import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { estimateNoiseScale, noiseBlockOf, NOISE_SCALE_FLOOR } from "./noise-estimate";
import { createSeededRandom } from "./seeded-random";

/** Uneven, strictly increasing abscissae: steps drawn between 0.2 and 1.8 units. */
function unevenX(n: number, seed: number): Float64Array {
  const rng = createSeededRandom(seed);
  const x = new Float64Array(n);
  for (let i = 1; i < n; i++) x[i] = (x[i - 1] as number) + 0.2 + 1.6 * rng.uniform();
  return x;
}

describe("estimateNoiseScale", () => {
  it("recovers the relative standard deviation of white noise on a smooth curve with uneven steps", () => {
    // derived: for a locally straight curve the pseudo-residual has exactly the noise variance
    for (const [seed, sigma] of [
      [1, 0.01],
      [2, 0.05],
      [3, 0.002],
    ] as const) {
      const n = 4_000;
      const x = unevenX(n, seed);
      const rng = createSeededRandom(seed + 100);
      const y = x.map((v) => Math.exp(Math.sin(v / 300) * 2) * (1 + sigma * rng.normal()));
      const { global } = estimateNoiseScale(x, y);
      // the MAD of 4 000 residuals scatters by about 1.7 % (asymptotic efficiency of the MAD, from memory)
      expect(global / sigma).toBeGreaterThan(0.93);
      expect(global / sigma).toBeLessThan(1.07);
    }
  });

  it("is not fooled by a few sharp bends", () => {
    const n = 2_000;
    const x = unevenX(n, 5);
    const rng = createSeededRandom(6);
    const sigma = 0.01;
    // ten narrow dips, each a few samples wide: large curvature residuals at 2–3 % of points
    const y = x.map((v) => {
      let dip = 0;
      for (let k = 1; k <= 10; k++) dip -= 3 / (1 + ((v - k * 180) / 1.5) ** 2);
      return Math.exp(dip) * (1 + sigma * rng.normal());
    });
    const { global } = estimateNoiseScale(x, y);
    expect(global / sigma).toBeLessThan(1.2);
    expect(global / sigma).toBeGreaterThan(0.9);
  });

  it("follows noise that is larger in one region", () => {
    const n = 3_000;
    const x = unevenX(n, 7);
    const rng = createSeededRandom(8);
    const y = x.map((_, i) => 1 + (i >= 1_000 && i < 1_500 ? 0.05 : 0.01) * rng.normal());
    const scale = estimateNoiseScale(x, y);
    const global = scale.global;
    expect(global / 0.01).toBeLessThan(1.2);
    const inside = scale.block[noiseBlockOf(scale, 1_250)] as number;
    const outside = scale.block[noiseBlockOf(scale, 2_500)] as number;
    expect(inside / 0.05).toBeGreaterThan(0.85);
    expect(outside).toBeGreaterThanOrEqual(global);
    expect(outside / 0.01).toBeLessThan(1.35);
  });

  it("never reports less than the floor, even for noise-free or quantised data", () => {
    const x = Float64Array.from({ length: 500 }, (_, i) => i);
    expect(estimateNoiseScale(x, x.map((v) => 3 * v + 1)).global).toBe(NOISE_SCALE_FLOOR);
    // readings of about 1 V with 0.3 % noise, rounded to 10 mV: most residuals are exactly zero
    const rng = createSeededRandom(9);
    const quantised = x.map(() => Math.round((1 + 0.003 * rng.normal()) * 100) / 100);
    expect(quantised.filter((v) => v === 1).length).toBeGreaterThan(400);
    expect(estimateNoiseScale(x, quantised).global).toBeGreaterThan(0.005);
  });

  it("refuses fewer than three points", () => {
    expect(() => estimateNoiseScale(new Float64Array(2), new Float64Array(2))).toThrowError(CalcInputError);
  });
});
