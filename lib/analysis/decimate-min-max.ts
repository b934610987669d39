/**
 * Thinning a long curve for display without losing its peaks: the x range is cut into buckets (one per
 * pixel column or so) and each bucket keeps its lowest and highest point, in x order. A plain "every
 * n-th point" would step over a sharp resonance; min/max per bucket keeps every extreme visible.
 */
export interface XY {
  x: number;
  y: number;
}

/**
 * At most about 2·buckets points out of `points` (sorted by x). Buckets are equal in log x when `logX`
 * (the sweep chart's axis), so each covers the same width on screen.
 */
export function decimateMinMax(points: readonly XY[], buckets: number, logX = false): XY[] {
  if (points.length <= 2 * buckets || buckets < 1) return [...points];
  const scale = (x: number) => (logX ? Math.log(x) : x);
  const first = scale(points[0]!.x);
  const last = scale(points[points.length - 1]!.x);
  const width = (last - first) / buckets || 1;
  const out: XY[] = [];
  let bucket = -1;
  let low: XY | undefined;
  let high: XY | undefined;
  const flush = () => {
    if (!low || !high) return;
    if (low === high) out.push(low);
    else if (low.x < high.x) out.push(low, high);
    else out.push(high, low);
  };
  for (const point of points) {
    const index = Math.min(buckets - 1, Math.floor((scale(point.x) - first) / width));
    if (index !== bucket) {
      flush();
      bucket = index;
      low = point;
      high = point;
      continue;
    }
    if (point.y < low!.y) low = point;
    if (point.y > high!.y) high = point;
  }
  flush();
  return out;
}
