/**
 * The short sentence a chart is described by (aria-describedby): what is plotted against what, the
 * range covered, the latest value and which way it is going. The chart's figures table gives the
 * detail; this gives the gist in one breath. Pure, so it is unit-tested without a browser.
 */
import { formatAxisValue, type AxisFormat } from "./axis-format";

export interface SummarySeries {
  label: string;
  points: readonly { x: number; y: number }[];
  /** Markers (e.g. resonances, a projected crossing) are named but not summarised as a trend. */
  style?: "line" | "points" | "marker";
}

export interface SummaryAxis {
  label: string;
  format?: AxisFormat;
}

export type TrendDirection = "rising" | "falling" | "roughly flat";

/**
 * A change smaller than this share of the series' own value range, over its x span, reads as flat:
 * a plain-language threshold for a summary sentence (common practice), not an engineering judgement.
 */
const FLAT_SHARE = 0.1;

/** Least-squares slope of y on x; null when x does not vary (one point, or all at one x). */
function leastSquaresSlope(points: readonly { x: number; y: number }[]): number | null {
  const n = points.length;
  if (n < 2) return null;
  const meanX = points.reduce((s, p) => s + p.x, 0) / n;
  const meanY = points.reduce((s, p) => s + p.y, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (const p of points) {
    sxy += (p.x - meanX) * (p.y - meanY);
    sxx += (p.x - meanX) ** 2;
  }
  return sxx === 0 ? null : sxy / sxx;
}

/** Which way a series goes over its x span: the fitted change compared with the spread of its values. */
export function trendDirection(points: readonly { x: number; y: number }[]): TrendDirection | null {
  const finite = points.filter((p) => Number.isFinite(p.x) && Number.isFinite(p.y));
  const slope = leastSquaresSlope(finite);
  if (slope === null) return null;
  const xs = finite.map((p) => p.x);
  const ys = finite.map((p) => p.y);
  const fittedChange = slope * (Math.max(...xs) - Math.min(...xs));
  const spread = Math.max(...ys) - Math.min(...ys);
  if (spread === 0 || Math.abs(fittedChange) < FLAT_SHARE * spread) return "roughly flat";
  return fittedChange > 0 ? "rising" : "falling";
}

/** The first series that carries the measurement (a line or points with data), else the first with data. */
function mainSeries(series: readonly SummarySeries[]): SummarySeries | undefined {
  const withData = series.filter((s) => s.points.some((p) => Number.isFinite(p.x) && Number.isFinite(p.y)));
  return withData.find((s) => (s.style ?? "line") !== "marker") ?? withData[0];
}

export function describeChart(title: string, series: readonly SummarySeries[], x: SummaryAxis, y: SummaryAxis): string {
  const main = mainSeries(series);
  if (!main) return `${title}: no data to plot yet.`;
  const points = main.points.filter((p) => Number.isFinite(p.x) && Number.isFinite(p.y));
  const sorted = [...points].sort((a, b) => a.x - b.x);
  const first = sorted[0]!;
  const last = sorted[sorted.length - 1]!;
  const ys = sorted.map((p) => p.y);
  const fx = (v: number) => formatAxisValue(v, x.format);
  const fy = (v: number) => formatAxisValue(v, y.format);

  const others = series.filter((s) => s !== main && s.points.length > 0).map((s) => s.label);
  const sentences = [
    `${title}: ${y.label} against ${x.label}, ${sorted.length} ${sorted.length === 1 ? "point" : "points"} of ${main.label}` +
      (sorted.length > 1 ? ` from ${fx(first.x)} to ${fx(last.x)}.` : ` at ${fx(first.x)}.`),
  ];
  if (sorted.length > 1) sentences.push(`Values range from ${fy(Math.min(...ys))} to ${fy(Math.max(...ys))}.`);
  sentences.push(`Latest: ${fy(last.y)} at ${fx(last.x)}.`);
  const trend = trendDirection(sorted);
  if (trend) sentences.push(`Trend: ${trend}.`);
  if (others.length > 0) sentences.push(`Also shown: ${others.join("; ")}.`);
  return sentences.join(" ");
}
