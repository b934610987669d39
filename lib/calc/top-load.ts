/**
 * Free-space capacitance of an isolated top load (the conductor on top of a secondary).
 *
 * These are the values of the shape alone, far from everything. Mounted on a coil above ground a top
 * load's effective capacitance differs from them by tens of percent; lib/calc's build prediction
 * therefore calibrates an environment term from measured sweeps.
 */
import { VACUUM_PERMITTIVITY_F_PER_M as EPSILON_0 } from "./constants";
import { CalcInputError, requireNonNegative, requirePositive } from "./errors";
import { sumToroidalCapacitanceSeries } from "./toroidal-legendre";

/** A top load's shape and size; all dimensions in metres. */
export type TopLoadShape =
  | { readonly kind: "sphere"; readonly diameter: number }
  | { readonly kind: "disc"; readonly diameter: number }
  /** outerDiameter = 2(R + r) across the whole ring; tubeDiameter = 2r. */
  | { readonly kind: "toroid"; readonly outerDiameter: number; readonly tubeDiameter: number }
  /** A closed can: a cylinder with both ends closed. */
  | { readonly kind: "cylinder"; readonly diameter: number; readonly height: number };

/** Thinnest hole the toroid series accepts: major radius R at least 1.001 × tube radius r. */
export const TOROID_MIN_MAJOR_TO_TUBE_RADIUS = 1.001;
/** Thinnest tube accepted: R/r up to 1e6 (beyond that the ring is a wire, not a top load). */
export const TOROID_MAX_MAJOR_TO_TUBE_RADIUS = 1e6;
/** Tallest can for the cylinder fit: h/a ≤ 8, the range checked against a boundary-element solution. */
export const CYLINDER_MAX_HEIGHT_TO_RADIUS = 8;

/** Isolated sphere, F: C = 4π ε0 r (textbook electrostatics). */
export function sphereCapacitance(diameter: number): number {
  requirePositive("diameter", diameter);
  return 4 * Math.PI * EPSILON_0 * (diameter / 2);
}

/** Isolated thin disc, F: C = 8 ε0 r (textbook electrostatics; 2/π of the sphere, Encyclopaedia Britannica 11th ed., "Electrostatics"). */
export function discCapacitance(diameter: number): number {
  requirePositive("diameter", diameter);
  return 8 * EPSILON_0 * (diameter / 2);
}

/**
 * Isolated torus, F, from the exact series in toroidal functions (W. R. Smythe, Static and Dynamic
 * Electricity; Morse & Feshbach 1953, p. 1304): cosh η0 = R/r, c = √(R² − r²),
 * C = 8 ε0 c [Q₋½/P₋½ + 2 Σ_{n≥1} Q_{n−½}/P_{n−½}] at cosh η0. Accurate to about 1e-14 relative.
 */
export function toroidCapacitance({ outerDiameter, tubeDiameter }: { outerDiameter: number; tubeDiameter: number }): number {
  requirePositive("outerDiameter", outerDiameter);
  requirePositive("tubeDiameter", tubeDiameter);
  const tubeRadius = tubeDiameter / 2;
  const majorRadius = outerDiameter / 2 - tubeRadius;
  const ratio = majorRadius / tubeRadius;
  if (!(ratio >= TOROID_MIN_MAJOR_TO_TUBE_RADIUS)) {
    throw new CalcInputError(
      "tubeDiameter",
      `less than half the outer diameter, leaving a hole (R/r ≥ ${TOROID_MIN_MAJOR_TO_TUBE_RADIUS})`,
      tubeDiameter,
    );
  }
  if (ratio > TOROID_MAX_MAJOR_TO_TUBE_RADIUS) {
    throw new CalcInputError("tubeDiameter", `at least 1e-6 of the ring radius (R/r ≤ ${TOROID_MAX_MAJOR_TO_TUBE_RADIUS})`, tubeDiameter);
  }
  // c = √(R² − r²) written as a product to keep digits when R is close to r.
  const focalRadius = Math.sqrt((majorRadius - tubeRadius) * (majorRadius + tubeRadius));
  return 8 * EPSILON_0 * focalRadius * sumToroidalCapacitanceSeries(ratio);
}

/**
 * Isolated closed cylinder ("can") of radius a and height h, F: C ≈ [8 + 4.1 (h/a)^0.76] ε0 a.
 * Origin of this fit unconfirmed (see docs/references.md); it tends to the thin disc 8 ε0 a as h → 0
 * and agrees with a boundary-element check within 0.3 % for h/a ≤ 8, so taller cans are refused.
 */
export function cylinderCapacitance({ diameter, height }: { diameter: number; height: number }): number {
  requirePositive("diameter", diameter);
  requireNonNegative("height", height);
  const radius = diameter / 2;
  const aspect = height / radius;
  if (aspect > CYLINDER_MAX_HEIGHT_TO_RADIUS) {
    throw new CalcInputError("height", `at most ${CYLINDER_MAX_HEIGHT_TO_RADIUS / 2} times the diameter (h/a ≤ 8, the range of the fit)`, height);
  }
  return (8 + 4.1 * aspect ** 0.76) * EPSILON_0 * radius;
}

/** Free-space capacitance of a top load, F, dispatched on its shape (see the per-shape functions for sources). */
export function topLoadCapacitance(shape: TopLoadShape): number {
  switch (shape.kind) {
    case "sphere":
      return sphereCapacitance(shape.diameter);
    case "disc":
      return discCapacitance(shape.diameter);
    case "toroid":
      return toroidCapacitance(shape);
    case "cylinder":
      return cylinderCapacitance(shape);
    default: {
      const unknown: never = shape;
      throw new CalcInputError("kind", 'one of "sphere", "disc", "toroid", "cylinder"', (unknown as { kind?: unknown }).kind);
    }
  }
}
