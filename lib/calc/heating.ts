/**
 * Heat-sink warm-up: the first-order (lumped-capacitance) curve T(t) = Ta + ΔT∞·(1 − e^(−t/τ)),
 * fitted to a logged run so a steward can see where the sink is heading and how sure that is.
 * Real stacks have several time constants (docs/references.md, "Heat sink warm-up"): a short run cannot
 * pin down the asymptote, so every fit says how far its extrapolation can be trusted.
 */
import normalQuantile from "@stdlib/stats-base-dists-normal-quantile";
import { CalcInputError, requireFinite, requireNonNegative, requirePositive } from "./errors";
import { invertSymmetric3 } from "./invert-symmetric-3";
import { minimizeScalar } from "./minimize-scalar";

/** Specific heat of aluminium, J/(kg·K): 0.897 J/(g·K) (docs/references.md, "Heat sink warm-up"; EDN). */
export const ALUMINIUM_SPECIFIC_HEAT_J_PER_KG_K = 897;

/** One logged reading: seconds since the power was switched on, sink temperature in °C. */
export interface HeatingSample {
  time: number;
  temperature: number;
}

export type Extrapolation = "reliable" | "uncertain" | "too-short";

export interface HeatingCurve {
  /**
   * Ta, °C: the curve's temperature at t = 0. If the log started after switch-on this is where the
   * curve extrapolates back to, not the room; steadyState and timeConstant are unaffected.
   */
  ambient: number;
  /** ΔT∞, K: the rise the curve is heading for (0 for a run with no rise at all). */
  rise: number;
  /** τ, s. 0 for a run with no rise at all, where any τ fits. */
  timeConstant: number;
  /** Ta + ΔT∞, °C. */
  steadyState: number;
  /** Coefficient of determination; 1 for a perfectly flat run reproduced exactly. */
  rSquared: number;
  /** Standard deviation of the residuals, K (n − 3 degrees of freedom; 0 with three samples). */
  residualStd: number;
  /** One standard error of each figure (same units), from the Jacobian; Infinity where the data cannot determine it. */
  standardErrors: { ambient: number; rise: number; timeConstant: number; steadyState: number };
  /** Time of the last sample, s: how far the run went. */
  duration: number;
  extrapolation: Extrapolation;
  /** One sentence a steward can read next to the figures. */
  explanation: string;
}

/** Grid density for bracketing the minimum over ln τ (the residual is smooth and single-valleyed in ln τ). */
const GRID_PER_DECADE = 4;
/** Precision of ln τ in the final search: far below any run's uncertainty in τ. */
const LOG_TAU_TOLERANCE = 1e-9;

/**
 * Least-squares fit of T(t) = Ta + ΔT∞·(1 − e^(−t/τ)) (lumped-capacitance method; Incropera &
 * DeWitt, Fundamentals of Heat and Mass Transfer — from memory).
 * Method: variable projection (G. H. Golub & V. Pereyra, SIAM J. Numer. Anal. 10(2), 1973 — from
 * memory). For a fixed τ the model is linear in Ta and ΔT∞, solved exactly by a 2×2 least squares;
 * what remains is a one-dimensional search of the residual over ln τ, bracketed on a grid from
 * below the sampling step to 1000× the run and refined by Brent's method (minimize-scalar.ts). Chosen over
 * Levenberg–Marquardt (ml-levenberg-marquardt) because it needs no starting guess and cannot
 * wander to a negative τ or diverge when τ ≫ the run, which is exactly the short-run case this
 * fit must handle; the grid also finds the global minimum over the whole plausible range.
 * Standard errors: s²·(JᵀJ)⁻¹ at the optimum (Gauss–Newton covariance; Numerical Recipes §15.5 — from memory).
 */
export function fitHeatingCurve(samples: readonly HeatingSample[]): HeatingCurve {
  const n = samples.length;
  if (n < 3) throw new CalcInputError("samples", "at least 3 samples", n);
  const t = new Float64Array(n);
  const temperature = new Float64Array(n);
  let minStep = Number.POSITIVE_INFINITY;
  for (let i = 0; i < n; i++) {
    const sample = samples[i] as HeatingSample;
    t[i] = requireNonNegative(`samples[${i}].time`, sample.time);
    temperature[i] = requireFinite(`samples[${i}].temperature`, sample.temperature);
    if (i > 0) {
      const step = (t[i] as number) - (t[i - 1] as number);
      if (!(step > 0)) throw new CalcInputError(`samples[${i}].time`, `later than samples[${i - 1}].time`, sample.time);
      if (step < minStep) minStep = step;
    }
  }
  const duration = t[n - 1] as number;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += temperature[i] as number;
  mean /= n;
  const centred = temperature.map((v) => v - mean);
  let total = 0;
  for (let i = 0; i < n; i++) total += (centred[i] as number) ** 2;
  if (total === 0) return flatCurve(mean, duration);

  // Search ln τ from a twentieth of the smallest step (a step response) to 1000× the run (a line).
  const logLow = Math.log(minStep / 20);
  const logHigh = Math.log(1000 * duration);
  const cells = Math.max(2, Math.ceil(((logHigh - logLow) / Math.LN10) * GRID_PER_DECADE));
  const at = (k: number) => logLow + ((logHigh - logLow) * k) / cells;
  let best = 0;
  let bestRss = Number.POSITIVE_INFINITY;
  for (let k = 0; k <= cells; k++) {
    const rss = projectedFit(t, centred, Math.exp(at(k))).rss;
    if (rss < bestRss) {
      bestRss = rss;
      best = k;
    }
  }
  const logTau = minimizeScalar(
    (logT) => projectedFit(t, centred, Math.exp(logT)).rss,
    at(Math.max(0, best - 1)),
    at(Math.min(cells, best + 1)),
    LOG_TAU_TOLERANCE,
  );
  const tau = Math.exp(logTau);
  const fit = projectedFit(t, centred, tau);
  const ambient = mean + fit.intercept;
  const rise = fit.slope;
  const atUpperBound = logTau > at(cells - 2);
  const errors = standardErrors(t, rise, tau, fit.rss, n);
  const residualStd = n > 3 ? Math.sqrt(fit.rss / (n - 3)) : 0;
  const curve = { ambient, rise, timeConstant: tau, steadyState: ambient + rise, duration };
  const { extrapolation, explanation } = judgeExtrapolation(curve, errors.steadyState, atUpperBound);
  return {
    ...curve,
    rSquared: 1 - fit.rss / total,
    residualStd,
    standardErrors: errors,
    extrapolation,
    explanation,
  };
}

/**
 * For fixed τ: the least-squares intercept and slope of the centred temperatures on
 * φ = 1 − e^(−t/τ), and the residual sum of squares. φ is shifted by its value at the middle sample
 * to keep the sums from cancelling.
 */
function projectedFit(t: Float64Array, centred: Float64Array, tau: number): { intercept: number; slope: number; rss: number } {
  const n = t.length;
  const shift = -Math.expm1(-(t[n >> 1] as number) / tau);
  let sum = 0;
  let sumSquares = 0;
  let cross = 0;
  let total = 0;
  for (let i = 0; i < n; i++) {
    const phi = -Math.expm1(-(t[i] as number) / tau) - shift;
    const y = centred[i] as number;
    sum += phi;
    sumSquares += phi * phi;
    cross += phi * y;
    total += y * y;
  }
  const spread = sumSquares - (sum * sum) / n;
  if (!(spread > 1e-14 * n)) return { intercept: 0, slope: 0, rss: total };
  const slope = cross / spread; // Σ centred = 0, so Σ(φ − φ̄)·y = Σφ·y
  const rss = Math.max(0, total - slope * cross);
  // centred ≈ intercept' + slope·(φ − shift), intercept' = −slope·mean(φ − shift); back to φ itself:
  return { intercept: -slope * (sum / n) - slope * shift, slope, rss };
}

/** Standard errors of Ta, ΔT∞, τ and Ta + ΔT∞ from the Jacobian of the model at the optimum. */
function standardErrors(t: Float64Array, rise: number, tau: number, rss: number, n: number): HeatingCurve["standardErrors"] {
  const none = { ambient: Infinity, rise: Infinity, timeConstant: Infinity, steadyState: Infinity };
  if (n <= 3) return none;
  // Columns: ∂T/∂Ta = 1, ∂T/∂ΔT = 1 − e^(−t/τ), ∂T/∂τ = −ΔT·(t/τ²)·e^(−t/τ).
  let s01 = 0, s02 = 0, s11 = 0, s12 = 0, s22 = 0;
  for (let i = 0; i < n; i++) {
    const ti = t[i] as number;
    const e = Math.exp(-ti / tau);
    const j1 = 1 - e;
    const j2 = (-rise * ti * e) / (tau * tau);
    s01 += j1;
    s02 += j2;
    s11 += j1 * j1;
    s12 += j1 * j2;
    s22 += j2 * j2;
  }
  const inverse = invertSymmetric3(n, s01, s02, s11, s12, s22);
  if (inverse === null) return none;
  const s2 = rss / (n - 3);
  const v = (k: number) => s2 * (inverse[k] as number);
  const sqrt = (x: number) => (x >= 0 ? Math.sqrt(x) : Infinity);
  return {
    ambient: sqrt(v(0)),
    rise: sqrt(v(4)),
    timeConstant: sqrt(v(8)),
    steadyState: sqrt(v(0) + v(4) + 2 * v(1)),
  };
}

/**
 * The run pins the asymptote ("reliable") when it covers at least two time constants and the steady
 * state is known to ±5 % of the rise; it is "too-short" when it covers less than one time constant,
 * when the steady state is uncertain by more than a quarter of the rise, or when the data show no
 * curvature at all (τ at the top of the search). Thresholds: common practice for first-order
 * responses (63 % of the rise after one τ, 86 % after two).
 */
function judgeExtrapolation(
  curve: { rise: number; timeConstant: number; steadyState: number; duration: number },
  steadyError: number,
  atUpperBound: boolean,
): { extrapolation: Extrapolation; explanation: string } {
  const covered = curve.duration / curve.timeConstant;
  const relative = steadyError / Math.abs(curve.rise);
  const plusMinus = Number.isFinite(steadyError)
    ? `± ${steadyError < 1 ? steadyError.toPrecision(1) : steadyError.toFixed(1)} K`
    : "with unknown uncertainty";
  const head = `Steady state ${curve.steadyState.toFixed(1)} °C ${plusMinus}`;
  if (atUpperBound) {
    return {
      extrapolation: "too-short",
      explanation: "The temperature is still rising in a straight line: this run is too short to show where it levels off.",
    };
  }
  if (covered < 1 || !(relative <= 0.25)) {
    return {
      extrapolation: "too-short",
      explanation: `${head}, but the run covers only ${covered.toFixed(1)} time constants: too short to pin down the asymptote.`,
    };
  }
  if (covered < 2 || !(relative <= 0.05)) {
    return {
      extrapolation: "uncertain",
      explanation: `${head}, extrapolated beyond a run of ${covered.toFixed(1)} time constants: treat it as an estimate.`,
    };
  }
  return {
    extrapolation: "reliable",
    explanation: `${head}; the run covers ${covered.toFixed(1)} time constants.`,
  };
}

/** A run whose readings never changed: no rise, nothing to extrapolate, and no NaN. */
function flatCurve(temperature: number, duration: number): HeatingCurve {
  return {
    ambient: temperature,
    rise: 0,
    timeConstant: 0,
    steadyState: temperature,
    rSquared: 1,
    residualStd: 0,
    standardErrors: { ambient: 0, rise: 0, timeConstant: Infinity, steadyState: 0 },
    duration,
    extrapolation: "uncertain",
    explanation: "No temperature change at all in this run: check that the power was on and the sensor is attached.",
  };
}

/** T(t) in °C at `time` s after switch-on. Source: the lumped-capacitance curve above (Incropera & DeWitt — from memory). */
export function temperatureAt(curve: HeatingCurve, time: number): number {
  requireNonNegative("time", time);
  if (curve.rise === 0) return curve.ambient;
  if (curve.timeConstant === 0) return time > 0 ? curve.steadyState : curve.ambient;
  return curve.ambient - curve.rise * Math.expm1(-time / curve.timeConstant);
}

/**
 * Seconds after switch-on at which the curve first reaches `limitC` (°C): t = −τ·ln(1 − (T_lim − Ta)/ΔT∞),
 * defined only while the limit lies between Ta and the asymptote (docs/references.md, "Heat sink warm-up").
 * 0 when the curve starts at or beyond the limit; Infinity when the limit is at or beyond the
 * asymptote, i.e. never reached.
 */
export function timeToReachTemperature(curve: HeatingCurve, limitC: number): number {
  requireFinite("limitC", limitC);
  if (curve.rise === 0) return limitC === curve.ambient ? 0 : Number.POSITIVE_INFINITY;
  const fraction = (limitC - curve.ambient) / curve.rise;
  if (fraction <= 0) return 0;
  if (fraction >= 1) return Number.POSITIVE_INFINITY;
  return -curve.timeConstant * Math.log1p(-fraction);
}

export interface ThermalMass {
  /** Rθ from the body to ambient, K/W. */
  thermalResistance: number;
  /** kg */
  mass: number;
  /** c, J/(kg·K); ALUMINIUM_SPECIFIC_HEAT_J_PER_KG_K for an aluminium sink. */
  specificHeat: number;
}

/** τ = Rθ·m·c, s (lumped capacitance; "Thermal time constant versus specific heat", EDN — docs/references.md). */
export function thermalTimeConstant({ thermalResistance, mass, specificHeat }: ThermalMass): number {
  return (
    requirePositive("thermalResistance", thermalResistance) * requirePositive("mass", mass) * requirePositive("specificHeat", specificHeat)
  );
}

/**
 * Heat flowing into a lumped body, W, from its energy balance: P = m·c·dT/dt + (T − Ta)/Rθ — stored heat plus
 * heat lost to ambient (lumped-capacitance method, Incropera & DeWitt — docs/references.md, "Heat sink warm-up").
 * A sink read before it levels off has dT/dt > 0, so (T − Ta)/Rθ alone under-reads the power: this corrects it.
 */
export function lumpedDissipation(args: { thermalResistance: number; heatCapacityJPerK: number; riseK: number; riseRateKPerS: number }): number {
  const resistance = requirePositive("thermalResistance", args.thermalResistance);
  const capacity = requireNonNegative("heatCapacityJPerK", args.heatCapacityJPerK);
  const rise = requireFinite("riseK", args.riseK);
  const rate = requireFinite("riseRateKPerS", args.riseRateKPerS);
  return Math.max(0, capacity * rate + rise / resistance);
}

/**
 * Coverage factor of a one-sided bound at `confidence` under a normal approximation of the fit's error
 * (large-sample form of the GUM's expanded uncertainty, JCGM 100:2008 §6 — docs/references.md): 1.645 at 0.95.
 */
export function oneSidedCoverageFactor(confidence: number): number {
  if (!(confidence > 0.5 && confidence < 1)) throw new CalcInputError("confidence", "a fraction strictly between 0.5 and 1, e.g. 0.95", confidence);
  return normalQuantile(confidence, 0, 1);
}

/**
 * Upper one-sided confidence bound of the fitted steady state, °C: T∞ + k·u(T∞) (JCGM 100:2008 §6, k from
 * oneSidedCoverageFactor). Infinity when the fit cannot determine u(T∞).
 */
export function steadyStateUpperBound(curve: HeatingCurve, confidence: number): number {
  const k = oneSidedCoverageFactor(confidence);
  const error = curve.standardErrors.steadyState;
  return Number.isFinite(error) ? curve.steadyState + k * error : Number.POSITIVE_INFINITY;
}

/**
 * The pessimistic curve at `confidence`: the rise at its upper bound and τ at its lower bound (each one-sided,
 * JCGM 100:2008 §6), so the curve climbs higher and sooner than the fit. Its time to a limit is a lower bound of the
 * fit's. τ's bound is floored at 0 (an immediate step), and an undetermined figure takes its worst value.
 */
export function pessimisticCurve(curve: HeatingCurve, confidence: number): HeatingCurve {
  const k = oneSidedCoverageFactor(confidence);
  const riseError = curve.standardErrors.rise;
  const tauError = curve.standardErrors.timeConstant;
  const rise = Number.isFinite(riseError) ? Math.max(0, curve.rise) + k * riseError : Number.POSITIVE_INFINITY;
  const timeConstant = Number.isFinite(tauError) ? Math.max(0, curve.timeConstant - k * tauError) : 0;
  return { ...curve, rise, timeConstant, steadyState: curve.ambient + rise };
}

/**
 * Whether a fit can be carried beyond its run: it covers enough of its time constant ("reliable" or "uncertain", see
 * judgeExtrapolation) and the data determine every figure's uncertainty.
 */
export function isUsableFit(curve: HeatingCurve): boolean {
  const e = curve.standardErrors;
  return curve.extrapolation !== "too-short" && curve.rise > 0 && [e.rise, e.timeConstant, e.steadyState].every(Number.isFinite);
}
