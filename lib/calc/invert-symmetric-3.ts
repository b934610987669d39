/**
 * Inverse of a symmetric 3×3 matrix, the one piece of linear algebra the least-squares fits here
 * need (normal equations and parameter covariances of three-parameter models).
 */

/**
 * Inverse of [[m00, m01, m02], [m01, m11, m12], [m02, m12, m22]] as a row-major array of 9, or null
 * when the matrix is singular to working precision (|det| ≤ 1e-12 × the product of the diagonal).
 * Source: adjugate over determinant (cofactor expansion; any linear-algebra text).
 */
export function invertSymmetric3(
  m00: number,
  m01: number,
  m02: number,
  m11: number,
  m12: number,
  m22: number,
): Float64Array | null {
  const c00 = m11 * m22 - m12 * m12;
  const c01 = m02 * m12 - m01 * m22;
  const c02 = m01 * m12 - m02 * m11;
  const c11 = m00 * m22 - m02 * m02;
  const c12 = m01 * m02 - m00 * m12;
  const c22 = m00 * m11 - m01 * m01;
  const det = m00 * c00 + m01 * c01 + m02 * c02;
  if (!Number.isFinite(det) || !(Math.abs(det) > 1e-12 * Math.abs(m00 * m11 * m22))) return null;
  return Float64Array.of(c00, c01, c02, c01, c11, c12, c02, c12, c22).map((x) => x / det);
}
