/**
 * Weighted least-squares parabola with its parameter covariance: the small linear fit behind the
 * resonance refinement, kept apart so it can be checked on its own.
 */
import { CalcInputError } from "./errors";
import { invertSymmetric3 } from "./invert-symmetric-3";

export interface QuadraticFit {
  /** v ≈ a + b·u + c·u² */
  a: number;
  b: number;
  c: number;
  /**
   * Covariance of (a, b, c), row-major 3×3, scaled by the residual variance of the fit (the weights
   * need only be relative). Null with exactly three points: nothing is left to estimate scatter from.
   */
  covariance: Float64Array | null;
}

/**
 * Fits v ≈ a + b·u + c·u² to the first `count` entries, minimising Σ w·(v − a − b·u − c·u²)².
 * Returns null when the normal equations are singular (fewer than three distinct u).
 * Keep u of order one (centre and scale it) so the 3×3 system stays well conditioned.
 * Source: weighted linear least squares, Cov = s²·(XᵀWX)⁻¹ with s² = Σw·r²/(N − 3)
 * (e.g. Press et al., Numerical Recipes, §15.4 — from memory).
 */
export function fitWeightedQuadratic(u: Float64Array, v: Float64Array, w: Float64Array, count: number): QuadraticFit | null {
  if (!Number.isInteger(count) || count < 3 || count > u.length || count > v.length || count > w.length) {
    throw new CalcInputError("count", "at least 3 points, no more than the arrays hold", count);
  }
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
  for (let i = 0; i < count; i++) {
    const ui = u[i] as number;
    const wi = w[i] as number;
    const vi = v[i] as number;
    const u2 = ui * ui;
    s0 += wi;
    s1 += wi * ui;
    s2 += wi * u2;
    s3 += wi * u2 * ui;
    s4 += wi * u2 * u2;
    t0 += wi * vi;
    t1 += wi * vi * ui;
    t2 += wi * vi * u2;
  }
  const inverse = invertSymmetric3(s0, s1, s2, s2, s3, s4);
  if (inverse === null) return null;
  const at = (k: number) => inverse[k] as number;
  const a = at(0) * t0 + at(1) * t1 + at(2) * t2;
  const b = at(3) * t0 + at(4) * t1 + at(5) * t2;
  const c = at(6) * t0 + at(7) * t1 + at(8) * t2;
  if (count === 3) return { a, b, c, covariance: null };
  let weightedSquares = 0;
  for (let i = 0; i < count; i++) {
    const ui = u[i] as number;
    const r = (v[i] as number) - (a + ui * (b + ui * c));
    weightedSquares += (w[i] as number) * r * r;
  }
  const residualVariance = weightedSquares / (count - 3);
  return { a, b, c, covariance: inverse.map((x) => x * residualVariance) };
}
