/**
 * Order statistics of the pairwise slopes (yⱼ − yᵢ)/(xⱼ − xᵢ) over all pairs with distinct x — the raw
 * material of the Theil–Sen estimator and Sen's confidence interval.
 *
 * Up to STORED_SLOPES_LIMIT pairs (about n = 2 100 points, 17.6 MB as Float64) every slope is stored and
 * the wanted ranks are found by quickselect. Above that, storing n(n−1)/2 slopes costs too much memory, so
 * a seeded random sample of slopes brackets each wanted rank, and one more pass over all pairs counts the
 * slopes below each bracket and keeps only those inside it (sample-select, after Floyd & Rivest, CACM 18(3),
 * 1975, from memory). Time stays O(n²) but memory falls to a few MB; the answer is exact and identical to the
 * stored path because both compute every slope with the same expression.
 */

import { CalcInputError } from "./errors";
import { createSeededRandom } from "./seeded-random";

/** Above this many distinct-x pairs the slopes are not all stored (see the file comment). */
export const STORED_SLOPES_LIMIT = 2_200_000;

/** Slopes kept inside each bracket on the sampled path, aimed for; the sample size follows from it. */
const BRACKET_TARGET = 1 << 18;

/** Number of pairs i < j with xᵢ ≠ xⱼ: n(n−1)/2 minus the pairs inside each group of tied x. */
export function countDistinctXPairs(xs: ArrayLike<number>): number {
  const sorted = Float64Array.from(xs).sort();
  let pairs = (sorted.length * (sorted.length - 1)) / 2;
  let run = 1;
  for (let i = 1; i <= sorted.length; i++) {
    if (i < sorted.length && sorted[i] === sorted[i - 1]) run++;
    else {
      pairs -= (run * (run - 1)) / 2;
      run = 1;
    }
  }
  return pairs;
}

/**
 * The slopes of the given 1-based ranks among the `pairCount` distinct-x pairwise slopes, ascending order.
 * Ranks must lie in 1…pairCount (the caller clamps them). `storedLimit` exists so tests can force the
 * sampled path on small inputs.
 */
export function selectPairwiseSlopes(
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  ranks: readonly number[],
  options: { storedLimit?: number; pairCount?: number } = {},
): number[] {
  // The caller may pass countDistinctXPairs(xs) when it has worked it out already (theilSenTrend has).
  const pairCount = options.pairCount ?? countDistinctXPairs(xs);
  const storedLimit = options.storedLimit ?? STORED_SLOPES_LIMIT;
  for (const rank of ranks) {
    if (!Number.isInteger(rank) || rank < 1 || rank > pairCount) {
      throw new CalcInputError("ranks", `whole numbers from 1 to ${pairCount} (the number of distinct-x pairs)`, rank);
    }
  }
  if (pairCount <= storedLimit) {
    const slopes = collectAllSlopes(xs, ys, pairCount);
    const found = new Map<number, number>();
    selectRanksInPlace(slopes, 0, pairCount - 1, [...new Set(ranks.map((rank) => rank - 1))].sort((a, b) => a - b), found);
    return ranks.map((rank) => found.get(rank - 1)! + 0); // + 0 turns a −0 slope into 0
  }
  return selectBySampling(xs, ys, ranks, pairCount).map((slope) => slope + 0);
}

/**
 * Below this many pairs (a series of about 360 points) the slopes go into one buffer kept between calls: a coil's
 * health takes several trends of ~60 points each, and a dashboard judges hundreds of coils, so a fresh 16 kB array
 * per trend was mostly garbage-collector work. Larger series get an array of their own, so no large buffer is kept.
 */
const REUSED_SLOPES_LIMIT = 1 << 16;
let reusedSlopes = new Float64Array(0);

function slopeBuffer(pairCount: number): Float64Array {
  if (pairCount > REUSED_SLOPES_LIMIT) return new Float64Array(pairCount);
  if (reusedSlopes.length < pairCount) reusedSlopes = new Float64Array(Math.max(pairCount, 2 * reusedSlopes.length));
  return reusedSlopes.subarray(0, pairCount);
}

function collectAllSlopes(xs: ArrayLike<number>, ys: ArrayLike<number>, pairCount: number): Float64Array {
  const slopes = slopeBuffer(pairCount);
  let k = 0;
  const n = xs.length;
  for (let i = 0; i < n; i++) {
    const xi = xs[i]!;
    const yi = ys[i]!;
    for (let j = i + 1; j < n; j++) {
      const dx = xs[j]! - xi;
      if (dx !== 0) slopes[k++] = (ys[j]! - yi) / dx;
    }
  }
  return slopes;
}

/**
 * The values of several 0-based ranks (ascending, distinct) of a[lo…hi], into `found`: one partition serves every
 * rank inside it, and each side is searched only for the ranks that fall there (multiple selection, after Hoare's
 * FIND, CACM 4(7), 1961, from memory), so the four ranks Theil–Sen needs cost little more than one. Hoare's two-way
 * partition around a median-of-three value stops on equal values from both sides, so runs of equal slopes split
 * evenly and every pass leaves both sides non-empty.
 */
function selectRanksInPlace(a: Float64Array, lo: number, hi: number, ks: readonly number[], found: Map<number, number>): void {
  while (ks.length > 0) {
    if (lo >= hi) {
      for (const k of ks) found.set(k, a[lo]!);
      return;
    }
    const pivot = medianOfThree(a[lo]!, a[(lo + hi) >>> 1]!, a[hi]!);
    let i = lo - 1;
    let j = hi + 1;
    for (;;) {
      do i++;
      while (a[i]! < pivot);
      do j--;
      while (a[j]! > pivot);
      if (i >= j) break;
      const v = a[i]!;
      a[i] = a[j]!;
      a[j] = v;
    }
    // a[lo…j] ≤ pivot ≤ a[j+1…hi], with lo ≤ j < hi.
    let split = 0;
    while (split < ks.length && ks[split]! <= j) split++;
    if (split > 0 && split < ks.length) {
      selectRanksInPlace(a, lo, j, ks.slice(0, split), found);
      lo = j + 1;
      ks = ks.slice(split);
    } else if (split > 0) {
      hi = j;
    } else {
      lo = j + 1;
    }
  }
}

/** k-th smallest (0-based) by quickselect with a three-way partition, so runs of equal slopes stay O(N). */
function selectInPlace(a: Float64Array, k: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (lo < hi) {
    const pivot = medianOfThree(a[lo]!, a[(lo + hi) >>> 1]!, a[hi]!);
    let lt = lo;
    let gt = hi;
    let i = lo;
    while (i <= gt) {
      const v = a[i]!;
      if (v < pivot) {
        a[i++] = a[lt]!;
        a[lt++] = v;
      } else if (v > pivot) {
        a[i] = a[gt]!;
        a[gt--] = v;
      } else i++;
    }
    if (k < lt) hi = lt - 1;
    else if (k > gt) lo = gt + 1;
    else return pivot;
  }
  return a[lo]!;
}

function medianOfThree(a: number, b: number, c: number): number {
  return Math.max(Math.min(a, b), Math.min(Math.max(a, b), c));
}

interface Bracket {
  rank: number;
  low: number;
  high: number;
  below: number;
  atLow: number;
  atHigh: number;
  inside: number[];
}

function selectBySampling(
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  ranks: readonly number[],
  pairCount: number,
): number[] {
  const n = xs.length;
  const random = createSeededRandom(0x2545f491).uniform;
  // The bracket holds about 4·N/√m slopes for a ±4σ window, so m is chosen to keep that near BRACKET_TARGET.
  const sampleSize = Math.min(2_000_000, Math.max(20_000, Math.ceil(((4 * pairCount) / BRACKET_TARGET) ** 2)));
  const sample = new Float64Array(sampleSize);
  for (let s = 0; s < sampleSize; s++) {
    let i: number;
    let j: number;
    do {
      i = Math.floor(random() * n);
      j = Math.floor(random() * n);
    } while (xs[i] === xs[j]);
    sample[s] = (ys[j]! - ys[i]!) / (xs[j]! - xs[i]!);
  }
  sample.sort();

  const results = new Map<number, number>();
  let pending = [...new Set(ranks)];
  for (let widen = 4; pending.length > 0; widen *= 2) {
    const brackets = pending.map((rank) => bracketFromSample(sample, rank, pairCount, widen));
    countIntoBrackets(xs, ys, brackets);
    pending = [];
    for (const b of brackets) {
      const value = resolveBracket(b);
      if (value === undefined) pending.push(b.rank);
      else results.set(b.rank, value);
    }
  }
  return ranks.map((rank) => results.get(rank)!);
}

function bracketFromSample(sample: Float64Array, rank: number, pairCount: number, widen: number): Bracket {
  const m = sample.length;
  const p = rank / pairCount;
  const centre = p * m;
  const halfWidth = widen * Math.sqrt(m * p * (1 - p)) + widen;
  const lowIndex = Math.floor(centre - halfWidth);
  const highIndex = Math.ceil(centre + halfWidth);
  // Past the sample's ends (or once widening has gone far) the bracket is open on that side.
  const low = lowIndex < 0 || widen > 64 ? Number.NEGATIVE_INFINITY : sample[lowIndex]!;
  const high = highIndex >= m || widen > 64 ? Number.POSITIVE_INFINITY : sample[highIndex]!;
  return { rank, low, high, below: 0, atLow: 0, atHigh: 0, inside: [] };
}

function countIntoBrackets(xs: ArrayLike<number>, ys: ArrayLike<number>, brackets: Bracket[]): void {
  const n = xs.length;
  for (let i = 0; i < n; i++) {
    const xi = xs[i]!;
    const yi = ys[i]!;
    for (let j = i + 1; j < n; j++) {
      const dx = xs[j]! - xi;
      if (dx === 0) continue;
      const s = (ys[j]! - yi) / dx;
      for (const b of brackets) {
        if (s < b.low) b.below++;
        else if (s === b.low) b.atLow++;
        else if (s < b.high) b.inside.push(s);
        else if (s === b.high) b.atHigh++;
      }
    }
  }
}

/** The rank's slope if the bracket caught it, else undefined (the caller widens and tries again). */
function resolveBracket(b: Bracket): number | undefined {
  let k = b.rank - b.below;
  if (k <= 0) return undefined;
  if (k <= b.atLow) return b.low;
  k -= b.atLow;
  if (k <= b.inside.length) return selectInPlace(Float64Array.from(b.inside), k - 1);
  k -= b.inside.length;
  if (k <= b.atHigh) return b.high;
  return undefined;
}
