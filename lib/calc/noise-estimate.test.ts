import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { estimateNoise, noiseAt, noiseBlockOf, NOISE_SCALE_FLOOR } from "./noise-estimate";
import { createSeededRandom } from "./seeded-random";

/** Uneven, strictly increasing abscissae: steps drawn between 0.2 and 1.8 units. */
function unevenX(n: number, seed: number): Float64Array {
  const rng = createSeededRandom(seed);
  const x = new Float64Array(n);
  for (let i = 1; i < n; i++) x[i] = (x[i - 1] as number) + 0.2 + 1.6 * rng.uniform();
  return x;
}

/** A smooth positive curve spanning readings from about 0.01 to 1. */
const smooth = (v: number) => Math.exp(-4.6 * (0.5 + 0.5 * Math.sin(v / 400)));

describe("estimateNoise", () => {
  it("recovers noise proportional to the reading, with uneven steps", () => {
    // derived: for a locally straight curve the pseudo-residual has exactly the noise variance
    for (const [seed, sigma] of [
      [1, 0.01],
      [2, 0.05],
      [3, 0.002],
    ] as const) {
      const n = 6_000;
      const x = unevenX(n, seed);
      const rng = createSeededRandom(seed + 100);
      const y = x.map((v) => smooth(v) * (1 + sigma * rng.normal()));
      const model = estimateNoise(x, y);
      expect(model.relative / sigma).toBeGreaterThan(0.9);
      expect(model.relative / sigma).toBeLessThan(1.1);
      // the floor it finds is negligible against the proportional part at every level
      expect(model.absolute).toBeLessThan(0.5 * sigma * 0.01);
    }
  });

  it("recovers a fixed noise floor, which dominates the small readings", () => {
    const n = 6_000;
    const x = unevenX(n, 4);
    const rng = createSeededRandom(5);
    const y = x.map((v) => smooth(v) * (1 + 0.004 * rng.normal()) + 0.002 * rng.normal());
    const model = estimateNoise(x, y);
    expect(model.absolute / 0.002).toBeGreaterThan(0.85);
    expect(model.absolute / 0.002).toBeLessThan(1.15);
    expect(model.relative / 0.004).toBeGreaterThan(0.8);
    expect(model.relative / 0.004).toBeLessThan(1.2);
    // at a reading of 0.01 the floor is 20 % of it
    expect(noiseAt(model, 10, 0.01) / Math.hypot(0.004 * 0.01, 0.002)).toBeGreaterThan(0.85);
  });

  it("is not fooled much by a few sharp bends, and errs large when it is", () => {
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
    const model = estimateNoise(x, y);
    // the bends sit at small readings, so their residuals inflate the floor, not the level at 1
    expect(noiseAt(model, 500, 1) / sigma).toBeGreaterThan(0.9);
    expect(noiseAt(model, 500, 1) / sigma).toBeLessThan(1.6);
  });

  it("marks a stretch that is noisier than the rest", () => {
    const n = 3_000;
    const x = unevenX(n, 7);
    const rng = createSeededRandom(8);
    const y = x.map((_, i) => 1 + (i >= 1_000 && i < 1_500 ? 0.05 : 0.01) * rng.normal());
    const model = estimateNoise(x, y);
    expect(model.relative / 0.01).toBeLessThan(1.2);
    const inside = noiseAt(model, 1_250, 1);
    const outside = noiseAt(model, 2_500, 1);
    expect(inside / 0.05).toBeGreaterThan(0.85);
    expect(outside / 0.01).toBeLessThan(1.4);
    expect(model.blockFactor[noiseBlockOf(model, 2_500)]).toBeGreaterThanOrEqual(1);
  });

  it("never reports less than the floor, even for noise-free or quantised data", () => {
    const x = Float64Array.from({ length: 500 }, (_, i) => i);
    expect(estimateNoise(x, x.map((v) => 3 * v + 1)).relative).toBe(NOISE_SCALE_FLOOR);
    // readings of about 1 V with 0.3 % noise, rounded to 10 mV: most residuals are exactly zero
    const rng = createSeededRandom(9);
    const quantised = x.map(() => Math.round((1 + 0.003 * rng.normal()) * 100) / 100);
    expect(quantised.filter((v) => v === 1).length).toBeGreaterThan(400);
    expect(noiseAt(estimateNoise(x, quantised), 100, 1)).toBeGreaterThan(0.005);
  });

  it("refuses fewer than three points", () => {
    expect(() => estimateNoise(new Float64Array(2), new Float64Array(2))).toThrowError(CalcInputError);
  });
});
