/**
 * Geometry of a single-layer secondary winding: wire length, pitch, turns that fit, aspect ratio.
 * All lengths in metres.
 */
import { CalcInputError, requirePositive } from "./errors";

/**
 * Default ratio of an enamelled wire's overall diameter to its bare copper diameter, used when turns are
 * counted for a close-wound coil. common practice: single- to heavy-build magnet wire is typically 5–12 %
 * over the bare diameter for the fine gauges secondaries use, and hand winding leaves small gaps; 1.08 is a
 * middle value. Pass the measured ratio (or 1 for bare wire) when known.
 */
export const DEFAULT_INSULATION_BUILD_FACTOR = 1.08;

/** Largest build factor accepted: beyond 2 the "insulation" is a spacer and the coil is space-wound. */
const MAX_INSULATION_BUILD_FACTOR = 2;

function requireBuildFactor(factor: number): number {
  requirePositive("insulationBuildFactor", factor);
  if (factor < 1 || factor > MAX_INSULATION_BUILD_FACTOR) {
    throw new CalcInputError("insulationBuildFactor", `a ratio of overall to bare diameter from 1 to ${MAX_INSULATION_BUILD_FACTOR}`, factor);
  }
  return factor;
}

/**
 * Length of wire in a single-layer helical winding, m: N·√((πD)² + p²)
 * (geometry of the circular helix: one turn unrolls to the hypotenuse of a right triangle with legs πD and p).
 * @param diameter diameter of the helix through the wire centres, m
 * @param turns number of turns N
 * @param pitch axial advance per turn p, m
 */
export function helixWireLength({ diameter, turns, pitch }: { diameter: number; turns: number; pitch: number }): number {
  requirePositive("diameter", diameter);
  requirePositive("turns", turns);
  requirePositive("pitch", pitch);
  return turns * Math.hypot(Math.PI * diameter, pitch);
}

/** Winding pitch, m per turn: p = ℓ/N (definition). */
export function windingPitch({ windingLength, turns }: { windingLength: number; turns: number }): number {
  requirePositive("windingLength", windingLength);
  requirePositive("turns", turns);
  return windingLength / turns;
}

/**
 * Turns that fit side by side in a close-wound winding: N = ℓ/(d·b) with b the insulation build factor
 * (overall/bare diameter; default DEFAULT_INSULATION_BUILD_FACTOR, common practice). Not rounded down: a
 * winding may end part-way round, and callers that want whole turns can floor it.
 * @param windingLength ℓ, m
 * @param wireDiameter bare copper diameter d, m
 */
export function closeWoundTurns({
  windingLength,
  wireDiameter,
  insulationBuildFactor = DEFAULT_INSULATION_BUILD_FACTOR,
}: {
  windingLength: number;
  wireDiameter: number;
  insulationBuildFactor?: number;
}): number {
  requirePositive("windingLength", windingLength);
  requirePositive("wireDiameter", wireDiameter);
  return windingLength / (wireDiameter * requireBuildFactor(insulationBuildFactor));
}

/** Length of a close-wound winding of N turns, m: ℓ = N·d·b (inverse of closeWoundTurns). */
export function closeWoundLength({
  turns,
  wireDiameter,
  insulationBuildFactor = DEFAULT_INSULATION_BUILD_FACTOR,
}: {
  turns: number;
  wireDiameter: number;
  insulationBuildFactor?: number;
}): number {
  requirePositive("turns", turns);
  requirePositive("wireDiameter", wireDiameter);
  return turns * wireDiameter * requireBuildFactor(insulationBuildFactor);
}

/**
 * Diameter through the wire centres of a winding on a form, m: D = D_form + d·b
 * (the centre of each turn sits half an overall wire diameter out from the form's surface).
 * This is the diameter the current-sheet inductance and the helix length use. The build factor defaults to 1
 * (bare wire) here because the enamel moves the centre by well under 0.1 % of a secondary's diameter.
 */
export function windingCentreDiameter({
  formDiameter,
  wireDiameter,
  insulationBuildFactor = 1,
}: {
  formDiameter: number;
  wireDiameter: number;
  insulationBuildFactor?: number;
}): number {
  requirePositive("formDiameter", formDiameter);
  requirePositive("wireDiameter", wireDiameter);
  return formDiameter + wireDiameter * requireBuildFactor(insulationBuildFactor);
}

/** Aspect ratio ℓ/D of a winding (dimensionless; the variable of Nagaoka's and Medhurst's tables). */
export function coilAspectRatio({ diameter, length }: { diameter: number; length: number }): number {
  requirePositive("diameter", diameter);
  requirePositive("length", length);
  return length / diameter;
}
