/**
 * Pinning one resonance down between the samples of a divider sweep: its frequency with its standard
 * error, its impedance and, when the data allow, its Q with its standard error.
 *
 * Method: a resonance-model fit, done as a weighted linear least-squares quadratic in s = f² of a
 * transformed reading. For a series RLC branch Z = R_s + jX, X = 2πL·(f − f₀²/f) = 2πL·(s − s₀)/f,
 * behind the series resistor R the reading m = |Z/(R + Z)| obeys exactly
 *   m²/(1 − m²)·s = (R_s²·s + (2πL)²·(s − s₀)²)/(R(R + 2R_s))   — a quadratic in s,
 * and for a parallel RLC Y = G + jB, B = 2πC·(s − s₀)/f:
 *   s/m² = (1 + RG)²·s + R²(2πC)²·(s − s₀)²                      — a quadratic in s as well.
 * Both read y(s) = α·s + β·(s − s₀)², three parameters, linear in the quadratic's coefficients.
 * An earlier version fitted a parabola in f (X ≈ X′·(f − f₀)), exact only as Q → ∞: on a broad
 * (Q ≈ 5–10) resonance the reactance is visibly asymmetric in f (f − f₀²/f rises faster below f₀
 * than above), and the vertex of a parabola in f drifted from f₀ by a fraction of the bandwidth,
 * more the more lopsided the window (coarse or uneven steps). This form is exact for an isolated
 * RLC resonance at any Q, averages noise over every sample near the resonance, and yields the Q of
 * the resonance itself instead of reading the divider output at √2 × its minimum, which
 * underestimates Q unless R ≫ |Z| (docs/references.md, "Sweeps through a series resistor").
 * The fit's parameter covariance (scaled by the reduced χ² when the scatter exceeds the noise
 * model) is propagated to f₀ and ln Q (JCGM 100:2008, GUM §5.1 — from memory).
 * The three-point log–log parabola remains the fallback for resonances only a sample or two wide;
 * it reports no standard error.
 */
import { borrowScratch } from "./scratch-buffers";
import { fitWeightedQuadratic } from "./weighted-quadratic-fit";

export type ResonanceKind = "series" | "parallel";

export interface ResonanceEstimate {
  /** Hz */
  frequency: number;
  /**
   * Standard error of `frequency` from the fit, Hz (one σ, first-order propagation of the fit's
   * covariance). Undefined for the three-point fallback and for a fit on exactly three samples,
   * which leave nothing to judge the scatter by.
   */
  frequencyStandardError?: number;
  /** |Z| at resonance (resistive there, so the divider reading is exact), Ω. */
  impedance: number;
  /**
   * f₀/Δf from the −3 dB bandwidth of the resonance. Undefined unless the fit window brackets both
   * half-power points and the fit pins Δf to within MAX_Q_RELATIVE_ERROR (one standard error).
   */
  q?: number;
  /** Standard error of `q` (present exactly when `q` is). */
  qStandardError?: number;
  /** How the estimate was made: the resonance-model fit, the three-point fallback, or the raw sample. */
  method: "lorentzian" | "parabola" | "sample";
}

/** Fewest samples in the fit window before a Q is reported: three fix a parabola, two more check it. */
const MIN_POINTS_FOR_Q = 5;
/** Fewest samples between the half-power points: fewer, and the curve's shape there is guessed, not measured. */
const MIN_POINTS_WITHIN_HALF_POWER = 3;
/** Largest relative standard error of the bandwidth for which a Q is still reported. */
export const MAX_Q_RELATIVE_ERROR = 0.1;
/** Fewest samples a refit window is widened to, so the fit has scatter left to judge itself by. */
const MIN_FIT_POINTS = 6;
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
    ...(fit.frequencyStandardError === null ? {} : { frequencyStandardError: fit.frequencyStandardError }),
    impedance,
    ...(resolved ? { q: fit.q, qStandardError: fit.q * fit.bandwidthRelativeError } : {}),
    method: "lorentzian",
  };
}

/**
 * Indices of the samples within centre ± halfWidth, grown outward from `peak`, inside from … to,
 * then widened a sample at a time (on the side whose next sample is nearer the centre) until it
 * holds MIN_FIT_POINTS: a coarse sweep may have only two or three samples within ±Δf of a sharp
 * resonance, too few to judge the fit's scatter. The model stays exact beyond ±Δf for an isolated
 * resonance; the neighbouring turning points still bound the window.
 */
function bandWindow(f: Float64Array, peak: number, from: number, to: number, centre: number, halfWidth: number): [number, number] {
  let lo = peak;
  let hi = peak;
  while (lo > from && (f[lo - 1] as number) >= centre - halfWidth) lo--;
  while (hi < to && (f[hi + 1] as number) <= centre + halfWidth) hi++;
  while (hi - lo + 1 < MIN_FIT_POINTS && (lo > from || hi < to)) {
    const below = lo > from ? centre - (f[lo - 1] as number) : Number.POSITIVE_INFINITY;
    const above = hi < to ? (f[hi + 1] as number) - centre : Number.POSITIVE_INFINITY;
    if (below <= above) lo--;
    else hi++;
  }
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
  /** Standard error of the frequency, Hz; null when the fit has no covariance (three samples). */
  frequencyStandardError: number | null;
  /** α of the module comment: the transformed reading m²/(1 − m²) or 1/m² at resonance. */
  vMin: number;
  q: number;
  /** Full −3 dB bandwidth f₀/Q, Hz. */
  bandwidth: number;
  /** Standard error of ln Q (= that of ln Δf); Infinity when it cannot be estimated. */
  bandwidthRelativeError: number;
}

/**
 * Fits y = v·s/s_c against u = (s − s_c)/h, s = f², s_c and h the centre and half-width of the
 * window in s, weighted by 1/σ_y², σ_y = (s/s_c)·|dv/dm|·σ_m with σ_m² = (relative·m)² + absolute²:
 * dv/dm = 2m/(1 − m²)² (series), −2/m³ (parallel). In these variables the model of the module
 * comment reads y = α·(1 + u/k) + c·(u − u₀)², k = s_c/h, so the quadratic a + b·u + c·u² gives
 * u₀ as the root of c·u² + 2ck·u + (k·b − a) = 0 nearer zero, α = a − c·u₀², f₀ = √(h·(k + u₀)),
 * Q² = c·k·(k + u₀)/α (series: ω₀L/R_s) or Q = √(c·k·(k + u₀))/(√α − 1) (parallel: ω₀C/G).
 * Null unless the resonance lies inside the window and is physically possible.
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
  const y = scratch.subarray(count, 2 * count);
  const w = scratch.subarray(2 * count, 3 * count);
  const fLo = f[lo] as number;
  const fHi = f[hi] as number;
  const centre = (fLo * fLo + fHi * fHi) / 2;
  const halfWidth = (fHi * fHi - fLo * fLo) / 2;
  const k = centre / halfWidth;
  for (let i = 0; i < count; i++) {
    const m = ratio[lo + i] as number;
    const fi = f[lo + i] as number;
    const s = fi * fi;
    const scale = s / centre;
    u[i] = (s - centre) / halfWidth;
    const sigmaM2 = noise.relative * noise.relative * m * m + noise.absolute * noise.absolute;
    let slope: number;
    if (series) {
      const oneMinus = 1 - m * m;
      y[i] = (scale * m * m) / oneMinus;
      slope = (2 * m) / (oneMinus * oneMinus);
    } else {
      y[i] = scale / (m * m);
      slope = 2 / (m * m * m);
    }
    w[i] = 1 / (scale * scale * slope * slope * sigmaM2);
  }
  const fit = fitWeightedQuadratic(u, y, w, count);
  if (fit === null || !(fit.c > 0)) return null;
  const { a, b, c } = fit;
  const d = (k * b - a) / c;
  if (!(k * k - d > 0)) return null;
  const root = Math.sqrt(k * k - d); // = k + u₀ > 0, i.e. s₀ > 0
  const u0 = -d / (k + root); // the root nearer zero, written without cancellation
  const frequency = Math.sqrt(halfWidth * root);
  if (!(frequency >= fLo && frequency <= fHi)) return null;
  const vMin = a - c * u0 * u0;
  if (series ? !(vMin > 0) : !(vMin > 1)) return null;
  const q = series ? Math.sqrt((c * k * root) / vMin) : Math.sqrt(c * k * root) / (Math.sqrt(vMin) - 1);

  // Gradients with respect to (a, b, c), by implicit differentiation of the root.
  const dU = [1 / (2 * c * root), -k / (2 * c * root), -(u0 * u0 + 2 * k * u0) / (2 * c * root)];
  const dAlpha = [1 - 2 * c * u0 * (dU[0] as number), -2 * c * u0 * (dU[1] as number), -u0 * u0 - 2 * c * u0 * (dU[2] as number)];
  const dFrequency = dU.map((x) => (x * halfWidth) / (2 * frequency));
  const alphaFactor = series ? 1 / (2 * vMin) : 1 / (2 * Math.sqrt(vMin) * (Math.sqrt(vMin) - 1));
  const dLogQ = [0, 1, 2].map((j) => (dU[j] as number) / (2 * root) + (j === 2 ? 1 / (2 * c) : 0) - alphaFactor * (dAlpha[j] as number));
  const covariance = absoluteCovariance(fit.covariance, u, y, w, count, a, b, c);
  const frequencyVariance = covariance === null ? null : quadraticForm(covariance, dFrequency);
  const logQVariance = covariance === null ? null : quadraticForm(covariance, dLogQ);
  return {
    frequency,
    frequencyStandardError: frequencyVariance === null || !(frequencyVariance >= 0) ? null : Math.sqrt(frequencyVariance),
    vMin,
    q,
    bandwidth: frequency / q,
    bandwidthRelativeError: logQVariance === null || !(logQVariance >= 0) ? Number.POSITIVE_INFINITY : Math.sqrt(logQVariance),
  };
}

/**
 * The fit's covariance with the scatter judged against the noise model: the weights are absolute
 * (1/σ² from the sweep's own noise estimate), so Cov = (XᵀWX)⁻¹·max(1, χ²/ν), ν = N − 3 — the
 * reduced χ² only ever widens it, when the samples scatter more than the noise model says (model
 * error, a neighbouring resonance, a glitch). fitWeightedQuadratic scales by χ²/ν itself, which is
 * undone here. (Press et al., Numerical Recipes, §15.4 and §15.6 — from memory.)
 */
function absoluteCovariance(
  covariance: Float64Array | null,
  u: Float64Array,
  y: Float64Array,
  w: Float64Array,
  count: number,
  a: number,
  b: number,
  c: number,
): Float64Array | null {
  if (covariance === null) return null;
  let chiSquare = 0;
  for (let i = 0; i < count; i++) {
    const ui = u[i] as number;
    const r = (y[i] as number) - (a + ui * (b + ui * c));
    chiSquare += (w[i] as number) * r * r;
  }
  const reduced = chiSquare / (count - 3);
  if (!(reduced > 0)) return covariance; // an exact fit: nothing scatters, the covariance is zero
  const factor = Math.max(1, reduced) / reduced;
  return covariance.map((x) => x * factor);
}

/** gᵀ·Cov·g for a 3×3 row-major covariance. */
function quadraticForm(covariance: Float64Array, g: readonly number[]): number {
  let variance = 0;
  for (let r = 0; r < 3; r++) {
    for (let j = 0; j < 3; j++) variance += (g[r] as number) * (covariance[3 * r + j] as number) * (g[j] as number);
  }
  return variance;
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
