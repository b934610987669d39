/**
 * How noisy is a measured curve, judged from the curve alone? The sweep analysis needs this to tell
 * a resonance from a wiggle without asking the user for their scope's noise figure.
 *
 * Model: a reading y carries noise of standard deviation √((relative·y)² + absolute²) — a part
 * proportional to the reading (gain and autoscale jitter) and a fixed floor (the scope's own noise),
 * which dominates at the bottom of a deep dip — times a local factor ≥ 1 for stretches where the
 * data are noisier than that (interference at some frequencies).
 */
import { CalcInputError } from "./errors";
import { borrowScratch } from "./scratch-buffers";
import { selectMedianInPlace } from "./select-median";

/**
 * Smallest relative noise ever assumed: 0.1 % of the reading. Bench amplitude readings are not
 * better than this, and a zero estimate (noise-free synthetic data, or quantised readings that
 * often repeat) must not make every rounding step significant.
 */
export const NOISE_SCALE_FLOOR = 1e-3;

/** log₂ of the points per block for the local factor (128: short enough to follow a changing noise level). */
export const NOISE_BLOCK_SHIFT = 7;
export const NOISE_BLOCK_SIZE = 1 << NOISE_BLOCK_SHIFT;

/** Median of χ² with one degree of freedom, (Φ⁻¹(3/4))²: the median of e² for Gaussian e of unit variance (derived). */
const CHI2_1_MEDIAN = 0.454_936_423_119_572_8;
/** Fewest residuals for a level bin to enter the fit of the noise model. */
const MIN_PER_BIN = 12;
/** Residuals entering the fit of the two-part model at most. */
const LEVEL_FIT_SAMPLES = 8_192;
/** Values per bin median at most: its scatter, about 1.9/√n, is then below 5 %. */
const MAX_PER_MEDIAN = 2_048;
/** Half-octave bins of the reading, down to 2⁻³⁰ of the largest. */
const BINS = 60;
/** Curves longer than this use every 4th residual: ample for two parameters and local factors, at a quarter of the cost. */
const FULL_SAMPLING_LIMIT = 16_384;

export interface NoiseModel {
  /** Standard deviation of the part proportional to the reading, as a fraction of it (≥ NOISE_SCALE_FLOOR). */
  relative: number;
  /** Standard deviation of the fixed floor, in the units of y. */
  absolute: number;
  /**
   * Factor ≥ 1 per block of NOISE_BLOCK_SIZE points (point i in block ⌊(i − 1)/size⌋, clamped) by
   * which the noise there exceeds the model: each block's own estimate widened to its neighbours'.
   * A single 1 when the curve is too short for local estimates.
   */
  blockFactor: Float64Array;
}

/** Index into NoiseModel.blockFactor for point i of a curve. */
export function noiseBlockOf(model: NoiseModel, i: number): number {
  const k = (i - 1) >> NOISE_BLOCK_SHIFT;
  const last = model.blockFactor.length - 1;
  return k < 0 ? 0 : k > last ? last : k;
}

/** Standard deviation of the noise on a reading y at point i, in the units of y. */
export function noiseAt(model: NoiseModel, i: number, y: number): number {
  const f = model.blockFactor[noiseBlockOf(model, i)] as number;
  return f * Math.sqrt(model.relative * model.relative * y * y + model.absolute * model.absolute);
}

/**
 * Estimates the noise model of positive readings y(x), x strictly increasing and unevenly spaced,
 * in O(n). Each interior point is compared with the straight line through its neighbours; the
 * "pseudo-residual" e_i = (a·y₍i−1₎ + b·y₍i+1₎ − y_i)/√(a² + b² + 1), a = (x₍i+1₎ − x_i)/(x₍i+1₎ − x₍i−1₎),
 * b = 1 − a, has the variance of the noise wherever the curve is locally straight
 * (T. Gasser, L. Sroka & C. Jennen-Steinmetz, "Residual variance and residual pattern in nonlinear
 * regression", Biometrika 73(3), 1986 — from memory).
 * Robust throughout: the residuals are grouped into half-octave bins of the reading; in each bin the
 * median e², divided by the χ²₁ median, estimates relative²·y² + absolute², and a weighted L1 fit
 * of the logarithms over the bins gives both parts. Medians barely move for the few
 * large residuals where the curve bends sharply (at resonances); where they do (a sparse sweep
 * with most samples on bends) the estimate errs large, which only makes detection more cautious.
 * Exact zeros are left out so that quantised readings, which often repeat, do not report zero
 * noise. Local factors: the same median test on residuals scaled by the model, per block of 128 points.
 */
export function estimateNoise(x: Float64Array, y: Float64Array, length = x.length): NoiseModel {
  if (!Number.isInteger(length) || length < 3 || length > x.length || length > y.length) {
    throw new CalcInputError("length", "at least 3 points, no more than the arrays hold", length);
  }
  const count = length - 2;
  const stride = count > FULL_SAMPLING_LIMIT ? 4 : 1;
  const sampled = Math.ceil(count / stride);
  const squares = borrowScratch("noise.squares", sampled);
  const levels = borrowScratch("noise.levels", sampled);
  let used = 0;
  let top = 0;
  for (let i = 1; i <= count; i += stride) {
    // With h₁, h₂ the two steps, a = h₂/(h₁ + h₂), b = h₁/(h₁ + h₂), so
    // e² = (h₂y₀ + h₁y₂ − (h₁ + h₂)y₁)² / (h₁² + h₂² + (h₁ + h₂)²): one division, no root.
    const x1 = x[i] as number;
    const h1 = x1 - (x[i - 1] as number);
    const h2 = (x[i + 1] as number) - x1;
    const h = h1 + h2;
    const yi = y[i] as number;
    const num = h2 * (y[i - 1] as number) + h1 * (y[i + 1] as number) - h * yi;
    squares[used] = (num * num) / (h1 * h1 + h2 * h2 + h * h);
    levels[used++] = yi;
    if (yi > top) top = yi;
  }
  const { relative, absolute } = fitLevelModel(squares, levels, used, top);
  return { relative, absolute, blockFactor: estimateBlockFactors(squares, levels, used, stride, count, relative, absolute) };
}

/** The two-part model from binned medians; relative only when the readings span too few levels. */
function fitLevelModel(squares: Float64Array, levels: Float64Array, used: number, top: number): { relative: number; absolute: number } {
  // Counting sort of the residuals into half-octave bins of the reading; two parameters need no
  // more than LEVEL_FIT_SAMPLES of them, evenly spread.
  const thin = Math.ceil(used / LEVEL_FIT_SAMPLES);
  const binOf = new Uint8Array(used);
  const counts = new Int32Array(BINS + 1);
  const levelSquares = new Float64Array(BINS);
  for (let k = 0; k < used; k += thin) {
    if ((squares[k] as number) === 0) continue;
    const level = levels[k] as number;
    const b = Math.min(BINS - 1, Math.max(0, Math.floor(-2 * Math.log2(level / top))));
    binOf[k] = b;
    counts[b + 1] = (counts[b + 1] as number) + 1;
    levelSquares[b] = (levelSquares[b] as number) + level * level;
  }
  for (let b = 0; b < BINS; b++) counts[b + 1] = (counts[b + 1] as number) + (counts[b] as number);
  const grouped = borrowScratch("noise.grouped", Math.max(1, used));
  const cursor = counts.slice(0, BINS);
  for (let k = 0; k < used; k += thin) {
    if ((squares[k] as number) === 0) continue;
    const b = binOf[k] as number;
    grouped[cursor[b] as number] = squares[k] as number;
    cursor[b] = (cursor[b] as number) + 1;
  }
  // Per bin: v = median e² / χ²₁ median (an estimate of the noise variance there), q = mean y².
  const vs: number[] = [];
  const qs: number[] = [];
  const ns: number[] = [];
  for (let b = 0; b < BINS; b++) {
    const start = counts[b] as number;
    const n = (counts[b + 1] as number) - start;
    if (n < MIN_PER_BIN) continue;
    // A well-filled bin is thinned to at most MAX_PER_MEDIAN evenly spread values first.
    const step = Math.ceil(n / MAX_PER_MEDIAN);
    let kept = 0;
    for (let j = start; j < start + n; j += step) grouped[start + kept++] = grouped[j] as number;
    vs.push(selectMedianInPlace(grouped.subarray(start, start + kept)) / CHI2_1_MEDIAN);
    qs.push((levelSquares[b] as number) / n);
    ns.push(n);
  }
  let r = 0;
  let a = 0;
  if (vs.length >= 2) {
    // v = r·(q + c), c = (absolute/relative)², the level² where both parts are equal. For each
    // candidate c (none, or at a bin's level) the best r is the weighted median of ln v − ln(q + c),
    // and the c with the least weighted absolute deviation wins: an L1 fit in logarithms, which
    // neither a stray bin nor one with an accidentally tiny median can drag far.
    let bestCost = Number.POSITIVE_INFINITY;
    for (const c of [0, ...qs]) {
      const d = vs.map((v, k) => Math.log(v) - Math.log((qs[k] as number) + c));
      const centre = weightedMedian(d, ns);
      const cost = d.reduce((sum, x, k) => sum + (ns[k] as number) * Math.abs(x - centre), 0);
      if (cost < bestCost * (1 - 1e-12)) {
        bestCost = cost;
        r = Math.exp(centre);
        a = r * c;
      }
    }
  } else {
    // Too few levels to separate the parts: all of it relative, from every non-zero residual.
    let n = 0;
    for (let k = 0; k < used; k++) {
      const sq = squares[k] as number;
      if (sq > 0) grouped[n++] = sq / (levels[k] as number) ** 2;
    }
    r = n === 0 ? 0 : selectMedianInPlace(grouped, n) / CHI2_1_MEDIAN;
  }
  return { relative: Math.max(NOISE_SCALE_FLOOR, Math.sqrt(r)), absolute: Math.sqrt(a) };
}

/** The value that splits the total weight in half (the lower one on an exact tie). */
function weightedMedian(values: number[], weights: number[]): number {
  const order = values.map((_, k) => k).sort((i, j) => (values[i] as number) - (values[j] as number));
  const half = weights.reduce((sum, w) => sum + w, 0) / 2;
  let running = 0;
  for (const k of order) {
    running += weights[k] as number;
    if (running >= half) return values[k] as number;
  }
  return values[order[order.length - 1] as number] as number;
}

/** Local excess over the model per block of points, widened to neighbours; [1] for short curves. */
function estimateBlockFactors(
  squares: Float64Array,
  levels: Float64Array,
  used: number,
  stride: number,
  count: number,
  relative: number,
  absolute: number,
): Float64Array {
  if (count < 4 * NOISE_BLOCK_SIZE) return Float64Array.of(1);
  const blocks = Math.ceil(count / NOISE_BLOCK_SIZE);
  const perBlock = NOISE_BLOCK_SIZE / stride;
  const raw = new Float64Array(blocks);
  const scratch = new Float64Array(perBlock);
  for (let k = 0; k < blocks; k++) {
    let n = 0;
    for (let j = k * perBlock; j < Math.min(used, (k + 1) * perBlock); j++) {
      const s = squares[j] as number;
      const level = levels[j] as number;
      if (s > 0) scratch[n++] = s / (relative * relative * level * level + absolute * absolute);
    }
    raw[k] = n === 0 ? 1 : Math.sqrt(selectMedianInPlace(scratch, n) / CHI2_1_MEDIAN);
  }
  const factors = new Float64Array(blocks);
  for (let k = 0; k < blocks; k++) {
    const left = k > 0 ? (raw[k - 1] as number) : 1;
    const right = k + 1 < blocks ? (raw[k + 1] as number) : 1;
    factors[k] = Math.max(1, left, raw[k] as number, right);
  }
  return factors;
}
