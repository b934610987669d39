/**
 * Weighted least-squares parabola with its parameter covariance: the small linear fit behind the
 * resonance refinement, kept apart so it can be checked on its own.
 */
import { CalcInputError } from "./errors";

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
  // Inverse of the symmetric normal matrix [s0 s1 s2; s1 s2 s3; s2 s3 s4] by cofactors.
  const c00 = s2 * s4 - s3 * s3;
  const c01 = s2 * s3 - s1 * s4;
  const c02 = s1 * s3 - s2 * s2;
  const c11 = s0 * s4 - s2 * s2;
  const c12 = s1 * s2 - s0 * s3;
  const c22 = s0 * s2 - s1 * s1;
  const det = s0 * c00 + s1 * c01 + s2 * c02;
  if (!(Math.abs(det) > 1e-12 * Math.abs(s0 * s2 * s4)) || !Number.isFinite(det)) return null;
  const inverse = [c00, c01, c02, c01, c11, c12, c02, c12, c22].map((x) => x / det);
  const [i00, i01, i02, , i11, i12, , , i22] = inverse as [number, number, number, number, number, number, number, number, number];
  const a = i00 * t0 + i01 * t1 + i02 * t2;
  const b = i01 * t0 + i11 * t1 + i12 * t2;
  const c = i02 * t0 + i12 * t1 + i22 * t2;
  if (count === 3) return { a, b, c, covariance: null };
  let weightedSquares = 0;
  for (let i = 0; i < count; i++) {
    const ui = u[i] as number;
    const r = (v[i] as number) - (a + ui * (b + ui * c));
    weightedSquares += (w[i] as number) * r * r;
  }
  const residualVariance = weightedSquares / (count - 3);
  return { a, b, c, covariance: Float64Array.from(inverse, (x) => x * residualVariance) };
}
