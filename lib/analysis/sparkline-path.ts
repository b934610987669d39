/**
 * The geometry of a small inline trend picture ("sparkline"): SVG path data for a series of headrooms against a
 * fixed vertical scale, with the policy's limit as a horizontal line. Pure arithmetic, so the dashboard and the coil
 * page render it on the server as plain SVG (no script, dozens a page) and it is unit-tested here.
 */

export interface SparklineBox {
  width: number;
  height: number;
  /** Value at the bottom and top edges; values outside are clamped to the edge (and flagged). */
  min: number;
  max: number;
  /** Inner padding in px so strokes and dots are not clipped. */
  pad?: number;
}

export interface SparklinePoint {
  x: number;
  y: number;
  value: number;
  /** True when the value lay outside [min, max] and was drawn at the edge. */
  clamped: boolean;
}

export interface Sparkline {
  /** "M x y L x y …"; a null value breaks the line (a new M after it). Empty when no value is known. */
  path: string;
  points: SparklinePoint[];
  /** y of the limit line, or null when no limit is given. */
  limitY: number | null;
}

const round = (n: number) => Math.round(n * 10) / 10;

/** Maps `values` (oldest first; null = not known for that session) into `box`, one equal step per value. */
export function buildSparkline(values: readonly (number | null)[], box: SparklineBox, limit: number | null = null): Sparkline {
  if (!(box.max > box.min)) throw new RangeError("sparkline box: max must be above min");
  const pad = box.pad ?? 2;
  const innerW = box.width - 2 * pad;
  const innerH = box.height - 2 * pad;
  const step = values.length > 1 ? innerW / (values.length - 1) : 0;
  const yOf = (v: number) => round(pad + ((box.max - Math.min(box.max, Math.max(box.min, v))) / (box.max - box.min)) * innerH);
  const points: SparklinePoint[] = [];
  let path = "";
  let penDown = false;
  values.forEach((value, i) => {
    if (value === null || !Number.isFinite(value)) {
      penDown = false;
      return;
    }
    const x = round(values.length > 1 ? pad + i * step : box.width / 2);
    const y = yOf(value);
    points.push({ x, y, value, clamped: value < box.min || value > box.max });
    path += `${path ? " " : ""}${penDown ? "L" : "M"}${x} ${y}`;
    penDown = true;
  });
  return { path, points, limitY: limit === null ? null : yOf(limit) };
}
