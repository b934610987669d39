import { describe, expect, it } from "vitest";
import { decimateMinMax } from "./decimate-min-max";

describe("decimateMinMax", () => {
  it("returns short curves unchanged", () => {
    const points = [{ x: 1, y: 2 }, { x: 2, y: 3 }];
    expect(decimateMinMax(points, 10)).toEqual(points);
  });

  it("keeps a one-sample spike and a one-sample dip out of 100 000 points", () => {
    const points = Array.from({ length: 100_000 }, (_, i) => ({ x: 1000 + i, y: 1 + 0.001 * Math.sin(i) }));
    points[31_337]!.y = 50;
    points[77_777]!.y = 0.01;
    const thinned = decimateMinMax(points, 500);
    expect(thinned.length).toBeLessThanOrEqual(1000);
    expect(Math.max(...thinned.map((p) => p.y))).toBe(50);
    expect(Math.min(...thinned.map((p) => p.y))).toBe(0.01);
    expect(thinned.every((p, i) => i === 0 || p.x > thinned[i - 1]!.x)).toBe(true);
  });

  it("buckets evenly in log x when asked, so the low decade is not squeezed into one bucket", () => {
    const points = Array.from({ length: 10_000 }, (_, i) => ({ x: 10 ** (3 + (3 * i) / 9999), y: i % 7 }));
    const below10k = decimateMinMax(points, 300, true).filter((p) => p.x < 1e4).length;
    expect(below10k).toBeGreaterThan(150);
  });
});
