import { describe, expect, it } from "vitest";
import type { NoiseModel } from "./noise-estimate";
import { createSeededRandom } from "./seeded-random";
import { findTurningPoints } from "./turning-points";

const model = (relative: number, absolute = 0): NoiseModel => ({ relative, absolute, blockFactor: Float64Array.of(1) });
const reported = (r: { turns: number[]; kinds: number[] }) =>
  r.kinds.flatMap((kind, k) => (kind === 0 ? [] : [{ index: r.turns[k] as number, kind }]));

describe("findTurningPoints", () => {
  it("finds the alternating extrema of a clean curve, and not its ends", () => {
    // 0.5 + 0.3·cos(x): maxima at x = 2πk, minima at x = π(2k + 1) (exact)
    const n = 2_001;
    const ratio = Float64Array.from({ length: n }, (_, i) => 0.5 + 0.3 * Math.cos((i / (n - 1)) * 6.5 * Math.PI));
    const found = reported(findTurningPoints(ratio, n, model(0.001), 6));
    const xs = found.map((t) => (t.index / (n - 1)) * 6.5);
    expect(found.map((t) => t.kind)).toEqual([-1, 1, -1, 1, -1, 1]);
    xs.forEach((x, k) => expect(x).toBeCloseTo(k + 1, 2));
  });

  it("reports nothing for noise on a flat line", () => {
    const rng = createSeededRandom(1);
    const n = 5_000;
    const ratio = Float64Array.from({ length: n }, () => 0.4 * (1 + 0.02 * rng.normal()));
    expect(reported(findTurningPoints(ratio, n, model(0.02), 6.5))).toEqual([]);
  });

  it("needs a drop of z·√(σa² + σb²) on both sides", () => {
    // readings 0.5, 0.6, 0.5 with σ = 0.01 each: the rise 0.1 is 7.07 × √(σ² + σ²) (derived)
    const ratio = Float64Array.of(0.5, 0.6, 0.5);
    expect(reported(findTurningPoints(ratio, 3, model(0, 0.01), 7))).toEqual([{ index: 1, kind: 1 }]);
    expect(reported(findTurningPoints(ratio, 3, model(0, 0.01), 7.1))).toEqual([]);
  });
});
