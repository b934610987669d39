import { describe, expect, it } from "vitest";
import { buildSparkline } from "./sparkline-path";

const box = { width: 104, height: 24, min: -0.2, max: 1, pad: 2 };

describe("buildSparkline", () => {
  it("spreads the values evenly across the inner width and maps the scale top to bottom", () => {
    const line = buildSparkline([1, 0.4, -0.2], box, 0.2);
    expect(line.points.map((p) => p.x)).toEqual([2, 52, 102]);
    // max at the top padding, min at the bottom padding, 0.4 half way between
    expect(line.points.map((p) => p.y)).toEqual([2, 12, 22]);
    expect(line.path).toBe("M2 2 L52 12 L102 22");
    // the limit 0.2 sits a third of the way up from 0.4 to -0.2: (1 − 0.2)/1.2 of 20 px below the top padding
    expect(line.limitY).toBeCloseTo(2 + (0.8 / 1.2) * 20, 1);
  });

  it("breaks the line at an unknown value instead of joining across it", () => {
    const line = buildSparkline([0.5, null, 0.5, 0.6], box);
    expect(line.path.split("M")).toHaveLength(3);
    expect(line.points).toHaveLength(3);
    expect(line.limitY).toBeNull();
  });

  it("draws values beyond the scale at its edge and flags them", () => {
    const line = buildSparkline([-3, 2], box);
    expect(line.points.map((p) => [p.y, p.clamped])).toEqual([
      [22, true],
      [2, true],
    ]);
  });

  it("puts a single value in the middle and has no path for no known value", () => {
    expect(buildSparkline([0.5], box).points[0]!.x).toBe(52);
    expect(buildSparkline([null, null], box).path).toBe("");
  });

  it("refuses an empty scale", () => {
    expect(() => buildSparkline([0.1], { ...box, min: 1, max: 1 })).toThrow(RangeError);
  });
});
