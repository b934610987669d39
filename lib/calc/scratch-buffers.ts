/**
 * Reusable Float64Array work space for the O(n) analyses. A freshly allocated large typed array
 * costs a page fault per 4 KiB on first write, which for a 100 000-point sweep took several times
 * as long as the analysis proper; keeping the buffers between calls avoids that. Safe because
 * lib/calc is synchronous and every caller uses its own named slot.
 */

/** Largest buffer kept between calls, in elements (2 MiB); larger requests get a fresh array. */
const MAX_KEPT = 1 << 18;

const slots = new Map<string, Float64Array>();

/**
 * A Float64Array of `length` for the caller's own `slot`. Its contents are left over from the last
 * use: write before reading. Valid until the next borrow of the same slot; never hand it out.
 */
export function borrowScratch(slot: string, length: number): Float64Array {
  if (length > MAX_KEPT) return new Float64Array(length);
  let buffer = slots.get(slot);
  if (buffer === undefined || buffer.length < length) {
    buffer = new Float64Array(Math.min(MAX_KEPT, Math.max(length, 2 * (buffer?.length ?? 0), 64)));
    slots.set(slot, buffer);
  }
  return buffer.subarray(0, length);
}
