/**
 * SVG path data for a curve on log–log axes (a sweep's |Z| against frequency), fitted to a small box: pure arithmetic
 * so the coil page draws its |Z| picture on the server and the geometry is unit-tested here. Thin the points first
 * (decimate-min-max.ts) so a 100 000-point sweep is a few hundred path commands.
 */
import type { XY } from "./decimate-min-max";

export interface LogPlotBox {
  width: number;
  height: number;
  pad?: number;
}

export interface LogPlot {
  path: string;
  /** The ranges drawn, for the picture's text alternative. Null when no point can go on log axes. */
  xRange: [number, number] | null;
  yRange: [number, number] | null;
}

const round = (n: number) => Math.round(n * 10) / 10;

/** Points with x ≤ 0 or y ≤ 0 (or not finite) have no place on log axes and are left out. */
export function buildLogLogPath(points: readonly XY[], box: LogPlotBox): LogPlot {
  const usable = points.filter((p) => p.x > 0 && p.y > 0 && Number.isFinite(p.x) && Number.isFinite(p.y));
  if (usable.length === 0) return { path: "", xRange: null, yRange: null };
  const pad = box.pad ?? 2;
  const xs = usable.map((p) => Math.log10(p.x));
  const ys = usable.map((p) => Math.log10(p.y));
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  // A flat or single-point curve sits in the middle rather than dividing by zero.
  const sx = (x: number) => round(x1 > x0 ? pad + ((x - x0) / (x1 - x0)) * (box.width - 2 * pad) : box.width / 2);
  const sy = (y: number) => round(y1 > y0 ? box.height - pad - ((y - y0) / (y1 - y0)) * (box.height - 2 * pad) : box.height / 2);
  const path = xs.map((x, i) => `${i === 0 ? "M" : "L"}${sx(x)} ${sy(ys[i]!)}`).join(" ");
  return { path, xRange: [10 ** x0, 10 ** x1], yRange: [10 ** y0, 10 ** y1] };
}
