/**
 * Resonant modes of a bare single-layer helix from the sheath-helix model: a second model beside the
 * lumped L–C one, and the reason a secondary's overtones are not odd multiples of its first resonance.
 *
 * Model (S. Sensiper, "Electromagnetic wave propagation on helical structures", Proc. IRE 43(2), 1955;
 * applied to coils by K. L. Corum & J. F. Corum, "RF coils, helical resonators and voltage magnification by
 * coherent spatial modes", Microwave Review 7(2), 2001): the winding is replaced by an anisotropically
 * conducting cylinder of radius a that conducts only along the wire direction, at pitch angle ψ
 * (cot ψ = πD/p). Its axially symmetric slow wave has β² = γ² + k² with γ fixed by the determinantal equation
 *     (γa)² · I₀(γa)K₀(γa) / (I₁(γa)K₁(γa)) = (k a cot ψ)²        (from memory).
 * A coil grounded at its base and open at the top resonates when β ℓ = (2n − 1)π/2.
 * The wave is dispersive — faster than c·sin ψ at low frequency, tending to it at high frequency — so β grows
 * faster than f, and overtones fall below 3×, 5× the first. The model ignores the top load, ground plane, leads
 * and end effects: it describes a bare coil in free space.
 */
import { SPEED_OF_LIGHT_M_PER_S } from "./constants";
import { CalcInputError, requirePositive } from "./errors";
import { scaledBesselI, scaledBesselK } from "./modified-bessel";
import { helixWireLength } from "./secondary-geometry";

/** Left side of the sheath-helix determinantal equation, x² I₀K₀/(I₁K₁) at x = γa (scalings cancel). */
function evaluateDeterminant(x: number): number {
  const i0k0 = scaledBesselI(0, x) * scaledBesselK(0, x);
  const i1k1 = scaledBesselI(1, x) * scaledBesselK(1, x);
  return (x * x * i0k0) / i1k1;
}

/** Bisection in log space on an increasing function g with g(lo) < 0 < g(hi); relative precision ~1e-14. */
function bisectLog(g: (v: number) => number, lo: number, hi: number): number {
  let logLo = Math.log(lo);
  let logHi = Math.log(hi);
  for (let i = 0; i < 200 && logHi - logLo > 1e-14; i += 1) {
    const mid = (logLo + logHi) / 2;
    if (g(Math.exp(mid)) < 0) logLo = mid;
    else logHi = mid;
  }
  return Math.exp((logLo + logHi) / 2);
}

function requireSheathPitch(diameter: number, pitch: number, field: string): void {
  // The sheath replaces discrete turns by a smooth surface: it needs turns much finer than the diameter.
  if (pitch > diameter / 2) {
    throw new CalcInputError(field, "a pitch below half the diameter (the sheath model needs closely spaced turns)", pitch);
  }
}

/** Axial propagation of the sheath helix's slow wave at one frequency. */
export interface HelixPropagation {
  /** Axial phase constant β, rad/m. */
  readonly propagationConstant: number;
  /** Axial phase velocity ω/β, m/s. */
  readonly phaseVelocity: number;
  /** Phase velocity over c (dimensionless). */
  readonly velocityFactor: number;
}

/**
 * Axial phase constant of the sheath helix's n = 0 slow wave (Sensiper, Proc. IRE 43(2), 1955).
 * @param diameter helix diameter through the wire centres, m
 * @param pitch axial advance per turn, m
 * @param frequency Hz
 */
export function sheathHelixPropagation({ diameter, pitch, frequency }: { diameter: number; pitch: number; frequency: number }): HelixPropagation {
  requirePositive("diameter", diameter);
  requirePositive("pitch", pitch);
  requirePositive("frequency", frequency);
  requireSheathPitch(diameter, pitch, "pitch");
  const a = diameter / 2;
  const k = (2 * Math.PI * frequency) / SPEED_OF_LIGHT_M_PER_S;
  const target = (k * a * ((Math.PI * diameter) / pitch)) ** 2;
  // determinant(x) > x² for x > 0 (I₀K₀ > I₁K₁; checked numerically), so x = √target is at or above the root;
  // walk down for the lower bracket.
  const hi = Math.sqrt(target);
  let lo = hi / 2;
  for (let i = 0; i < 400 && evaluateDeterminant(lo) >= target; i += 1) lo /= 2;
  const x = bisectLog((v) => evaluateDeterminant(v) - target, lo, hi);
  const gamma = x / a;
  const beta = Math.hypot(gamma, k);
  const phaseVelocity = (2 * Math.PI * frequency) / beta;
  return { propagationConstant: beta, phaseVelocity, velocityFactor: phaseVelocity / SPEED_OF_LIGHT_M_PER_S };
}

/** One resonant mode of a base-grounded, open-topped helix. */
export interface HelixMode {
  /** Mode number n = 1, 2, 3, … (β ℓ = (2n − 1)π/2). */
  readonly mode: number;
  /** Resonant frequency, Hz. */
  readonly frequency: number;
  /** frequency / first mode's frequency; an odd-multiple picture would give 2n − 1. */
  readonly ratioToFirst: number;
  /** Axial phase velocity over c at this mode. */
  readonly velocityFactor: number;
}

export interface HelixModePrediction {
  readonly modes: HelixMode[];
  /** The naive "wire is a quarter wave" estimate c/(4·wire length), Hz, for comparison. */
  readonly quarterWaveWireFrequency: number;
  /** First mode over the quarter-wave-wire estimate (about 1.6–2.1 for ℓ/D of 2–6). */
  readonly firstModeOverQuarterWave: number;
  readonly assumptions: string[];
}

/**
 * First few resonant modes of a bare helix grounded at its base, from the sheath-helix dispersion
 * (Sensiper 1955; Corum & Corum 2001): solve β(f)·ℓ = (2n − 1)π/2 for f.
 * @param diameter helix diameter through the wire centres, m
 * @param length winding length, m
 * @param turns number of turns
 * @param modeCount how many modes to return, 1–10
 */
export function predictHelixModes({
  diameter,
  length,
  turns,
  modeCount = 3,
}: {
  diameter: number;
  length: number;
  turns: number;
  modeCount?: number;
}): HelixModePrediction {
  requirePositive("diameter", diameter);
  requirePositive("length", length);
  requirePositive("turns", turns);
  if (!Number.isInteger(modeCount) || modeCount < 1 || modeCount > 10) {
    throw new CalcInputError("modeCount", "a whole number from 1 to 10", modeCount);
  }
  const pitch = length / turns;
  requireSheathPitch(diameter, pitch, "turns");
  const a = diameter / 2;
  const cotPsi = (Math.PI * diameter) / pitch;
  const modes: HelixMode[] = [];
  for (let n = 1; n <= modeCount; n += 1) {
    const beta = ((2 * n - 1) * Math.PI) / (2 * length);
    // Solve for free-space k in (0, β): the determinant falls and (k a cot ψ)² rises as k grows.
    const mismatch = (k: number) => (k * a * cotPsi) ** 2 - evaluateDeterminant(a * Math.sqrt((beta - k) * (beta + k)));
    const k = bisectLog(mismatch, beta * 1e-12, beta * (1 - 1e-15));
    const frequency = (k * SPEED_OF_LIGHT_M_PER_S) / (2 * Math.PI);
    modes.push({
      mode: n,
      frequency,
      ratioToFirst: modes.length === 0 ? 1 : frequency / modes[0]!.frequency,
      velocityFactor: k / beta,
    });
  }
  const quarterWaveWireFrequency = SPEED_OF_LIGHT_M_PER_S / (4 * helixWireLength({ diameter, turns, pitch }));
  return {
    modes,
    quarterWaveWireFrequency,
    firstModeOverQuarterWave: modes[0]!.frequency / quarterWaveWireFrequency,
    assumptions: [
      "Sheath-helix model of a bare coil in free space, grounded at its base and open at the top: top load, ground plane, leads and end effects are ignored.",
      "Overtones come out below 3×, 5×… the first because the helix is dispersive; a top load pushes them the other way.",
      "Taking the wire length as a quarter wave underestimates the first resonance; the ratio is shown for comparison.",
    ],
  };
}
