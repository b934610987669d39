/**
 * Finding a coil's resonances in a divider sweep: the series resonances (|Z| minima, where a
 * driver sees the coil as a low resistance) and parallel resonances (|Z| maxima), each with its
 * impedance and, where the data resolve it, its Q.
 *
 * The rule for "is this a resonance or a wiggle" (documented here because a steward relies on it):
 * 1. Readings are compared as they were taken, Vout/Vin. |Z| rises with the reading, so the
 *    extrema of the readings are exactly the extrema of |Z|, and the noise is judged where it
 *    arises instead of being stretched by the conversion to |Z| (many times, near a parallel peak).
 * 2. The noise comes from the data (noise-estimate.ts): residuals of each point against the straight
 *    line through its neighbours give, robustly, a part proportional to the reading and a fixed
 *    floor, σ_i = √((relative·m_i)² + absolute²), times a factor for noisier stretches (blocks of
 *    128 points). The floor matters at the bottom of a deep dip, where it may be most of the reading.
 * 3. A minimum counts only if the curve rises from it by more than z·√(σ_a² + σ_b²) on BOTH sides
 *    before the next counted maximum (and vice versa): a hysteresis ("zig-zag") walk through the
 *    data, one pass. z is set so that pure Gaussian noise produces a false pair with probability
 *    below 0.1 % over the whole sweep: a union bound over all n(n−1)/2 pairs of samples gives
 *    z = Φ⁻¹(1 − 0.001/(n(n−1)/2)), about 5.3 for 200 points and 7.3 for 100 000 (the bound is loose).
 *    Minima and maxima therefore alternate, as the resonances of a lossless one-port must
 *    (Foster's reactance theorem, R. M. Foster, Bell Syst. Tech. J. 3, 1924 — from memory).
 * 4. Extrema at the ends of the sweep are not reported: without data on both sides they are not
 *    known to be resonances.
 * Not covered: a single wild reading (a glitch far outside the noise) looks like a sharp pair of
 * resonances; the fit then reports it with no Q. Repeat such a sweep.
 * Readings at or above the source amplitude are refused, as in dividerImpedance: a passive divider
 * cannot show them, so the probe, its attenuation setting or the recorded Vin is wrong.
 */
import normalQuantile from "@stdlib/stats-base-dists-normal-quantile";
import { CalcInputError, requirePositive } from "./errors";
import { estimateNoise, noiseAt } from "./noise-estimate";
import { fitResonance } from "./resonance-fit";
import { borrowScratch } from "./scratch-buffers";
import { findTurningPoints } from "./turning-points";

/** One reading: frequency in Hz, amplitude across the device in V (same measure as sourceAmplitude). */
export interface SweepPoint {
  frequency: number;
  amplitude: number;
}

export interface SweepInput {
  /** R between generator and device, Ω. */
  seriesResistance: number;
  /** Generator amplitude Vin, V (peak or peak-to-peak, like the readings). */
  sourceAmplitude: number;
  /** Any order, any spacing; no duplicate frequencies. */
  points: readonly SweepPoint[];
}

export interface SeriesResonance {
  /** Hz, from a resonance-model fit around the extremum (resonance-fit.ts), not the raw sample. */
  frequency: number;
  /** One standard error of `frequency`, Hz; omitted when the fit could not judge it (too few samples). */
  frequencyStandardError?: number;
  /** |Z| at resonance (resistive there), Ω. */
  impedance: number;
  /** Q = f₀/Δf of this resonance; omitted unless the data bracket both half-power points. */
  q?: number;
  /** One standard error of `q`; present exactly when `q` is. */
  qStandardError?: number;
}

/** Same fields as a series resonance; `impedance` is the peak |Z|, Ω. */
export type ParallelResonance = SeriesResonance;

export interface SweepAnalysis {
  /** Sorted by frequency. */
  seriesResonances: SeriesResonance[];
  /** Sorted by frequency. */
  parallelResonances: ParallelResonance[];
  /**
   * Noise on the readings as estimated from the sweep itself: standard deviation
   * √((relative·Vout)² + absolute²), relative a fraction of the reading (0.01 = 1 %), absolute in V.
   */
  readingNoise: { relative: number; absolute: number };
}

/** Probability that pure noise yields one false resonance pair anywhere in a sweep. */
const FALSE_ALARM_PROBABILITY = 1e-3;

export function analyzeSweep(input: SweepInput): SweepAnalysis {
  const resistance = requirePositive("seriesResistance", input.seriesResistance);
  const source = requirePositive("sourceAmplitude", input.sourceAmplitude);
  const { f, ratio } = readSortedPoints(input.points, source);
  const n = f.length;

  const noise = estimateNoise(f, ratio, n);
  const pairs = (n * (n - 1)) / 2;
  const z = -normalQuantile(FALSE_ALARM_PROBABILITY / pairs, 0, 1);
  const { turns, kinds } = findTurningPoints(ratio, n, noise, z);

  const seriesResonances: SeriesResonance[] = [];
  const parallelResonances: ParallelResonance[] = [];
  for (let k = 0; k < kinds.length; k++) {
    const kind = kinds[k];
    if (kind === 0) continue;
    const peak = turns[k] as number;
    const fit = fitResonance({
      kind: kind === -1 ? "series" : "parallel",
      f,
      ratio,
      peak,
      from: k > 0 ? (turns[k - 1] as number) : 0,
      to: k + 1 < turns.length ? (turns[k + 1] as number) : n - 1,
      seriesResistance: resistance,
      noiseMargin: z * Math.SQRT2 * noiseAt(noise, peak, ratio[peak] as number),
      relativeNoise: noise.relative,
      absoluteNoise: noise.absolute,
    });
    const resonance: SeriesResonance = { frequency: fit.frequency, impedance: fit.impedance };
    if (fit.frequencyStandardError !== undefined) resonance.frequencyStandardError = fit.frequencyStandardError;
    if (fit.q !== undefined) resonance.q = fit.q;
    if (fit.qStandardError !== undefined) resonance.qStandardError = fit.qStandardError;
    (kind === -1 ? seriesResonances : parallelResonances).push(resonance);
  }
  return {
    seriesResonances,
    parallelResonances,
    readingNoise: { relative: noise.relative, absolute: noise.absolute * source },
  };
}

/**
 * Checks every reading and returns frequencies (Hz) and ratios Vout/Vin sorted by frequency.
 * Already-sorted input (the usual case) costs one pass; otherwise an index sort.
 */
function readSortedPoints(points: readonly SweepPoint[], source: number): { f: Float64Array; ratio: Float64Array } {
  const n = points.length;
  if (n < 3) throw new CalcInputError("points", "at least 3 readings", n);
  const f = borrowScratch("sweep.frequency", n);
  const ratio = borrowScratch("sweep.ratio", n);
  let sorted = true;
  for (let i = 0; i < n; i++) {
    const point = points[i] as SweepPoint;
    const frequency = point.frequency;
    const amplitude = point.amplitude;
    // Comparisons that NaN fails, so one test per bound covers non-finite input too.
    if (!(frequency > 0 && frequency <= Number.MAX_VALUE)) {
      throw new CalcInputError(`points[${i}].frequency`, "a finite frequency above 0 Hz", frequency);
    }
    if (!(amplitude > 0 && amplitude < source)) {
      throw new CalcInputError(
        `points[${i}].amplitude`,
        `a reading above 0 V and below the source amplitude ${source} V (a passive divider cannot show more)`,
        amplitude,
      );
    }
    f[i] = frequency;
    ratio[i] = amplitude / source;
    if (i > 0 && frequency <= (f[i - 1] as number)) sorted = false;
  }
  if (sorted) return { f, ratio };

  const order = new Uint32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  order.sort((a, b) => (f[a] as number) - (f[b] as number) || a - b);
  const fs = borrowScratch("sweep.sortedFrequency", n);
  const rs = borrowScratch("sweep.sortedRatio", n);
  for (let k = 0; k < n; k++) {
    const i = order[k] as number;
    fs[k] = f[i] as number;
    rs[k] = ratio[i] as number;
    if (k > 0 && fs[k] === fs[k - 1]) {
      throw new CalcInputError(
        `points[${i}].frequency`,
        `a frequency not already in the sweep (points[${order[k - 1]}] has it too)`,
        fs[k],
      );
    }
  }
  return { f: fs, ratio: rs };
}
