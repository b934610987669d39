/**
 * Median by selection instead of sorting: expected O(n), in place, no allocation. The sweep
 * analysis takes medians of up to a few hundred thousand values per call, where a sort would
 * dominate the cost.
 */
import { CalcInputError } from "./errors";

/**
 * The median of values[0 … length−1] (mean of the two middle values for an even length).
 * Reorders that part of the array. NaN is not allowed (callers pass checked data).
 * Source: Hoare's FIND (C. A. R. Hoare, "Algorithm 65: Find", Comm. ACM 4(7), 1961 — from memory)
 * with a median-of-three pivot.
 */
export function selectMedianInPlace(values: Float64Array, length = values.length): number {
  if (!Number.isInteger(length) || length < 1 || length > values.length) {
    throw new CalcInputError("length", `an integer from 1 to ${values.length}`, length);
  }
  const upper = selectKth(values, length, length >> 1);
  if (length % 2 === 1) return upper;
  // After selection every value left of the k-th is ≤ it, so the lower middle is their maximum.
  let lower = Number.NEGATIVE_INFINITY;
  for (let i = 0; i < length >> 1; i++) if ((values[i] as number) > lower) lower = values[i] as number;
  return (lower + upper) / 2;
}

/** Places the k-th smallest (0-based) at index k, smaller ones before it, and returns it. */
function selectKth(a: Float64Array, length: number, k: number): number {
  let lo = 0;
  let hi = length - 1;
  while (hi > lo) {
    const mid = (lo + hi) >>> 1;
    const pivot = medianOfThree(a[lo] as number, a[mid] as number, a[hi] as number);
    let i = lo;
    let j = hi;
    while (i <= j) {
      while ((a[i] as number) < pivot) i++;
      while ((a[j] as number) > pivot) j--;
      if (i <= j) {
        const t = a[i] as number;
        a[i] = a[j] as number;
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return a[k] as number;
}

function medianOfThree(a: number, b: number, c: number): number {
  if (a < b) return b < c ? b : a < c ? c : a;
  return a < c ? a : b < c ? c : b;
}
