import { describe, expect, it } from "vitest";
import { buildLogLogPath } from "./log-plot-path";

const box = { width: 102, height: 52, pad: 1 };

describe("buildLogLogPath", () => {
  it("spaces decades equally: 10, 100, 1000 Hz land at the left edge, the middle and the right edge", () => {
    const plot = buildLogLogPath(
      [
        { x: 10, y: 1 },
        { x: 100, y: 100 },
        { x: 1000, y: 10 },
      ],
      box,
    );
    // y: 1 Ω at the bottom, 100 Ω at the top, 10 Ω half way (log axis)
    expect(plot.path).toBe("M1 51 L51 1 L101 26");
    expect(plot.xRange![0]).toBeCloseTo(10, 9);
    expect(plot.xRange![1]).toBeCloseTo(1000, 9);
    expect(plot.yRange![1]).toBeCloseTo(100, 9);
  });

  it("leaves out points that have no place on log axes", () => {
    const plot = buildLogLogPath(
      [
        { x: 0, y: 5 },
        { x: 100, y: -1 },
        { x: 100, y: 5 },
      ],
      box,
    );
    expect(plot.path).toBe("M51 26");
  });

  it("draws nothing and names no range for no usable point", () => {
    expect(buildLogLogPath([], box)).toEqual({ path: "", xRange: null, yRange: null });
  });
});
