import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { minimizeScalar } from "./minimize-scalar";

describe("minimizeScalar", () => {
  it("finds minima known in closed form", () => {
    // (x − 2)² at 2; x·ln x at 1/e; cos x on [2, 5] at π (exact)
    expect(minimizeScalar((x) => (x - 2) ** 2, -10, 10, 1e-10)).toBeCloseTo(2, 8);
    expect(minimizeScalar((x) => x * Math.log(x), 0.01, 3, 1e-10)).toBeCloseTo(1 / Math.E, 8);
    expect(minimizeScalar(Math.cos, 2, 5, 1e-10)).toBeCloseTo(Math.PI, 8);
  });

  it("returns the bracket end for a monotonic function", () => {
    expect(minimizeScalar((x) => x, 1, 4, 1e-9)).toBeCloseTo(1, 7);
    expect(minimizeScalar((x) => -x, 1, 4, 1e-9)).toBeCloseTo(4, 7);
  });

  it("needs far fewer evaluations than golden section on a smooth minimum", () => {
    let calls = 0;
    minimizeScalar(
      (x) => {
        calls++;
        return Math.exp(x) - 3 * x;
      },
      -5,
      5,
      1e-9,
    );
    // golden section alone would need log(1e-9/10)/log(0.618) ≈ 48 evaluations
    expect(calls).toBeLessThan(30);
  });

  it("refuses an empty bracket", () => {
    expect(() => minimizeScalar((x) => x * x, 2, 2, 1e-6)).toThrowError(CalcInputError);
  });
});
