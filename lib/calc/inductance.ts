/**
 * Inductance of a single-layer solenoid (the secondary of a resonant transformer).
 *
 * The main model is the current-sheet solenoid with Nagaoka's coefficient, computed exactly from
 * complete elliptic integrals. Wheeler's 1928 formula is kept as the familiar cross-check: it is good
 * to about 1 % for ℓ/D > 0.4 and drifts badly for short coils.
 *
 * Diameter and length are those of the current sheet: use the diameter to the wire centres and the
 * winding length (turns × pitch). Round-wire corrections (Rosa 1906) are not applied; they lower L by
 * a few tenths of a percent for close-wound coils.
 */
import { VACUUM_PERMEABILITY_H_PER_M } from "./constants";
import { completeEllipticIntegrals } from "./elliptic";
import { requirePositive } from "./errors";

/** Geometry of a single-layer solenoid. */
export interface SolenoidGeometry {
  /** Current-sheet (wire-centre) diameter D, m. */
  readonly diameter: number;
  /** Winding length ℓ, m. */
  readonly length: number;
  /** Number of turns N (may be fractional). */
  readonly turns: number;
}

/** Metres per inch, exact by definition (international inch, 1959). */
const METRES_PER_INCH = 0.0254;

/**
 * Nagaoka's coefficient K (dimensionless, 0 < K < 1) of a current-sheet solenoid.
 * Nagaoka, J. College of Science, Tokyo, 1909: K = 4/(3π k′)·[(k′²/k²)(K(k) − E(k)) + E(k) − k],
 * with k² = D²/(D² + ℓ²), k′ = ℓ/√(D² + ℓ²). Relative accuracy about 1e-14 for ℓ/D ≥ 0.1, falling to
 * about 1e-10 at ℓ/D = 0.001 where E − k is a small difference of numbers near 1.
 * @param diameter current-sheet diameter D, m (any length unit works: only D/ℓ matters)
 * @param length winding length ℓ, m
 */
export function nagaokaCoefficient(diameter: number, length: number): number {
  requirePositive("diameter", diameter);
  requirePositive("length", length);
  const hyp = Math.hypot(diameter, length);
  const k = diameter / hyp;
  const kPrime = length / hyp;
  const { E, KminusE } = completeEllipticIntegrals(Math.min(k, 1), kPrime);
  // k′²/k² = (ℓ/D)² exactly, so no precision is lost forming it from k and k′.
  const lengthOverDiameter = length / diameter;
  // E − k: for short coils both are ≈ 1; 1 − k = k′²/(1 + k) keeps that part of the difference exact.
  const eMinusK = E - 1 + (kPrime * kPrime) / (1 + k);
  const bracket = lengthOverDiameter * lengthOverDiameter * KminusE + eMinusK;
  return (4 / (3 * Math.PI * kPrime)) * bracket;
}

/**
 * Inductance of a single-layer solenoid, H, in the current-sheet model with Nagaoka's coefficient:
 * L = K μ0 π a² N²/ℓ (Nagaoka 1909; tables in Rosa & Grover, Bull. Bureau of Standards 8, 1916).
 */
export function solenoidInductance({ diameter, length, turns }: SolenoidGeometry): number {
  requirePositive("turns", turns);
  const coefficient = nagaokaCoefficient(diameter, length);
  const radius = diameter / 2;
  return (coefficient * VACUUM_PERMEABILITY_H_PER_M * Math.PI * radius * radius * turns * turns) / length;
}

/**
 * Wheeler's approximation, H: L[µH] = a²N²/(9a + 10ℓ) with a and ℓ in inches
 * (H. A. Wheeler, "Simple inductance formulas for radio coils", Proc. IRE 16, 1928). About 1 % for ℓ/D > 0.4.
 */
export function wheelerInductance({ diameter, length, turns }: SolenoidGeometry): number {
  requirePositive("diameter", diameter);
  requirePositive("length", length);
  requirePositive("turns", turns);
  const radiusInches = diameter / 2 / METRES_PER_INCH;
  const lengthInches = length / METRES_PER_INCH;
  const microhenries = (radiusInches * radiusInches * turns * turns) / (9 * radiusInches + 10 * lengthInches);
  return microhenries * 1e-6;
}
