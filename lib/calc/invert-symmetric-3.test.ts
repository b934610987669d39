import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { invertSymmetric3 } from "./invert-symmetric-3";

describe("invertSymmetric3", () => {
  it("gives A·A⁻¹ = I for symmetric positive-definite matrices", () => {
    // definition of the inverse; A = BᵀB + I is symmetric positive definite for any B
    const entry = fc.double({ min: -10, max: 10, noNaN: true });
    fc.assert(
      fc.property(fc.array(entry, { minLength: 9, maxLength: 9 }), (b) => {
        const m = (i: number, j: number) =>
          [0, 1, 2].reduce((s, k) => s + (b[3 * k + i] as number) * (b[3 * k + j] as number), 0) + (i === j ? 1 : 0);
        const inverse = invertSymmetric3(m(0, 0), m(0, 1), m(0, 2), m(1, 1), m(1, 2), m(2, 2));
        expect(inverse).not.toBeNull();
        for (let i = 0; i < 3; i++) {
          for (let j = 0; j < 3; j++) {
            const product = [0, 1, 2].reduce((s, k) => s + m(i, k) * (inverse?.[3 * k + j] ?? Number.NaN), 0);
            expect(product).toBeCloseTo(i === j ? 1 : 0, 6);
          }
        }
      }),
    );
  });

  it("returns null for a singular matrix", () => {
    // rows (1,2,3), (2,4,6), (3,6,9) are multiples of one another
    expect(invertSymmetric3(1, 2, 3, 4, 6, 9)).toBeNull();
  });
});
