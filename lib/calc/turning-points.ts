/**
 * The hysteresis ("zig-zag") walk behind the sweep analysis: one pass over the readings that keeps
 * only turning points standing out from the noise on both sides. See sweep.ts for the rule and why.
 */
import { NOISE_BLOCK_SHIFT, noiseBlockOf, type NoiseModel } from "./noise-estimate";

export interface TurningPoints {
  /** Indices of every confirmed turn, in order; the last may be an unconfirmed one that bounds the last fit. */
  turns: number[];
  /** Per confirmed turn: +1 maximum, −1 minimum, 0 a first turn that does not stand out on its left. */
  kinds: number[];
}

/**
 * Turning points of readings[0 … n−1] that noise cannot explain: a maximum is confirmed once a later
 * reading lies below it by more than z·√(σ_max² + σ_later²), σ from the noise model, and a minimum
 * likewise; the walk then looks for the opposite kind, so minima and maxima alternate. A turn is
 * reported (kind ≠ 0) only when it also stands out from the readings before it.
 * Source: the peak-picking walk with a hysteresis threshold, applied to a two-sided noise test
 * (derived; see sweep.ts).
 */
export function findTurningPoints(ratio: Float64Array, n: number, noise: NoiseModel, z: number): TurningPoints {
  const rel2 = noise.relative * noise.relative;
  const abs2 = noise.absolute * noise.absolute;
  const factor2 = noise.blockFactor.map((x) => x * x);
  const lastBlock = factor2.length - 1;
  const z2 = z * z;
  /** Noise variance of reading i (as a ratio). */
  const varianceAt = (i: number) => {
    const m = ratio[i] as number;
    return (factor2[noiseBlockOf(noise, i)] as number) * (rel2 * m * m + abs2);
  };
  /** True when reading `high` exceeds reading `low` by more than noise can: m_h − m_l > z·√(σ_h² + σ_l²). */
  const clears = (high: number, low: number) => {
    const d = (ratio[high] as number) - (ratio[low] as number);
    return d > 0 && d * d > z2 * (varianceAt(high) + varianceAt(low));
  };

  // Hysteresis walk. turns: every confirmed turning point; kinds: +1 max, −1 min, 0 not reported.
  // mHi/vHi, mLo/vLo: reading and noise variance of the running maximum and minimum.
  const turns: number[] = [];
  const kinds: number[] = [];
  let mode = 0; // 0: no turn yet; 1: after a minimum, seeking a maximum; −1: the reverse
  let hi = 0;
  let lo = 0;
  let mHi = ratio[0] as number;
  let mLo = mHi;
  let vHi = varianceAt(0);
  let vLo = vHi;
  let i = 1;
  // Until the first turn, also track how far the curve had come down (up) before the running
  // maximum (minimum): the first turn is a resonance only if it stands out on its left side too.
  let runMin = 0;
  let runMax = 0;
  let hiLeftMin = 0;
  let loLeftMax = 0;
  for (; i < n && mode === 0; i++) {
    const mi = ratio[i] as number;
    const vI = varianceAt(i);
    if (mi < (ratio[runMin] as number)) runMin = i;
    if (mi > (ratio[runMax] as number)) runMax = i;
    if (mi > mHi) {
      hi = i;
      mHi = mi;
      vHi = vI;
      hiLeftMin = runMin;
    }
    if (mi < mLo) {
      lo = i;
      mLo = mi;
      vLo = vI;
      loLeftMax = runMax;
    }
    const dHi = mHi - mi;
    const dLo = mi - mLo;
    if (dHi * dHi > z2 * (vHi + vI)) {
      turns.push(hi);
      kinds.push(clears(hi, hiLeftMin) ? 1 : 0);
      mode = -1;
      lo = i;
      mLo = mi;
      vLo = vI;
    } else if (dLo * dLo > z2 * (vLo + vI)) {
      turns.push(lo);
      kinds.push(clears(loLeftMax, lo) ? -1 : 0);
      mode = 1;
      hi = i;
      mHi = mi;
      vHi = vI;
    }
  }
  for (; i < n; i++) {
    const mi = ratio[i] as number;
    const block = (i - 1) >> NOISE_BLOCK_SHIFT; // noiseBlockOf, inlined for the hot loop
    const vI = (factor2[block > lastBlock ? lastBlock : block] as number) * (rel2 * mi * mi + abs2);
    if (mode === 1) {
      const d = mHi - mi;
      if (d < 0) {
        hi = i;
        mHi = mi;
        vHi = vI;
      } else if (d * d > z2 * (vHi + vI)) {
        turns.push(hi);
        kinds.push(1);
        mode = -1;
        lo = i;
        mLo = mi;
        vLo = vI;
      }
    } else {
      const d = mi - mLo;
      if (d < 0) {
        lo = i;
        mLo = mi;
        vLo = vI;
      } else if (d * d > z2 * (vLo + vI)) {
        turns.push(lo);
        kinds.push(-1);
        mode = 1;
        hi = i;
        mHi = mi;
        vHi = vI;
      }
    }
  }
  // The extremum still being tracked at the end is unconfirmed, but it still bounds the last fit.
  if (mode === 1) turns.push(hi);
  if (mode === -1) turns.push(lo);

  return { turns, kinds };
}
