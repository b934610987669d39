/**
 * How noisy is a measured curve, judged from the curve alone? The sweep analysis needs this to tell
 * a resonance from a wiggle without asking the user for their scope's noise figure.
 */
import { CalcInputError } from "./errors";
import { selectMedianInPlace } from "./select-median";

/**
 * Smallest relative noise ever assumed: 0.1 % of the reading. Bench amplitude readings are not
 * better than this, and a zero estimate (noise-free synthetic data, or quantised readings that
 * often repeat) must not make every rounding step significant.
 */
export const NOISE_SCALE_FLOOR = 1e-3;

/** log₂ of the points per block for the local scale (128: short enough to follow a changing noise level). */
export const NOISE_BLOCK_SHIFT = 7;
export const NOISE_BLOCK_SIZE = 1 << NOISE_BLOCK_SHIFT;
/**
 * Within a block only every STRIDE-th residual enters the median: 32 residuals per block scatter by
 * about 20 %, which the widening to neighbouring blocks absorbs, at a quarter of the cost.
 */
const STRIDE = 4;

/** MAD → standard deviation for Gaussian noise: 1/Φ⁻¹(3/4) (Hampel, J. Amer. Statist. Assoc. 69, 1974 — from memory). */
const MAD_TO_SIGMA = 1.482_602_218_505_602;

export interface NoiseScale {
  /** Robust standard deviation of the relative noise (≈ of ln value) over the whole curve, ≥ NOISE_SCALE_FLOOR. */
  global: number;
  /**
   * Local scale per block of NOISE_BLOCK_SIZE points (point i belongs to block ⌊(i − 1)/size⌋,
   * clamped), each the largest of its own and its neighbours' estimates and never below `global`.
   * A single block holding `global` when the curve is too short for local estimates.
   */
  block: Float64Array;
}

/** Index into NoiseScale.block for point i of a curve. */
export function noiseBlockOf(scale: NoiseScale, i: number): number {
  const k = (i - 1) >> NOISE_BLOCK_SHIFT;
  const last = scale.block.length - 1;
  return k < 0 ? 0 : k > last ? last : k;
}

/**
 * Robust relative noise of positive values y(x), x strictly increasing and unevenly spaced. Each interior point is compared with the straight line through its neighbours;
 * the "pseudo-residual" e_i = (a·y₍i−1₎ + b·y₍i+1₎ − y_i)/√(a² + b² + 1), a = (x₍i+1₎ − x_i)/(x₍i+1₎ − x₍i−1₎),
 * b = 1 − a, has the variance of the noise wherever the curve is locally straight
 * (T. Gasser, L. Sroka & C. Jennen-Steinmetz, "Residual variance and residual pattern in nonlinear
 * regression", Biometrika 73(3), 1986 — from memory). Divided by y_i it measures noise relative to
 * the reading (to first order, the noise of ln y) without taking a logarithm per point. One pass,
 * no array of length n.
 * The scale is 1.4826 × a median |e|: the few large residuals where the curve bends sharply
 * (at resonances) barely move a median. Exact zeros are left out so that readings quantised to a few
 * digits, which often repeat, do not report zero noise. Local scales come from blocks of 128
 * points (32 residuals each); the global one is the median of the block scales (or of all
 * residuals when there are fewer than four blocks), so noise that grows in one region — a scope's
 * fixed noise floor at the bottom of a deep dip — is judged there by its own size.
 */
export function estimateNoiseScale(x: Float64Array, y: Float64Array, length = x.length): NoiseScale {
  if (!Number.isInteger(length) || length < 3 || length > x.length || length > y.length) {
    throw new CalcInputError("length", "at least 3 points, no more than the arrays hold", length);
  }
  const count = length - 2;
  const blocks = count < 4 * NOISE_BLOCK_SIZE ? 1 : Math.ceil(count / NOISE_BLOCK_SIZE);
  // A short curve gets one block and every residual; a long one, strided blocks.
  const blockLength = blocks === 1 ? count : NOISE_BLOCK_SIZE;
  const stride = blocks === 1 ? 1 : STRIDE;
  const scratch = new Float64Array(Math.ceil(blockLength / stride));
  const raw = new Float64Array(blocks);
  for (let k = 0; k < blocks; k++) {
    const first = 1 + k * blockLength;
    const last = Math.min(length - 2, first + blockLength - 1);
    let used = 0;
    for (let i = first; i <= last; i += stride) {
      // Squared residuals: the median of e² is the square of the median |e|, and squaring saves a
      // square root per point. With h₁, h₂ the two steps, a = h₂/(h₁ + h₂), b = h₁/(h₁ + h₂), so
      // e² = (h₂y₀ + h₁y₂ − (h₁ + h₂)y₁)² / (y₁²·(h₁² + h₂² + (h₁ + h₂)²)): one division.
      const x1 = x[i] as number;
      const h1 = x1 - (x[i - 1] as number);
      const h2 = (x[i + 1] as number) - x1;
      const h = h1 + h2;
      const yi = y[i] as number;
      const num = h2 * (y[i - 1] as number) + h1 * (y[i + 1] as number) - h * yi;
      const squared = (num * num) / (yi * yi * (h1 * h1 + h2 * h2 + h * h));
      // Exact zeros are repeats of quantised readings, not evidence of zero noise.
      if (squared > 0) scratch[used++] = squared;
    }
    raw[k] = used === 0 ? 0 : MAD_TO_SIGMA * Math.sqrt(selectMedianInPlace(scratch, used));
  }
  if (blocks === 1) {
    const global = Math.max(NOISE_SCALE_FLOOR, raw[0] as number);
    return { global, block: Float64Array.of(global) };
  }
  const global = Math.max(NOISE_SCALE_FLOOR, selectMedianInPlace(Float64Array.from(raw)));
  const block = new Float64Array(blocks);
  for (let k = 0; k < blocks; k++) {
    const left = k > 0 ? (raw[k - 1] as number) : 0;
    const right = k + 1 < blocks ? (raw[k + 1] as number) : 0;
    block[k] = Math.max(global, left, raw[k] as number, right);
  }
  return { global, block };
}
