/**
 * Pinning one resonance down between the samples of a divider sweep: its frequency, its impedance
 * and, when the data allow, its Q.
 *
 * Method: a local Lorentzian fit, done as a weighted linear least-squares parabola in f of a
 * transformed reading. Near a series resonance Z = R_s + jX with X ≈ X′·(f − f₀); behind the series
 * resistor R the reading m = |Z/(R + Z)| then obeys exactly
 *   m²/(1 − m²) = (R_s² + X²)/(R(R + 2R_s))   — a parabola in f,
 * and near a parallel resonance Y = G + jB, B ≈ B′·(f − f₀):
 *   1/m² = (1 + RG)² + R²B²                      — a parabola in f as well.
 * Chosen over a three-point parabola in log f/log |Z| because it (1) is exact for an isolated
 * resonance, including the amplitude-only divider's error off resonance (the transform uses the
 * phase the resonance implies), (2) averages noise over every sample near the resonance rather
 * than trusting the three noisiest, and (3) yields the −3 dB bandwidth of the resonance itself
 * (X = ±R_s, or B = ±G) from the same fit, instead of reading the divider output at √2 × its
 * minimum, which underestimates Q unless R ≫ |Z| (docs/references.md, "Sweeps through a series resistor").
 * The three-point log–log parabola remains the fallback for resonances only a sample or two wide.
 */
import { borrowScratch } from "./scratch-buffers";
import { fitWeightedQuadratic } from "./weighted-quadratic-fit";

export type ResonanceKind = "series" | "parallel";

export interface ResonanceEstimate {
  /** Hz */
  frequency: number;
  /** |Z| at resonance (resistive there, so the divider reading is exact), Ω. */
  impedance: number;
  /**
   * f₀/Δf from the −3 dB bandwidth of the resonance. Undefined unless the fit window brackets both
   * half-power points and the fit pins Δf to within MAX_Q_RELATIVE_ERROR (one standard error).
   */
  q?: number;
  /** How the estimate was made: the Lorentzian fit, the three-point fallback, or the raw sample. */
  method: "lorentzian" | "parabola" | "sample";
}

/** Fewest samples in the fit window before a Q is reported: three fix a parabola, two more check it. */
const MIN_POINTS_FOR_Q = 5;
/** Fewest samples between the half-power points: fewer, and the curve's shape there is guessed, not measured. */
const MIN_POINTS_WITHIN_HALF_POWER = 3;
/** Largest relative standard error of the bandwidth for which a Q is still reported. */
export const MAX_Q_RELATIVE_ERROR = 0.1;
/** Refits on f₀ ± Δf until the window stops changing, at most this often. */
const MAX_REFITS = 4;

export interface ResonanceFitInput {
  kind: ResonanceKind;
  /** Frequencies, Hz, strictly increasing. */
  f: Float64Array;
  /** Readings as Vout/Vin, 0 < ratio < 1. */
  ratio: Float64Array;
  /** Index of the extremum sample. */
  peak: number;
  /** Samples from … to (inclusive) may be used; the neighbouring turning points bound them. from < peak < to. */
  from: number;
  to: number;
  /** R of the divider, Ω. */
  seriesResistance: number;
  /**
   * The change in the reading (as a ratio) that noise alone cannot produce near the peak, i.e. the
   * detection threshold: the first window spans at least the samples within it, so a flat, noisy
   * top is fitted on enough samples rather than on its noisiest few.
   */
  noiseMargin: number;
  /** Noise model of the ratio readings (noise-estimate.ts): σ = √((relative·m)² + absolute²). */
  relativeNoise: number;
  absoluteNoise: number;
}

/**
 * Refines one extremum of a sorted sweep; see the module comment for the method.
 * Sources: the resonance forms above (derived; docs/references.md, "Sweeps through a series resistor");
 * Q = f₀/Δf at half power (textbook definition).
 */
export function fitResonance(input: ResonanceFitInput): ResonanceEstimate {
  const { kind, f, ratio, peak, from, to, seriesResistance, noiseMargin } = input;
  const series = kind === "series";
  const transform = series ? seriesTransform : parallelTransform;
  // Pass 1: samples within about twice the half-power reactance of the raw extremum, or within
  // the noise threshold of it, whichever reaches further.
  const mPeak = ratio[peak] as number;
  const vPeak = transform(mPeak);
  const rg = Math.sqrt(vPeak) - 1;
  const vLimit = series ? 5 * vPeak : (1 + rg) * (1 + rg) + 4 * rg * rg;
  const mLimit = series ? mPeak + noiseMargin : mPeak - noiseMargin;
  const inside = (i: number) => {
    const m = ratio[i] as number;
    return transform(m) <= vLimit || (series ? m <= mLimit : m >= mLimit);
  };
  let lo = Math.max(from, peak - 1);
  let hi = Math.min(to, peak + 1);
  while (lo > from && inside(lo - 1)) lo--;
  while (hi < to && inside(hi + 1)) hi++;

  const scratch = borrowScratch("resonance-fit.window", 3 * (to - from + 1));
  const noise = { relative: input.relativeNoise, absolute: input.absoluteNoise };
  let fit = fitWindow(series, f, ratio, lo, hi, scratch, noise);
  // Refits on f₀ ± Δf of the previous fit (|X| ≤ 2R_s), where the Lorentzian form holds.
  // Converged: the last fit was made on its own f₀ ± Δf window (give or take a sample at each end
  // of a well-filled window, which noise can toggle). Otherwise the window was not the
  // Lorentzian's and its Δf is not trusted.
  let converged = false;
  for (let pass = 0; fit !== null && pass <= MAX_REFITS; pass++) {
    const [nextLo, nextHi] = bandWindow(f, peak, from, to, fit.frequency, fit.bandwidth);
    const slack = hi - lo + 1 >= 10 ? 1 : 0;
    if (Math.abs(nextLo - lo) <= slack && Math.abs(nextHi - hi) <= slack) {
      converged = true;
      break;
    }
    if (nextHi - nextLo < 2 || pass === MAX_REFITS) break;
    const next = fitWindow(series, f, ratio, nextLo, nextHi, scratch, noise);
    if (next === null) break;
    fit = next;
    lo = nextLo;
    hi = nextHi;
  }
  if (fit === null) return fitLogParabola(f, ratio, peak, seriesResistance);

  const impedance = series
    ? seriesResistance * (fit.vMin + Math.sqrt(fit.vMin * fit.vMin + fit.vMin))
    : seriesResistance / (Math.sqrt(fit.vMin) - 1);
  const halfBand = fit.bandwidth / 2;
  let withinHalfPower = 0;
  for (let i = lo; i <= hi; i++) if (Math.abs((f[i] as number) - fit.frequency) < halfBand) withinHalfPower++;
  const resolved =
    converged &&
    hi - lo + 1 >= MIN_POINTS_FOR_Q &&
    withinHalfPower >= MIN_POINTS_WITHIN_HALF_POWER &&
    (f[lo] as number) <= fit.frequency - halfBand &&
    (f[hi] as number) >= fit.frequency + halfBand &&
    fit.bandwidthRelativeError <= MAX_Q_RELATIVE_ERROR;
  return {
    frequency: fit.frequency,
    impedance,
    ...(resolved ? { q: fit.frequency / fit.bandwidth } : {}),
    method: "lorentzian",
  };
}

/** Indices of the samples within centre ± halfWidth, grown outward from `peak`, inside from … to. */
function bandWindow(f: Float64Array, peak: number, from: number, to: number, centre: number, halfWidth: number): [number, number] {
  let lo = peak;
  let hi = peak;
  while (lo > from && (f[lo - 1] as number) >= centre - halfWidth) lo--;
  while (hi < to && (f[hi + 1] as number) <= centre + halfWidth) hi++;
  return [lo, hi];
}

/** m²/(1 − m²): parabolic in f through a series resonance. */
function seriesTransform(m: number): number {
  return (m * m) / (1 - m * m);
}

/** 1/m²: parabolic in f through a parallel resonance. */
function parallelTransform(m: number): number {
  return 1 / (m * m);
}

interface WindowFit {
  frequency: number;
  /** The transformed reading at the vertex. */
  vMin: number;
  /** Full −3 dB bandwidth, Hz. */
  bandwidth: number;
  /** Standard error of ln(bandwidth); Infinity when it cannot be estimated. */
  bandwidthRelativeError: number;
}

/**
 * The transformed readings of samples lo … hi against u = (f − centre)/half-width, weighted by
 * 1/σ_v², σ_v = |dv/dm|·σ_m with σ_m² = (relative·m)² + absolute²: dv/dm = 2m/(1 − m²)² (series),
 * −2/m³ (parallel). Null unless the vertex is a minimum inside the window and physically possible.
 */
function fitWindow(
  series: boolean,
  f: Float64Array,
  ratio: Float64Array,
  lo: number,
  hi: number,
  scratch: Float64Array,
  noise: { relative: number; absolute: number },
): WindowFit | null {
  const count = hi - lo + 1;
  if (count < 3) return null;
  const u = scratch.subarray(0, count);
  const v = scratch.subarray(count, 2 * count);
  const w = scratch.subarray(2 * count, 3 * count);
  const fLo = f[lo] as number;
  const fHi = f[hi] as number;
  const centre = (fLo + fHi) / 2;
  const scale = (fHi - fLo) / 2;
  for (let k = 0; k < count; k++) {
    const m = ratio[lo + k] as number;
    u[k] = ((f[lo + k] as number) - centre) / scale;
    const sigmaM2 = noise.relative * noise.relative * m * m + noise.absolute * noise.absolute;
    if (series) {
      const oneMinus = 1 - m * m;
      v[k] = (m * m) / oneMinus;
      const slope = (2 * m) / (oneMinus * oneMinus);
      w[k] = 1 / (slope * slope * sigmaM2);
    } else {
      v[k] = 1 / (m * m);
      const m3 = m * m * m;
      w[k] = (m3 * m3) / (4 * sigmaM2);
    }
  }
  const fit = fitWeightedQuadratic(u, v, w, count);
  if (fit === null || !(fit.c > 0)) return null;
  const { a, b, c } = fit;
  const frequency = centre + (scale * -b) / (2 * c);
  if (!(frequency >= fLo && frequency <= fHi)) return null;
  const vMin = a - (b * b) / (4 * c);
  // Half power: X² = R_s², i.e. c·u² = vMin (series); R²B² = (RG)², i.e. c·u² = (√vMin − 1)² (parallel).
  // d ln(Δf)/d vMin, for the error propagation below.
  let dLogBandDv: number;
  let bandwidth: number;
  if (series) {
    if (!(vMin > 0)) return null;
    bandwidth = 2 * scale * Math.sqrt(vMin / c);
    dLogBandDv = 1 / (2 * vMin);
  } else {
    if (!(vMin > 1)) return null;
    const root = Math.sqrt(vMin);
    bandwidth = (2 * scale * (root - 1)) / Math.sqrt(c);
    dLogBandDv = 1 / (2 * root * (root - 1));
  }
  return { frequency, vMin, bandwidth, bandwidthRelativeError: logBandwidthError(fit.covariance, b, c, dLogBandDv) };
}

/**
 * Standard error of ln Δf by first-order propagation (gᵀ·Cov·g) through vMin = a − b²/(4c) and the
 * −½·ln c that both bandwidth forms share (JCGM 100:2008, GUM §5.1 — from memory).
 */
function logBandwidthError(covariance: Float64Array | null, b: number, c: number, dLogBandDv: number): number {
  if (covariance === null) return Number.POSITIVE_INFINITY;
  const g0 = dLogBandDv;
  const g1 = (-dLogBandDv * b) / (2 * c);
  const g2 = (dLogBandDv * b * b) / (4 * c * c) - 1 / (2 * c);
  const g = [g0, g1, g2];
  let variance = 0;
  for (let r = 0; r < 3; r++) {
    for (let k = 0; k < 3; k++) variance += (g[r] as number) * (covariance[3 * r + k] as number) * (g[k] as number);
  }
  return variance >= 0 ? Math.sqrt(variance) : Number.POSITIVE_INFINITY;
}

/**
 * Fallback: vertex of the parabola through three samples in (ln f, ln|Z|), |Z| from the
 * amplitude-only divider formula (Numerical Recipes, §10.2, parabolic interpolation — from memory).
 */
function fitLogParabola(f: Float64Array, ratio: Float64Array, peak: number, seriesResistance: number): ResonanceEstimate {
  const logZ = (i: number) => Math.log(((ratio[i] as number) * seriesResistance) / (1 - (ratio[i] as number)));
  const xa = Math.log(f[peak - 1] as number), xb = Math.log(f[peak] as number), xc = Math.log(f[peak + 1] as number);
  const ya = logZ(peak - 1), yb = logZ(peak), yc = logZ(peak + 1);
  const p = (xb - xa) * (yb - yc);
  const q = (xb - xc) * (yb - ya);
  const den = 2 * (p - q);
  if (den === 0) return { frequency: f[peak] as number, impedance: Math.exp(yb), method: "sample" };
  const x = Math.min(xc, Math.max(xa, xb - ((xb - xa) * p - (xb - xc) * q) / den));
  // Lagrange form of the same parabola, evaluated at the vertex.
  const y =
    (ya * (x - xb) * (x - xc)) / ((xa - xb) * (xa - xc)) +
    (yb * (x - xa) * (x - xc)) / ((xb - xa) * (xb - xc)) +
    (yc * (x - xa) * (x - xb)) / ((xc - xa) * (xc - xb));
  return { frequency: Math.exp(x), impedance: Math.exp(y), method: "parabola" };
}
