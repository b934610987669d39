import { describe, expect, it } from "vitest";
import { propagateUncertainty, rectangularStandardUncertainty } from "./uncertainty-propagation";

describe("propagateUncertainty", () => {
  it("reproduces the GUM's relative rule for f = 1/(2π√(LC)): u_f/f = ½√(u_L²/L² + u_C²/C²)", () => {
    // JCGM 100:2008 §5.1.6: for Y = c·Π X_i^p_i, (u_c(y)/y)² = Σ (p_i u(x_i)/x_i)²; here p = −½ for L and C.
    const L = 4e-3;
    const C = 20e-12;
    const result = propagateUncertainty(([l, c]) => 1 / (2 * Math.PI * Math.sqrt(l! * c!)), [
      { name: "L", value: L, standardUncertainty: 0.02 * L },
      { name: "C", value: C, standardUncertainty: 0.05 * C },
    ]);
    expect(result.value).toBeCloseTo(1 / (2 * Math.PI * Math.sqrt(L * C)), 6);
    expect(result.standardUncertainty / result.value).toBeCloseTo(0.5 * Math.sqrt(0.02 ** 2 + 0.05 ** 2), 6);
  });

  it("adds the contributions of a sum in quadrature (GUM eq. 10 with unit sensitivities)", () => {
    const result = propagateUncertainty(([a, b]) => a! + b!, [
      { name: "a", value: 3, standardUncertainty: 0.3 },
      { name: "b", value: 4, standardUncertainty: 0.4 },
    ]);
    expect(result.standardUncertainty).toBeCloseTo(0.5, 9);
    expect(result.contributions.map((c) => c.sensitivity)).toEqual([expect.closeTo(1, 9), expect.closeTo(1, 9)]);
  });

  it("refuses a negative uncertainty and an empty model, naming the field", () => {
    expect(() => propagateUncertainty(([a]) => a!, [{ name: "a", value: 1, standardUncertainty: -1 }])).toThrow(/^inputs\[0\]\.standardUncertainty:/);
    expect(() => propagateUncertainty(() => 1, [])).toThrow(/^inputs:/);
  });
});

describe("rectangularStandardUncertainty", () => {
  it("is a/√3 for a half-width a (JCGM 100:2008 §4.3.7)", () => {
    expect(rectangularStandardUncertainty(0.15)).toBeCloseTo(0.15 / Math.sqrt(3), 12);
    expect(() => rectangularStandardUncertainty(-1)).toThrow(/^halfWidth:/);
  });
});
