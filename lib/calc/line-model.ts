/**
 * A synthetic secondary, seen from its grounded base: a lossy, optionally dispersive transmission
 * line, open at the top except for a top-load capacitance. It produces impedance curves with
 * alternating series (|Z| minimum) and parallel (|Z| maximum) resonances whose spacing is NOT the
 * odd-multiple ladder of an ideal quarter-wave line (docs/references.md: "Never assume fₙ = (2n − 1)·f₁").
 * Used for demo data and to test the sweep analysis against known answers; it is not a predictor
 * of a real coil's resonances (the sheath-helix model is the physical one).
 */
import { CalcInputError, requireInRange, requireNonNegative, requirePositive } from "./errors";
import type { SweepPoint } from "./sweep";
import type { SeededRandom } from "./seeded-random";
import { createSeededRandom } from "./seeded-random";

/**
 * A complex number. A two-field local type instead of a library: the model needs only a handful
 * of operations (multiply, divide, tanh, magnitude), and lib/calc stays dependency-free.
 */
export interface Complex {
  re: number;
  im: number;
}

export interface LineModelParameters {
  /** Where the first series resonance (first |Z| minimum) must land, Hz, top load included. */
  firstSeriesResonance: number;
  /** Characteristic impedance Z0 of the line, Ω (taken as real: the low-loss approximation). */
  characteristicImpedance: number;
  /** Top-load capacitance at the open end, F. 0 or omitted: a bare open line. */
  topCapacitance?: number;
  /**
   * Dispersion exponent p ≥ 0: the electrical length grows as f^(1+p). 0 is a TEM line; p > 0
   * slows the wave at higher frequencies, as on a helix, pulling overtones below 3×, 5× …
   * For a bare line the series resonances sit at f₁·(2n − 1)^(1/(1+p)).
   */
  dispersionExponent?: number;
  /**
   * Quality factor of each resonance of the bare line (without the top load; a top load stores
   * energy without loss and raises the loaded Q). Give this or attenuationNepers; neither means lossless.
   */
  q?: number;
  /** Total line attenuation αℓ in nepers at firstSeriesResonance, scaling like the electrical length. */
  attenuationNepers?: number;
}

/** A resolved model; build it with createLineModel. */
export interface LineModel {
  readonly firstSeriesResonance: number;
  readonly characteristicImpedance: number;
  readonly topCapacitance: number;
  readonly dispersionExponent: number;
  /** Bare-line resonance Q; Infinity when lossless. */
  readonly q: number;
  /** Electrical length βℓ at firstSeriesResonance, rad (π/2 for a bare line, less with a top load). */
  readonly electricalLengthAtFirst: number;
}

/**
 * Resolves the parameters so that the lossless line has its first zero exactly at f₁.
 * Source: lossless Z_in = Z0·(Z_L + jZ0 tan θ)/(Z0 + jZ_L tan θ) with Z_L = 1/(jωC) vanishes when
 * tan θ = 1/(ωC·Z0) (telegrapher's equations; Pozar, Microwave Engineering, ch. 2 — from memory).
 */
export function createLineModel(parameters: LineModelParameters): LineModel {
  const f1 = requirePositive("firstSeriesResonance", parameters.firstSeriesResonance);
  const z0 = requirePositive("characteristicImpedance", parameters.characteristicImpedance);
  const topCapacitance = requireNonNegative("topCapacitance", parameters.topCapacitance ?? 0);
  // Helices only ever slow down with frequency; a top load supplies the opposite tendency.
  const p = requireInRange("dispersionExponent", parameters.dispersionExponent ?? 0, 0, 1);
  const theta1 = Math.atan2(1, 2 * Math.PI * f1 * topCapacitance * z0);
  if (parameters.q !== undefined && parameters.attenuationNepers !== undefined) {
    throw new CalcInputError("attenuationNepers", "to be omitted when q is given (one loss figure, not two)");
  }
  let q = Number.POSITIVE_INFINITY;
  if (parameters.q !== undefined) q = requirePositive("q", parameters.q);
  if (parameters.attenuationNepers !== undefined) {
    // Q = ω·(dβ/dω)/(2α) with βℓ ∝ ω^(1+p) (Pozar, Q of a line resonator — from memory).
    q = ((1 + p) * theta1) / (2 * requirePositive("attenuationNepers", parameters.attenuationNepers));
  }
  return {
    firstSeriesResonance: f1,
    characteristicImpedance: z0,
    topCapacitance,
    dispersionExponent: p,
    q,
    electricalLengthAtFirst: theta1,
  };
}

/**
 * Input impedance at the base, Ω, at `frequency` Hz.
 * Source: Z_in = Z0·(Z_L + Z0 tanh γℓ)/(Z0 + Z_L tanh γℓ), Z_L = 1/(jωC_top) (telegrapher's
 * equations; Pozar, Microwave Engineering, ch. 2 — from memory), rewritten with y = Z0/Z_L = jωC·Z0
 * as Z0·(1 + y·t)/(y + t), t = tanh γℓ, so that C_top = 0 needs no special case.
 * Loss: αℓ = (1+p)·βℓ/(2Q), which gives every bare-line resonance the same Q = ω·β′/(2α).
 */
export function lineModelImpedance(model: LineModel, frequency: number): Complex {
  requirePositive("frequency", frequency);
  const theta = model.electricalLengthAtFirst * (frequency / model.firstSeriesResonance) ** (1 + model.dispersionExponent);
  const alpha = Number.isFinite(model.q) ? ((1 + model.dispersionExponent) * theta) / (2 * model.q) : 0;
  const t = tanhComplex(alpha, theta);
  const b = 2 * Math.PI * frequency * model.topCapacitance * model.characteristicImpedance;
  // numerator 1 + jb·t, denominator jb + t
  const numRe = 1 - b * t.im;
  const numIm = b * t.re;
  const denRe = t.re;
  const denIm = b + t.im;
  const den = denRe * denRe + denIm * denIm;
  const z0 = model.characteristicImpedance;
  return {
    re: (z0 * (numRe * denRe + numIm * denIm)) / den,
    im: (z0 * (numIm * denRe - numRe * denIm)) / den,
  };
}

/** tanh(x + jy), stable for large x. Source: tanh(x+jy) = (sinh 2x + j sin 2y)/(cosh 2x + cos 2y) (textbook identity). */
function tanhComplex(x: number, y: number): Complex {
  if (x === 0) return { re: 0, im: Math.tan(y) };
  if (x > 20) return { re: 1, im: 0 };
  const den = Math.cosh(2 * x) + Math.cos(2 * y);
  return { re: Math.sinh(2 * x) / den, im: Math.sin(2 * y) / den };
}

/** Reading noise of a simulated scope: standard deviations, added independently. */
export interface SweepNoise {
  /** Proportional to the reading (an autoscaled amplitude measurement), e.g. 0.01 for 1 %. */
  relative?: number;
  /** Fixed, in volts (the scope's noise floor). */
  absolute?: number;
}

export interface SimulatedSweepInput {
  model: LineModel;
  /** Ω */
  seriesResistance: number;
  /** Generator amplitude, V. */
  sourceAmplitude: number;
  /** Hz, any order and spacing. */
  frequencies: ArrayLike<number>;
  noise?: SweepNoise;
  /** Source of the noise; defaults to createSeededRandom(1) so a run is always reproducible. */
  rng?: SeededRandom;
}

/**
 * The amplitudes a divider sweep of the model would show: |Vout| = Vin·|Z/(R + Z)| (docs/references.md,
 * "Sweeps through a series resistor"), plus optional Gaussian reading noise. A noisy reading is
 * folded to its magnitude, as an amplitude measurement never reads below zero.
 */
export function simulateSweep(input: SimulatedSweepInput): SweepPoint[] {
  const r = requirePositive("seriesResistance", input.seriesResistance);
  const vin = requirePositive("sourceAmplitude", input.sourceAmplitude);
  const relative = requireNonNegative("noise.relative", input.noise?.relative ?? 0);
  const absolute = requireNonNegative("noise.absolute", input.noise?.absolute ?? 0);
  const rng = input.rng ?? createSeededRandom(1);
  const points: SweepPoint[] = [];
  for (let i = 0; i < input.frequencies.length; i++) {
    const frequency = input.frequencies[i] as number;
    requirePositive(`frequencies[${i}]`, frequency);
    const z = lineModelImpedance(input.model, frequency);
    const clean = (vin * Math.hypot(z.re, z.im)) / Math.hypot(r + z.re, z.im);
    let amplitude = clean;
    if (relative > 0) amplitude += clean * relative * rng.normal();
    if (absolute > 0) amplitude += absolute * rng.normal();
    points.push({ frequency, amplitude: Math.abs(amplitude) });
  }
  return points;
}
