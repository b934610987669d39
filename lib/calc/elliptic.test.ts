import ellipe from "@stdlib/math-base-special-ellipe";
import ellipk from "@stdlib/math-base-special-ellipk";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { completeEllipticE, completeEllipticIntegrals, completeEllipticK } from "./elliptic";
import { CalcInputError } from "./errors";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe("complete elliptic integrals by the AGM", () => {
  it("give K(0) = E(0) = π/2 exactly", () => {
    // Exact: both integrals reduce to ∫₀^{π/2} dθ at k = 0 (A&S 17.3.11, equation number from memory).
    expect(completeEllipticK(0)).toBe(Math.PI / 2);
    expect(completeEllipticE(0)).toBe(Math.PI / 2);
  });

  it("match the lemniscatic case k = 1/√2 in closed form", () => {
    // Exact: K(1/√2) = Γ(1/4)²/(4√π) (lemniscatic case, from memory); Γ(1/4) = 3.6256099082219083119 (from memory).
    const gammaQuarter = 3.6256099082219083119;
    const k = Math.SQRT1_2;
    const expectedK = (gammaQuarter * gammaQuarter) / (4 * Math.sqrt(Math.PI));
    expect(relativeError(completeEllipticK(k), expectedK)).toBeLessThan(2e-15);
    // Exact: Legendre's relation at k = k′ = 1/√2 gives 2EK − K² = π/2, so E = (π/2 + K²)/(2K).
    const expectedE = (Math.PI / 2 + expectedK * expectedK) / (2 * expectedK);
    expect(relativeError(completeEllipticE(k), expectedE)).toBeLessThan(2e-15);
  });

  it("match tabulated values at m = k² = 0.25 and 0.99", () => {
    // Reference library: mpmath 1.3.0, ellipk(0.25) = 1.685750354812596, ellipe(0.25) = 1.467462209339427
    expect(relativeError(completeEllipticK(0.5), 1.685750354812596)).toBeLessThan(2e-15);
    expect(relativeError(completeEllipticE(0.5), 1.467462209339427)).toBeLessThan(2e-15);
    // mpmath 1.3.0: ellipk(0.99) = 3.695637362989874, ellipe(0.99) = 1.015993545025224
    expect(relativeError(completeEllipticK(Math.sqrt(0.99)), 3.695637362989874)).toBeLessThan(4e-15);
    expect(relativeError(completeEllipticE(Math.sqrt(0.99)), 1.015993545025224)).toBeLessThan(4e-15);
  });

  it("agree with @stdlib ellipk/ellipe (which take the parameter m = k²) across the range", () => {
    // Reference library: @stdlib/math-base-special-ellipk and -ellipe, argument m = k² (see their README).
    // Rounding m = k·k perturbs 1 − m by ~1e-16/(1 − m) relative, and K moves by about half that:
    // the tolerance widens accordingly near k = 1.
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.999999, noNaN: true }), (k) => {
        const { K, E } = completeEllipticIntegrals(k);
        const tolerance = 5e-15 + Number.EPSILON / (1 - k * k);
        expect(relativeError(K, ellipk(k * k))).toBeLessThan(tolerance);
        expect(relativeError(E, ellipe(k * k))).toBeLessThan(tolerance);
      }),
    );
  });

  it("satisfy Legendre's relation E K′ + E′ K − K K′ = π/2", () => {
    // Exact identity (Legendre's relation, A&S 17.3.13, from memory); K′ = K(k′), E′ = E(k′).
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 0.999, noNaN: true }), (k) => {
        const kp = Math.sqrt(1 - k * k);
        const a = completeEllipticIntegrals(k, kp);
        const b = completeEllipticIntegrals(kp, k);
        expect(a.E * b.K + b.E * a.K - a.K * b.K).toBeCloseTo(Math.PI / 2, 13);
      }),
    );
  });

  it("give K − E without cancellation for tiny k", () => {
    // Exact series (A&S 17.3.11–12, from memory): K − E = (π/2)(k²/2 + 3k⁴/16 + 15k⁶/128 + O(k⁸)).
    for (const k of [1e-3, 1e-5, 1e-8]) {
      const series = (Math.PI / 2) * ((k * k) / 2 + (3 * k ** 4) / 16 + (15 * k ** 6) / 128);
      expect(relativeError(completeEllipticIntegrals(k).KminusE, series)).toBeLessThan(1e-14);
    }
  });

  it("follow the logarithmic singularity K ≈ ln(4/k′) as k → 1", () => {
    // A&S 17.3.26 (from memory): K = ln(4/k′) + O(k′² ln k′).
    const kp = 1e-9;
    const k = Math.sqrt((1 - kp) * (1 + kp));
    expect(relativeError(completeEllipticIntegrals(k, kp).K, Math.log(4 / kp))).toBeLessThan(1e-14);
    // A&S 17.3.26 (from memory): E → 1 as k → 1.
    expect(completeEllipticIntegrals(k, kp).E).toBeCloseTo(1, 12);
  });

  it("refuse moduli outside 0 ≤ k < 1 and inconsistent complements", () => {
    expect(() => completeEllipticK(1)).toThrow(CalcInputError);
    expect(() => completeEllipticK(-0.1)).toThrow(CalcInputError);
    expect(() => completeEllipticK(Number.NaN)).toThrow(CalcInputError);
    expect(() => completeEllipticIntegrals(0.6, 0.6)).toThrow(/kPrime/);
  });
});
